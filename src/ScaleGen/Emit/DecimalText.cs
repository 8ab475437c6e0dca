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
        Span<char> buffer = stackalloc char[MaxLength];
        return new string(Write(buffer, scaled, decimals, trimZeros));
    }

    /// <summary>The same text, appended without a temporary string.</summary>
    public static void Append(System.Text.StringBuilder builder, long scaled, int decimals, bool trimZeros)
    {
        Span<char> buffer = stackalloc char[MaxLength];
        builder.Append(Write(buffer, scaled, decimals, trimZeros));
    }

    /// <summary>The same text into <paramref name="destination"/>; false when it does not fit.</summary>
    public static bool TryWrite(Span<char> destination, long scaled, int decimals, bool trimZeros, out int written)
    {
        Span<char> buffer = stackalloc char[MaxLength];
        var text = Write(buffer, scaled, decimals, trimZeros);
        written = text.TryCopyTo(destination) ? text.Length : 0;
        return written > 0;
    }

    /// <summary>The same text, copied into <paramref name="destination"/> (at least <see cref="MaxLength"/> long); returns its length.</summary>
    public static int WriteTo(Span<char> destination, long scaled, int decimals, bool trimZeros)
    {
        Span<char> buffer = stackalloc char[MaxLength];
        var text = Write(buffer, scaled, decimals, trimZeros);
        text.CopyTo(destination);
        return text.Length;
    }

    // A sign, 20 digits of a long, a point and the zeros before the first digit of a small k.
    public const int MaxLength = 1 + 20 + 1 + MaxDecimals;

    /// <summary>Writes the text at the end of <paramref name="buffer"/>, from the last digit back, and returns it.</summary>
    private static ReadOnlySpan<char> Write(Span<char> buffer, long scaled, int decimals, bool trimZeros)
    {
        var magnitude = scaled < 0 ? (ulong)-scaled : (ulong)scaled;
        var shown = decimals;
        if (trimZeros)
        {
            while (shown > 0 && magnitude % 10 == 0)
            {
                magnitude /= 10;
                shown--;
            }
        }
        var position = buffer.Length;
        if (shown > 0)
        {
            for (var i = 0; i < shown; i++)
            {
                buffer[--position] = (char)('0' + (int)(magnitude % 10));
                magnitude /= 10;
            }
            buffer[--position] = '.';
        }
        do
        {
            buffer[--position] = (char)('0' + (int)(magnitude % 10));
            magnitude /= 10;
        }
        while (magnitude != 0);
        if (scaled < 0) buffer[--position] = '-';
        return buffer[position..];
    }
}
