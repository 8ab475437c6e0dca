using System.CommandLine;
using System.Globalization;

namespace ScaleGen.Cli.Commands;

/// <summary>
/// Numeric options are read the way the language reads numbers: a '.' decimal point,
/// whatever the machine's culture, and never NaN or infinity.
/// </summary>
internal static class NumberOption
{
    public static Option<double?> Create(string name, string description) => new(name)
    {
        Description = description,
        CustomParser = result =>
        {
            var token = result.Tokens.Count > 0 ? result.Tokens[0].Value : "";
            if (double.TryParse(token, NumberStyles.Float, CultureInfo.InvariantCulture, out var value) && double.IsFinite(value))
                return value;
            result.AddError($"{name} needs a number written with a '.' decimal point, such as 12.5; got '{token}'");
            return null;
        },
    };
}
