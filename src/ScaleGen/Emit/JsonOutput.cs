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
        using (var writer = Writer(text))
        {
            token.WriteTo(writer);
        }
        return builder.Append('\n').ToString();
    }

    /// <summary>
    /// Writes <paramref name="document"/> exactly as <see cref="Write(JToken)"/> would, except
    /// that the array under <paramref name="arrayName"/> (left empty in the document) is
    /// written from <paramref name="items"/> by <paramref name="writeItem"/>, one at a time:
    /// a document of 50,000 points is never built whole. <paramref name="output"/> must end
    /// lines with '\n'.
    /// </summary>
    public static void Write<T>(TextWriter output, JObject document, string arrayName, IEnumerable<T> items, Action<JsonWriter, T> writeItem)
    {
        using (var writer = Writer(output))
        {
            writer.CloseOutput = false;
            writer.WriteStartObject();
            foreach (var property in document.Properties())
            {
                if (property.Name != arrayName)
                {
                    property.WriteTo(writer);
                    continue;
                }
                writer.WritePropertyName(arrayName);
                writer.WriteStartArray();
                foreach (var item in items) writeItem(writer, item);
                writer.WriteEndArray();
            }
            writer.WriteEndObject();
        }
        output.Write('\n');
    }

    /// <summary>
    /// The same document, with the items written by the faster <see cref="JsonText"/> (the
    /// properties around the array too): for the outputs of tens of thousands of records.
    /// </summary>
    public static void Write<T>(TextWriter output, JObject document, string arrayName, IEnumerable<T> items, Action<JsonText, T> writeItem)
    {
        var json = new JsonText(new StringBuilder());
        json.StartObject();
        foreach (var property in document.Properties())
        {
            json.Name(property.Name);
            if (property.Name != arrayName)
            {
                json.Token(property.Value);
                continue;
            }
            json.StartArray();
            foreach (var item in items)
            {
                writeItem(json, item);
                TextChunks.Spill(json.Text, output);
            }
            json.EndArray();
        }
        json.EndObject();
        json.Text.Append('\n');
        TextChunks.Spill(json.Text, output, all: true);
    }

    /// <summary>What <paramref name="writeItem"/> writes for each item, read back as a JArray (for commands that want the tree).</summary>
    public static JArray Array<T>(IEnumerable<T> items, Action<JsonText, T> writeItem)
    {
        var json = new JsonText(new StringBuilder());
        json.StartArray();
        foreach (var item in items) writeItem(json, item);
        json.EndArray();
        // Strings stay strings (no dates); numbers come back as the long or double they were written from.
        using var reader = new JsonTextReader(new StringReader(json.Text.ToString()))
        {
            DateParseHandling = DateParseHandling.None,
            FloatParseHandling = FloatParseHandling.Double,
        };
        return (JArray)JToken.ReadFrom(reader);
    }

    /// <summary>A double as Newtonsoft writes one: shortest round-trip form, with ".0" on a whole number.</summary>
    /// <summary>Appends a double as Newtonsoft writes one: shortest round-trip form, with ".0" on a whole number.</summary>
    internal static void AppendDouble(StringBuilder text, double value)
    {
        if (TryShortDecimal(value, out var scaled, out var decimals)) DecimalText.Append(text, scaled, decimals, trimZeros: true);
        else text.Append(JsonConvert.ToString(value));
    }

    /// <summary>
    /// A value that is a whole number of 10^-10 (or of 10^-4, for larger values) and not a
    /// whole number, as digits for <see cref="DecimalText"/>, whose text is then its shortest
    /// round-trip form, much faster than .NET's general formatting; false for whole numbers
    /// (Newtonsoft writes "2.0"), values below 10^-4 (.NET writes an exponent) and anything else.
    /// </summary>
    private static bool TryShortDecimal(double value, out long scaled, out int decimals)
    {
        scaled = 0;
        decimals = 10;
        if (!(Math.Abs(value) >= 1e-4)) return false;
        if (DecimalText.TryScale(value, 10, out scaled)) return scaled % 10_000_000_000 != 0;
        decimals = 4;
        return DecimalText.TryScale(value, 4, out scaled) && scaled % 10_000 != 0;
    }

    private static JsonTextWriter Writer(TextWriter text) =>
        new NumberWriter(text) { Formatting = Formatting.Indented, Indentation = 2, Culture = CultureInfo.InvariantCulture };

    /// <summary>
    /// Newtonsoft's writer with a faster way to the same text for most doubles: the large
    /// outputs write millions of numbers, nearly all short decimals, and .NET's shortest
    /// round-trip formatting is most of their cost. A raw value moves the writer on exactly
    /// as a number does.
    /// </summary>
    private sealed class NumberWriter(TextWriter text) : JsonTextWriter(text)
    {
        public override void WriteValue(double value)
        {
            if (TryShortDecimal(value, out var scaled, out var decimals)) WriteRawValue(DecimalText.Format(scaled, decimals, trimZeros: true));
            else base.WriteValue(value);
        }
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

    /// <summary>
    /// What <paramref name="writeItem"/> writes for each item, as a JArray. Emitters write
    /// their JSON straight to a writer (building a JObject per point costs several times
    /// more); commands that want the tree get it from the same code through this.
    /// </summary>
    public static JArray Array<T>(IEnumerable<T> items, Action<JsonWriter, T> writeItem)
    {
        using var writer = new JTokenWriter();
        writer.WriteStartArray();
        foreach (var item in items) writeItem(writer, item);
        writer.WriteEndArray();
        return (JArray)writer.Token!;
    }

    // Fields for emitters that write JSON straight to a writer: the same tokens the JObject
    // forms above make, so the text is the same either way.

    /// <summary>A number as <see cref="Number(double)"/> makes it.</summary>
    public static void NumberField(this JsonWriter writer, string name, double value)
    {
        writer.WritePropertyName(name);
        WriteNumber(writer, value);
    }

    public static void NumberField(this JsonWriter writer, string name, double? value)
    {
        writer.WritePropertyName(name);
        if (value is { } v) WriteNumber(writer, v);
        else writer.WriteNull();
    }

    public static void WriteNumber(this JsonWriter writer, double value)
    {
        if (!double.IsFinite(value)) throw new ArgumentOutOfRangeException(nameof(value), "JSON has no NaN or infinity.");
        if (Math.Abs(value) < 1e15) value = Math.Round(value, 10);
        if (Math.Abs(value) < 1e15 && Math.Floor(value) == value) writer.WriteValue((long)value);
        else writer.WriteValue(value);
    }

    public static void Field(this JsonWriter writer, string name, string? value)
    {
        writer.WritePropertyName(name);
        writer.WriteValue(value);
    }

    public static void Field(this JsonWriter writer, string name, bool value)
    {
        writer.WritePropertyName(name);
        writer.WriteValue(value);
    }

    public static void Field(this JsonWriter writer, string name, bool? value)
    {
        writer.WritePropertyName(name);
        if (value is { } v) writer.WriteValue(v);
        else writer.WriteNull();
    }

    public static void Field(this JsonWriter writer, string name, long value)
    {
        writer.WritePropertyName(name);
        writer.WriteValue(value);
    }

    public static void Field(this JsonWriter writer, string name, long? value)
    {
        writer.WritePropertyName(name);
        if (value is { } v) writer.WriteValue(v);
        else writer.WriteNull();
    }
}
