using System.Globalization;
using System.Net;
using System.Text;

namespace ScaleGen.Emit.Report;

/// <summary>
/// Number text for the report page: exactly the characters <see cref="DisplayNumbers"/>
/// writes, made without a string per number. A 50,000-point page holds millions of numbers,
/// and formatting each through a new string was most of its cost. Fixed-decimal numbers
/// (chart coordinates, currents) are written digit by digit; the others repeat a lot
/// (setpoints, ticks, ranges), so their text is kept once made.
/// One instance per page written: the caches are not shared between threads.
/// </summary>
internal sealed class ReportNumbers
{
    /// <summary>Past this many texts a cache starts again, so a page of any size holds it within a few MB.</summary>
    private const int MostCached = 1 << 16;

    private readonly Dictionary<double, string> _exact = new();
    private readonly Dictionary<double, string> _significant = new();

    /// <summary><see cref="DisplayNumbers.Exact"/>.</summary>
    public string Exact(double value) => Cached(_exact, value, static v => DisplayNumbers.Exact(v));

    /// <summary><see cref="DisplayNumbers.Significant"/> to 4 digits.</summary>
    public string Significant4(double value) => Cached(_significant, value, static v => DisplayNumbers.Significant(v, 4));

    private static string Cached(Dictionary<double, string> cache, double value, Func<double, string> format)
    {
        if (cache.TryGetValue(value, out var text)) return text;
        if (cache.Count >= MostCached) cache.Clear();
        return cache[value] = format(value);
    }

    /// <summary>Room for any fixed text of a value under 1e9 (the fast path), and for most others.</summary>
    public const int FixedLength = 32;

    private static readonly double[] Scales = { 1, 10, 100, 1000, 10000 };

    /// <summary>
    /// Writes <see cref="DisplayNumbers.Fixed"/>(<paramref name="value"/>, <paramref name="decimals"/>)
    /// (0 to 4 decimals) into <paramref name="destination"/>; false if it does not fit.
    /// </summary>
    /// <remarks>
    /// Fast path: the value times 10^decimals, rounded to the nearest integer, is the text's
    /// digits, unless that product lies within 1e-6 of a half, where the product's own
    /// rounding (below 1e-7 under 1e9) or the formatter's treatment of a tie could tip it
    /// the other way: those, and huge or non-finite values, go through the formatter itself.
    /// </remarks>
    public static bool TryFormatFixed(Span<char> destination, double value, int decimals, out int written)
    {
        var scaled = value * Scales[decimals];
        if (Math.Abs(scaled) < 1e9)
        {
            var floor = Math.Floor(scaled);
            var above = scaled - floor;
            if (Math.Abs(above - 0.5) > 1e-6 && destination.Length >= FixedLength)
            {
                // Zero gets no sign: "-0.0" says nothing a reader can use.
                written = DecimalText.WriteTo(destination, (long)floor + (above > 0.5 ? 1 : 0), decimals, trimZeros: false);
                return true;
            }
        }
        var exact = DisplayNumbers.Fixed(value, decimals);
        written = exact.Length;
        return exact.AsSpan().TryCopyTo(destination);
    }
}

/// <summary>Appends for the report's hot paths, with no string in between.</summary>
internal static class ReportText
{
    /// <summary>Appends <see cref="DisplayNumbers.Fixed"/>(<paramref name="value"/>, <paramref name="decimals"/>).</summary>
    public static StringBuilder AppendFixed(this StringBuilder text, double value, int decimals)
    {
        Span<char> buffer = stackalloc char[ReportNumbers.FixedLength];
        return ReportNumbers.TryFormatFixed(buffer, value, decimals, out var written)
            ? text.Append(buffer[..written])
            : text.Append(DisplayNumbers.Fixed(value, decimals));
    }

    /// <summary>Appends a whole number in the invariant culture.</summary>
    public static StringBuilder AppendInvariant(this StringBuilder text, long value)
    {
        Span<char> buffer = stackalloc char[20];
        value.TryFormat(buffer, out var written, default, CultureInfo.InvariantCulture);
        return text.Append(buffer[..written]);
    }

    /// <summary>Appends text from the plant HTML-encoded (most of it needs no encoding, and then no copy is made).</summary>
    public static StringBuilder AppendEncoded(this StringBuilder text, string value) => text.Append(WebUtility.HtmlEncode(value));
}
