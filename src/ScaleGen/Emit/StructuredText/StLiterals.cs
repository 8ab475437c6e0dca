using System.Globalization;
using System.Text;

namespace ScaleGen.Emit.StructuredText;

/// <summary>
/// IEC 61131-3 literals, culture-invariant. REAL is 32-bit, so a REAL literal is the
/// shortest text that reads back as the same float, in IEC form (digits on both sides of
/// the point, exponent without '+' or leading zeros).
/// </summary>
public static class StLiterals
{
    /// <summary>The REAL literal for a value: its nearest float, shortest round-trip form.</summary>
    /// <remarks>
    /// A value beyond the REAL range becomes the largest REAL of its sign (a PLC could not
    /// hold more); NaN cannot come from a bound plant and is a programming error.
    /// </remarks>
    public static string Real(double value)
    {
        if (double.IsNaN(value)) throw new ArgumentOutOfRangeException(nameof(value), "A REAL literal must be a number.");
        var single = (float)value;
        if (float.IsPositiveInfinity(single)) single = float.MaxValue;
        if (float.IsNegativeInfinity(single)) single = float.MinValue;
        if (single == 0f) return "0.0"; // also -0
        var text = single.ToString("R", CultureInfo.InvariantCulture);
        var e = text.IndexOfAny(['E', 'e']);
        var mantissa = e < 0 ? text : text[..e];
        if (!mantissa.Contains('.')) mantissa += ".0";
        if (e < 0) return mantissa;
        var exponent = int.Parse(text[(e + 1)..], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture);
        return mantissa + "E" + exponent.ToString(CultureInfo.InvariantCulture);
    }

    /// <summary>A DINT (or INT/UINT) literal.</summary>
    public static string Integer(long value) => value.ToString(CultureInfo.InvariantCulture);

    public static string Bool(bool value) => value ? "TRUE" : "FALSE";

    /// <summary>
    /// A TIME literal for a whole number of microseconds: the units from the largest
    /// non-zero one down to the smallest non-zero one (T#5s, T#150ms, T#1m30s, T#0s).
    /// </summary>
    public static string Time(long microseconds)
    {
        if (microseconds < 0) throw new ArgumentOutOfRangeException(nameof(microseconds), "A delay cannot be negative.");
        if (microseconds == 0) return "T#0s";
        ReadOnlySpan<(long Size, string Unit)> units =
        [
            (86_400_000_000L, "d"), (3_600_000_000L, "h"), (60_000_000L, "m"), (1_000_000L, "s"), (1_000L, "ms"), (1L, "us"),
        ];
        var parts = new long[units.Length];
        var rest = microseconds;
        int first = -1, last = -1;
        for (var i = 0; i < units.Length; i++)
        {
            parts[i] = rest / units[i].Size;
            rest %= units[i].Size;
            if (parts[i] == 0) continue;
            if (first < 0) first = i;
            last = i;
        }
        var text = new StringBuilder("T#");
        for (var i = first; i <= last; i++)
            text.Append(parts[i].ToString(CultureInfo.InvariantCulture)).Append(units[i].Unit);
        return text.ToString();
    }

    /// <summary>A duration of whole cycles as a TIME literal, to the microsecond.</summary>
    public static string TimeOfScans(int scans, double cycleSeconds) =>
        Time((long)Math.Round(scans * cycleSeconds * 1e6, MidpointRounding.AwayFromZero));

    /// <summary>A number for a comment: up to <paramref name="decimals"/> decimals, no trailing zeros, invariant.</summary>
    public static string Readable(double value, int decimals = 4)
    {
        var rounded = Math.Round(value, decimals);
        if (rounded == 0) return "0"; // never "-0"
        if (decimals <= DecimalText.MaxDecimals && DecimalText.TryScale(rounded, decimals, out var scaled))
            return DecimalText.Format(scaled, decimals, trimZeros: true);
        return rounded.ToString(decimals < ReadableFormats.Length ? ReadableFormats[decimals] : "0." + new string('#', decimals), CultureInfo.InvariantCulture);
    }

    /// <summary>"0.", "0.#", "0.##", ...: made once, as a plant of many points uses them over and over.</summary>
    private static readonly string[] ReadableFormats = Enumerable.Range(0, 10).Select(d => "0." + new string('#', d)).ToArray();
}
