using System.Globalization;
using System.Text;

namespace ScaleGen.Emit.StructuredText;

/// <summary>
/// The one place where free text (descriptions, alarm texts, addresses, units, titles,
/// file names) is made safe for Structured Text comments and string literals. Nothing the
/// user writes can close a comment or a string, open a nested comment, or start a new line.
/// </summary>
public static class StSanitizer
{
    /// <summary>
    /// Text for inside <c>(* ... *)</c>: a space breaks up every <c>(*</c> and <c>*)</c>
    /// (some compilers nest comments, so an opener is as dangerous as a closer), and line
    /// breaks, control and format characters (bidirectional overrides too) become spaces.
    /// Other printable characters, also non-ASCII, stay.
    /// </summary>
    public static string Comment(string? text)
    {
        if (text is not null && IsPlain(text, forLiteral: false)) return text;
        var result = new StringBuilder();
        foreach (var c in Printable(text ?? ""))
        {
            var previous = result.Length > 0 ? result[^1] : '\0';
            if ((c == '*' && previous == '(') || (c == ')' && previous == '*')) result.Append(' ');
            result.Append(c);
        }
        return result.ToString();
    }

    /// <summary>
    /// A single-quoted STRING literal with IEC <c>$</c> escapes: <c>$$</c>, <c>$'</c>;
    /// Latin-1 characters outside printable ASCII as <c>$hh</c>; anything beyond Latin-1 as
    /// '?'; line breaks and control characters as spaces. At most
    /// <paramref name="maxLength"/> characters (each escape is one character of the string).
    /// </summary>
    public static string StringLiteral(string? text, int maxLength)
    {
        if (text is not null && text.Length <= maxLength && IsPlain(text, forLiteral: true)) return "'" + text + "'";
        var result = new StringBuilder("'");
        var length = 0;
        foreach (var c in Printable(text ?? ""))
        {
            if (char.IsLowSurrogate(c)) continue; // its high surrogate already stood for the pair
            if (length == maxLength) break;
            length++;
            if (c == '$') result.Append("$$");
            else if (c == '\'') result.Append("$'");
            else if (c >= ' ' && c <= '~') result.Append(c);
            else if (c <= '\u00FF') result.Append('$').Append(((int)c).ToString("X2", CultureInfo.InvariantCulture));
            else result.Append('?');
        }
        return result.Append('\'').ToString();
    }

    /// <summary>
    /// True when the text comes out unchanged, which is nearly always: only printable ASCII
    /// without '(*' and '*)' (in a comment), or without '$' and quotes (in a literal). A large
    /// plant writes thousands of these; the common case then costs no copy.
    /// </summary>
    private static bool IsPlain(string text, bool forLiteral)
    {
        // Whole-span searches, which the runtime vectorises: a plant of 50,000 points has
        // some 40 MB of comment text to check.
        var span = text.AsSpan();
        if (span.IndexOfAnyExceptInRange(' ', '~') >= 0) return false;
        return forLiteral
            ? span.IndexOfAny('$', '\'') < 0
            : span.IndexOf("(*", StringComparison.Ordinal) < 0 && span.IndexOf("*)", StringComparison.Ordinal) < 0;
    }

    /// <summary>The characters of a text with every line break, control or format character as a space and lone surrogates as '?'.</summary>
    private static IEnumerable<char> Printable(string text)
    {
        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            if (char.IsHighSurrogate(c) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1]))
            {
                yield return c;
                yield return text[++i];
                continue;
            }
            if (char.IsSurrogate(c)) { yield return '?'; continue; }
            var category = char.GetUnicodeCategory(c);
            yield return category is UnicodeCategory.Control or UnicodeCategory.Format
                or UnicodeCategory.LineSeparator or UnicodeCategory.ParagraphSeparator
                ? ' '
                : c;
        }
    }
}
