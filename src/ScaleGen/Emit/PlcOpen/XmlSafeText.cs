using System.Text;
using System.Xml;

namespace ScaleGen.Emit.PlcOpen;

/// <summary>
/// The one place where free text (titles, descriptions, file names, comments) is made safe
/// for XML: characters XML 1.0 cannot hold become '?', so the writer never throws on what a
/// user typed, and comment text can never close the XML comment.
/// </summary>
public static class XmlSafeText
{
    /// <summary>Text with every character XML 1.0 cannot hold (NUL, most controls, lone surrogates, U+FFFE/U+FFFF) as '?'.</summary>
    public static string Text(string? text)
    {
        if (text is not null && IsPrintableAscii(text)) return text;
        var result = new StringBuilder();
        var value = text ?? "";
        for (var i = 0; i < value.Length; i++)
        {
            var c = value[i];
            if (i + 1 < value.Length && XmlConvert.IsXmlSurrogatePair(value[i + 1], c))
            {
                result.Append(c).Append(value[++i]);
                continue;
            }
            result.Append(XmlConvert.IsXmlChar(c) ? c : '?');
        }
        return result.ToString();
    }

    /// <summary>One line: <see cref="Text"/>, with tabs and line breaks (also U+2028, U+2029, U+0085) as spaces.</summary>
    public static string Line(string? text)
    {
        if (text is not null && IsPrintableAscii(text)) return text;
        var result = new StringBuilder(Text(text));
        for (var i = 0; i < result.Length; i++)
            if (result[i] is '\t' or '\n' or '\r' or '\u0085' or '\u2028' or '\u2029') result[i] = ' ';
        return result.ToString();
    }

    /// <summary>A line for inside <c>&lt;!-- --&gt;</c>: no "--" (XML forbids it in a comment) and no trailing '-'.</summary>
    public static string CommentLine(string? text)
    {
        var line = Line(text);
        while (line.Contains("--", StringComparison.Ordinal)) line = line.Replace("--", "- -", StringComparison.Ordinal);
        return line.EndsWith('-') ? line + " " : line;
    }

    /// <summary>
    /// True for text that <see cref="Text"/> and <see cref="Line"/> give back unchanged, which
    /// is nearly all of it: a large plant writes hundreds of thousands of lines, and this case
    /// then costs no copy.
    /// </summary>
    private static bool IsPrintableAscii(string text) => !text.AsSpan().ContainsAnyExceptInRange(' ', '~');
}
