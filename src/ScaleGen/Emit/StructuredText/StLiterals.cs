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
        if (ShortSingle(single) is { } shortText) return shortText;
        var text = single.ToString("R", CultureInfo.InvariantCulture);
        var e = text.IndexOfAny(['E', 'e']);
        var mantissa = e < 0 ? text : text[..e];
        if (!mantissa.Contains('.')) mantissa += ".0";
        if (e < 0) return mantissa;
        var exponent = int.Parse(text[(e + 1)..], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture);
        return mantissa + "E" + exponent.ToString(CultureInfo.InvariantCulture);
    }

    /// <summary>
    /// The REAL literal of a float that is a decimal of at most six significant digits, as
    /// most setpoints and ranges are, without .NET's general formatting (about a third of a
    /// microsecond, and a plant has a dozen REALs per point); null for any other float.
    /// </summary>
    /// <remarks>
    /// Any two decimals of at most six digits (FLT_DIG) round to different floats, so one that
    /// rounds to <paramref name="single"/> is its shortest round-trip text. From 10^-4 up to
    /// 10^6 .NET writes that without an exponent. The decimal is found by rounding the float
    /// to six digits and checked by dividing back in double precision; a double that landed
    /// exactly halfway between two floats could round the wrong way, so that case is left to
    /// .NET.
    /// </remarks>
    private static string? ShortSingle(float single)
    {
        var magnitude = Math.Abs((double)single);
        if (!(magnitude >= 1e-4 && magnitude < 1e6)) return null;
        // Six digits in all: as many decimals as the integer part leaves (up to 9 below 10^-3).
        var decimals = 9;
        while (decimals > 0 && magnitude >= SixDigitBounds[9 - decimals]) decimals--;
        var power = Powers[decimals];
        var scaled = Math.Round(single * power);
        if (Math.Abs(scaled) >= 1e6) return null;
        var back = scaled / power;
        if ((float)back != single) return null;
        if (back == ((double)single + MathF.BitIncrement(single)) / 2 || back == ((double)single + MathF.BitDecrement(single)) / 2) return null;
        var text = DecimalText.Format((long)scaled, decimals, trimZeros: true);
        return text.Contains('.') ? text : text + ".0";
    }

    private static readonly double[] Powers = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9];

    // From these on, one decimal fewer keeps six digits.
    private static readonly double[] SixDigitBounds = [1e-3, 1e-2, 1e-1, 1, 1e1, 1e2, 1e3, 1e4, 1e5];

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
        // Written into a buffer on the stack: a plant writes eight of these per point.
        Span<long> parts = stackalloc long[units.Length];
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
        Span<char> text = stackalloc char[80];
        text[0] = 'T';
        text[1] = '#';
        var length = 2;
        for (var i = first; i <= last; i++)
        {
            parts[i].TryFormat(text[length..], out var digits, default, CultureInfo.InvariantCulture);
            length += digits;
            units[i].Unit.AsSpan().CopyTo(text[length..]);
            length += units[i].Unit.Length;
        }
        return new string(text[..length]);
    }

    /// <summary>A duration of whole cycles as a TIME literal, to the microsecond.</summary>
    public static string TimeOfScans(int scans, double cycleSeconds) =>
        Time((long)Math.Round(scans * cycleSeconds * 1e6, MidpointRounding.AwayFromZero));

    /// <summary>A number for a comment: up to <paramref name="decimals"/> decimals, no trailing zeros, invariant.</summary>
    public static string Readable(double value, int decimals = 4) => NoteNumber(value, decimals).ToString();

    /// <summary>
    /// <see cref="Readable"/>'s text as a value an interpolated string formats in place
    /// (plant.st's comments hold some twenty numbers per point): no string of its own.
    /// </summary>
    public static ReadableNumber NoteNumber(double value, int decimals = 4) => new(value, decimals);

    /// <summary>A number as <see cref="Readable"/> writes it, formatted where it is interpolated; always invariant.</summary>
    public readonly struct ReadableNumber(double value, int decimals) : ISpanFormattable
    {
        public override string ToString()
        {
            Span<char> text = stackalloc char[64];
            return TryFormat(text, out var length, default, null) ? new string(text[..length]) : Slow();
        }

        public string ToString(string? format, IFormatProvider? formatProvider) => ToString();

        /// <remarks>The provider is ignored: comments are invariant whatever the interpolation asks for.</remarks>
        public bool TryFormat(Span<char> destination, out int charsWritten, ReadOnlySpan<char> format, IFormatProvider? provider)
        {
            var rounded = Math.Round(value, decimals);
            if (rounded == 0) // never "-0"
            {
                charsWritten = destination.IsEmpty ? 0 : 1;
                if (charsWritten == 1) destination[0] = '0';
                return charsWritten == 1;
            }
            if (decimals <= DecimalText.MaxDecimals && DecimalText.TryScale(rounded, decimals, out var scaled))
                return DecimalText.TryWrite(destination, scaled, decimals, trimZeros: true, out charsWritten);
            return rounded.TryFormat(destination, out charsWritten, Format(decimals), CultureInfo.InvariantCulture);
        }

        private string Slow()
        {
            var rounded = Math.Round(value, decimals);
            return rounded.ToString(Format(decimals), CultureInfo.InvariantCulture);
        }
    }

    private static string Format(int decimals) =>
        decimals < ReadableFormats.Length ? ReadableFormats[decimals] : "0." + new string('#', decimals);

    /// <summary>"0.", "0.#", "0.##", ...: made once, as a plant of many points uses them over and over.</summary>
    private static readonly string[] ReadableFormats = Enumerable.Range(0, 10).Select(d => "0." + new string('#', d)).ToArray();
}
