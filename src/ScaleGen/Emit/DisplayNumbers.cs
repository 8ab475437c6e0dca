using System.Globalization;

namespace ScaleGen.Emit;

/// <summary>
/// Numbers written for people (reports, diff text), always in the invariant culture with a
/// '.' decimal point, never in exponent form, never as "-0".
/// </summary>
public static class DisplayNumbers
{
    private const string PlainDecimals = "0.###############";

    /// <summary>
    /// A model value as the user would have written it: rounded to 10 decimals so that binary
    /// noise (a deadband of 2 % of 0.3 as 0.006000000000000001) does not show.
    /// </summary>
    public static string Exact(double value) => Plain(Math.Abs(value) < 1e15 ? Math.Round(value, 10) : value);

    /// <summary>A computed value to a number of significant digits (6 by default: 707.107).</summary>
    public static string Significant(double value, int digits = 6)
    {
        if (value == 0 || !double.IsFinite(value)) return Plain(value);
        var magnitude = (int)Math.Floor(Math.Log10(Math.Abs(value)));
        var decimals = Math.Clamp(digits - 1 - magnitude, 0, 15);
        return Plain(Math.Round(value, decimals));
    }

    /// <summary>A fixed number of decimals, e.g. currents as 19.30 mA.</summary>
    public static string Fixed(double value, int decimals)
    {
        var text = value.ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
        // "-0.00" says nothing a reader can use.
        return text.TrimStart('-').Trim('0', '.').Length == 0 ? text.TrimStart('-') : text;
    }

    private static string Plain(double value)
    {
        if (value == 0) return "0";
        return value.ToString(PlainDecimals, CultureInfo.InvariantCulture);
    }
}
