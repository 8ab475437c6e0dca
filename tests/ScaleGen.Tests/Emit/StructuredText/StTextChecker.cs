using System.Text;

namespace ScaleGen.Tests.Emit.StructuredText;

/// <summary>
/// A tiny lexer for the Structured Text ScaleGen emits: it separates code from
/// <c>(* comments *)</c> and <c>'strings'</c> and reports anything that would let text
/// escape them (an unclosed comment or string, a comment opener inside a comment, a
/// string across a line, a bad <c>$</c> escape, a control character).
/// </summary>
internal static class StTextChecker
{
    /// <param name="Code">The text with every comment replaced by one space and every string by <c>'S'</c>.</param>
    public sealed record Result(string Code, IReadOnlyList<string> Comments, IReadOnlyList<string> Strings, IReadOnlyList<string> Problems);

    public static Result Analyse(string text)
    {
        var code = new StringBuilder();
        var comments = new List<string>();
        var strings = new List<string>();
        var problems = new List<string>();
        var line = 1;
        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            if (c == '\n') line++;
            else if (char.IsControl(c)) problems.Add($"line {line}: control character U+{(int)c:X4} outside comments and strings");

            if (c == '(' && At(text, i + 1, '*'))
            {
                var start = i + 2;
                var end = text.IndexOf("*)", start, StringComparison.Ordinal);
                if (end < 0) { problems.Add($"line {line}: comment never closed"); break; }
                var body = text[start..end];
                if (body.Contains("(*", StringComparison.Ordinal)) problems.Add($"line {line}: comment opener inside a comment: {body}");
                foreach (var ch in body)
                    if (char.IsControl(ch) && ch != '\n') problems.Add($"line {line}: control character U+{(int)ch:X4} in a comment");
                    else if (ch is '\u2028' or '\u2029') problems.Add($"line {line}: line separator in a comment");
                line += body.Count(ch => ch == '\n');
                comments.Add(body);
                code.Append(' ');
                i = end + 1;
                continue;
            }
            if (c == '\'')
            {
                var value = new StringBuilder();
                var j = i + 1;
                var closed = false;
                for (; j < text.Length; j++)
                {
                    var s = text[j];
                    if (s == '\'') { closed = true; break; }
                    if (s == '\n' || char.IsControl(s) || s is '\u2028' or '\u2029') { problems.Add($"line {line}: line break or control character in a string"); break; }
                    if (s == '$')
                    {
                        if (j + 1 < text.Length && "$'LNPRTlnprt".Contains(text[j + 1])) { value.Append(s).Append(text[j + 1]); j++; continue; }
                        if (j + 2 < text.Length && Uri.IsHexDigit(text[j + 1]) && Uri.IsHexDigit(text[j + 2])) { value.Append(text, j, 3); j += 2; continue; }
                        problems.Add($"line {line}: bad $ escape in a string");
                        continue;
                    }
                    value.Append(s);
                }
                if (!closed) { problems.Add($"line {line}: string never closed"); break; }
                strings.Add(value.ToString());
                code.Append("'S'");
                i = j;
                continue;
            }
            if (c == '"') problems.Add($"line {line}: double-quoted string (never emitted)");
            if (c == '*' && At(text, i + 1, ')')) problems.Add($"line {line}: comment closer in code");
            if (c == '/' && At(text, i + 1, '/')) problems.Add($"line {line}: line comment (never emitted)");
            code.Append(c);
        }
        return new Result(code.ToString(), comments, strings, problems);
    }

    private static bool At(string text, int index, char c) => index < text.Length && text[index] == c;
}
