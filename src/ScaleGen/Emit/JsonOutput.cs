using System.Globalization;
using System.Text;
using Newtonsoft.Json;
using Newtonsoft.Json.Linq;

namespace ScaleGen.Emit;

/// <summary>
/// Writes JSON the same way everywhere: two-space indents, '\n' line ends, numbers in
/// invariant shortest round-trip form, properties in the order they were added.
/// </summary>
public static class JsonOutput
{
    public static string Write(JToken token)
    {
        var builder = new StringBuilder();
        using (var text = new StringWriter(builder, CultureInfo.InvariantCulture) { NewLine = "\n" })
        using (var writer = new JsonTextWriter(text) { Formatting = Formatting.Indented, Indentation = 2, Culture = CultureInfo.InvariantCulture })
        {
            token.WriteTo(writer);
        }
        return builder.Append('\n').ToString();
    }

    /// <summary>
    /// A double as a JSON number, rounded to 10 decimals so that binary noise such as
    /// 12.000000000000002 does not reach readers; integral values are written without a fraction.
    /// </summary>
    public static JToken Number(double value)
    {
        if (!double.IsFinite(value)) throw new ArgumentOutOfRangeException(nameof(value), "JSON has no NaN or infinity.");
        if (Math.Abs(value) < 1e15) value = Math.Round(value, 10);
        return Math.Abs(value) < 1e15 && Math.Floor(value) == value ? new JValue((long)value) : new JValue(value);
    }

    public static JToken Number(double? value) => value is { } v ? Number(v) : JValue.CreateNull();
}
