using System.Collections.Frozen;
using System.Globalization;
using System.Text;

namespace ScaleGen.Syntax;

/// <summary>
/// How each token of the language is recognised, on plain text positions. The Sprache
/// grammar (<see cref="Grammar"/>) and the direct reader (<see cref="FastReader"/>) both
/// read tokens through these functions, so the two cannot disagree about what a token is.
/// Every function reads from <c>start</c> and never past <c>end</c>, the end of the statement.
/// </summary>
internal static class Tokens
{
    public static int SkipBlanks(string text, int i, int end)
    {
        while (i < end && text[i] is ' ' or '\t') i++;
        return i;
    }

    /// <summary>A word: a letter, then letters, digits, '_' and '-'. Returns where it ends; <paramref name="start"/> when there is none.</summary>
    public static int ScanWord(string text, int start, int end)
    {
        if (start >= end || !char.IsLetter(text[start])) return start;
        var i = start + 1;
        while (i < end && (char.IsLetterOrDigit(text[i]) || text[i] is '_' or '-')) i++;
        return i;
    }

    public enum NumberScan { Number, None, NotANumber }

    /// <summary>Spellings of values that are no numbers, tried in this order at the start of a number.</summary>
    private static readonly string[] NotANumberWords = { "NaN", "nan", "Infinity", "infinity", "inf", "Inf", "INF", "\u221E" };

    private static bool IsAsciiDigit(char c) => c is >= '0' and <= '9';

    /// <summary>
    /// A number, <c>-?digits[.digits][e[+-]digits]</c>, read with a '.' whatever the
    /// machine's culture. <see cref="NumberScan.NotANumber"/> (NaN, Infinity, hex, a value
    /// beyond a double) comes with a message that says what to write instead.
    /// </summary>
    public static NumberScan ScanNumber(string text, int start, int end, out int stop, out double value, out string? problem)
    {
        stop = start;
        value = 0;
        problem = null;
        var sign = start < text.Length && text[start] == '-' ? 1 : 0;
        var first = start + sign < text.Length ? text[start + sign] : '\0';
        if (first is 'N' or 'n' or 'I' or 'i' or '\u221E')
        {
            foreach (var word in NotANumberWords)
            {
                if (!text.AsSpan(start + sign).StartsWith(word, StringComparison.Ordinal)) continue;
                problem = $"'{text.Substring(start, sign + word.Length)}' is not a number: write a finite decimal number such as 0 or 450.5";
                return NumberScan.NotANumber;
            }
        }

        var i = start + sign;
        while (i < end && IsAsciiDigit(text[i])) i++;
        if (i == start + sign) return NumberScan.None;
        if (i + 1 < end && text[i] == '.' && IsAsciiDigit(text[i + 1]))
        {
            i += 2;
            while (i < end && IsAsciiDigit(text[i])) i++;
        }
        if (i < end && text[i] is 'e' or 'E')
        {
            var j = i + 1;
            if (j < end && text[j] is '+' or '-') j++;
            if (j < end && IsAsciiDigit(text[j]))
            {
                while (j < end && IsAsciiDigit(text[j])) j++;
                i = j;
            }
        }

        if (i < end && i - start - sign == 1 && text[i - 1] == '0' && text[i] is 'x' or 'X')
        {
            problem = "hexadecimal numbers are not allowed: write the value in decimal";
            return NumberScan.NotANumber;
        }
        value = double.Parse(text.AsSpan(start, i - start), NumberStyles.Float, CultureInfo.InvariantCulture);
        if (!double.IsFinite(value))
        {
            problem = $"'{text.Substring(start, i - start)}' is too large for a number: use a value within \u00B11.7e308";
            return NumberScan.NotANumber;
        }
        stop = i;
        return NumberScan.Number;
    }

    /// <summary>
    /// A double-quoted string on one line; <c>\"</c> and <c>\\</c> are its escapes. True with
    /// <paramref name="stop"/> after the closing quote; false with <paramref name="stop"/>
    /// where the string went wrong (its start when there is no '"' there).
    /// </summary>
    public static bool ScanString(string text, int start, int end, out int stop)
    {
        stop = start;
        if (start >= end || text[start] != '"') return false;
        var i = start + 1;
        while (i < end)
        {
            var c = text[i];
            if (c == '\\' && i + 1 < end) i += 2;
            else if (c is '"' or '\\' or '\r' or '\n') break;
            else i++;
        }
        if (i >= end || text[i] != '"')
        {
            stop = i;
            return false;
        }
        stop = i + 1;
        return true;
    }

    /// <summary>The value of a string scanned by <see cref="ScanString"/> (quotes at <paramref name="start"/> and <paramref name="stop"/> - 1).</summary>
    public static string StringValue(string text, int start, int stop) => Unescape(text.Substring(start + 1, stop - start - 2));

    /// <summary>\" and \\ are the escapes; any other backslash is kept as written (the binder reports it).</summary>
    private static string Unescape(string raw)
    {
        if (!raw.Contains('\\')) return raw;
        var builder = new StringBuilder(raw.Length);
        for (var i = 0; i < raw.Length; i++)
        {
            if (raw[i] == '\\' && i + 1 < raw.Length && raw[i + 1] is '"' or '\\')
            {
                builder.Append(raw[i + 1]);
                i++;
            }
            else builder.Append(raw[i]);
        }
        return builder.ToString();
    }

    private static bool IsUnitPart(char c) => !char.IsWhiteSpace(c) && !char.IsControl(c) && c is not ('{' or '}' or '#' or ';' or '"');

    private static bool IsUnitStart(char c) => IsUnitPart(c) && !char.IsDigit(c) && c is not ('.' or ',' or '-' or '+');

    /// <summary>
    /// An unquoted unit: a run of characters but white space, braces, '#', ';' and '"' that
    /// does not start like a number or like '..'. Returns where it ends; <paramref name="start"/> when there is none.
    /// </summary>
    public static int ScanUnitWord(string text, int start, int end)
    {
        if (start >= end || !IsUnitStart(text[start])) return start;
        var i = start + 1;
        while (i < end && IsUnitPart(text[i])) i++;
        return i;
    }
}

/// <summary>
/// The words and numbers a plant file repeats on every point (keywords, choices, fixed
/// units, small whole numbers) as one shared string each, so a large plant's syntax tree
/// does not hold a copy per use.
/// </summary>
internal static class Words
{
    private static readonly string[] Common =
    {
        "plant", "cycle", "card", "profile", "point", "uses", "counts", "at", "limits", "fault-code", "type", "input",
        "INT", "DINT", "UINT", "desc", "signal", "shunt", "range", "sqrt", "cutoff", "health", "ne43", "none", "below",
        "above", "on-fault", "hold", "low", "high", "value", "filter", "measure", "flow", "level", "pressure",
        "temperature", "analysis", "other", "tolerance", "alarm", "HH", "H", "L", "LL", "priority", "deadband", "delay",
        "clear", "text", "loop", "supply", "device", "cable", "barrier", "extra", "hart", "current",
        "mA", "A", "V", "mV", "ohm", "kohm", "ms", "s", "min", "h", "m", "km", "ft", "mm2", "AWG", "%",
        "0.5", "0.25", "0.75", "1.0", "1.5", "2.5", "3.6", "10.5", "20.5", "21.0", "27648", "32767", "-32768", "32511", "-4864",
    };

    private static readonly FrozenSet<string> Known =
        Common.Concat(Enumerable.Range(0, 1001).Select(n => n.ToString(CultureInfo.InvariantCulture))).ToFrozenSet(StringComparer.Ordinal);

    private static readonly FrozenSet<string>.AlternateLookup<ReadOnlySpan<char>> Lookup =
        Known.GetAlternateLookup<ReadOnlySpan<char>>();

    /// <summary>The text's characters as a string: the shared one for a known word, else a new one.</summary>
    public static string Get(string text, int start, int length) =>
        Lookup.TryGetValue(text.AsSpan(start, length), out var known) ? known : text.Substring(start, length);
}
