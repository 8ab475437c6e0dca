namespace ScaleGen.Emit;

/// <summary>
/// Decimal text for a double that is exactly a whole number of 10^-decimals (as doubles go),
/// written digit by digit. .NET's own formatting goes through its general algorithm (about
/// half a microsecond a number); the large outputs write tens of millions of numbers, nearly
/// all of them such short decimals, so the emitters' number helpers take this fast path and
/// fall back to .NET's formatting for everything else.
/// </summary>
/// <remarks>
/// Why the text is the same as .NET's: when <c>k / 10^d</c> (with |k| &lt; 10^15) is the
/// double <c>v</c>, that decimal has at most 15 significant digits, and every such decimal
/// survives the trip to a double and back (DBL_DIG = 15). So it is what .NET's shortest
/// round-trip form gives, what rounding <c>v</c> to 15 digits gives (custom formats such as
/// "0.##"), and what rounding <c>v</c> to <c>d</c> decimals gives ("F3"). Tests compare
/// the two on many values (DecimalTextTests).
/// </remarks>
public static class DecimalText
{
    /// <summary>The largest decimals <see cref="TryScale"/> takes.</summary>
    public const int MaxDecimals = 10;

    // Every |k| below this has at most 15 digits; k / 10^d is then exact to the last digit shown.
    private const double ScaledLimit = 1e15;

    private static readonly double[] Powers = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10];

    /// <summary>
    /// The whole number k with <c>k / 10^decimals == value</c> exactly (as doubles) and
    /// |k| &lt; 10^15; false when there is none (too many decimals, too large, not finite).
    /// -0 gives k = 0.
    /// </summary>
    public static bool TryScale(double value, int decimals, out long scaled)
    {
        var power = Powers[decimals];
        var k = Math.Round(value * power);
        // The comparison is false for NaN too.
        if (Math.Abs(k) < ScaledLimit && k / power == value)
        {
            scaled = (long)k;
            return true;
        }
        scaled = 0;
        return false;
    }

    /// <summary><c>scaled / 10^decimals</c> as text: an integer part of at least "0", a '.' and the decimals (trailing zeros dropped with <paramref name="trimZeros"/>, and the '.' with them).</summary>
    public static string Format(long scaled, int decimals, bool trimZeros)
    {
        Span<char> text = stackalloc char[MaxLength];
        return new string(text[..Write(text, scaled, decimals, trimZeros)]);
    }

    /// <summary>The same text, appended without a temporary string.</summary>
    public static void Append(System.Text.StringBuilder builder, long scaled, int decimals, bool trimZeros)
    {
        Span<char> text = stackalloc char[MaxLength];
        builder.Append(text[..Write(text, scaled, decimals, trimZeros)]);
    }

    // A sign, 20 digits of a long, a point and the zeros before the first digit of a small k.
    private const int MaxLength = 1 + 20 + 1 + MaxDecimals;

    private static int Write(Span<char> text, long scaled, int decimals, bool trimZeros)
    {
        // The digits from the last one, at least one more than the decimals (so there is a "0." for a small k).
        Span<char> reversed = stackalloc char[MaxLength];
        var magnitude = scaled < 0 ? (ulong)-scaled : (ulong)scaled;
        var count = 0;
        do
        {
            reversed[count++] = (char)('0' + (int)(magnitude % 10));
            magnitude /= 10;
        }
        while (magnitude != 0);
        while (count <= decimals) reversed[count++] = '0';

        var firstKept = 0;
        if (trimZeros)
            while (firstKept < decimals && reversed[firstKept] == '0') firstKept++;

        var length = 0;
        if (scaled < 0) text[length++] = '-';
        for (var i = count - 1; i >= decimals; i--) text[length++] = reversed[i];
        if (firstKept < decimals)
        {
            text[length++] = '.';
            for (var i = decimals - 1; i >= firstKept; i--) text[length++] = reversed[i];
        }
        return length;
    }
}
