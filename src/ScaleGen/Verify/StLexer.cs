using System.Globalization;
using System.Text;
using ScaleGen.Text;

namespace ScaleGen.Verify;

/// <summary>A problem in Structured Text the verifier reads: where, and what. Reported as a failed verification.</summary>
public sealed class StReadException(SourceLocation location, string message) : Exception(message)
{
    public SourceLocation Location { get; } = location;

    /// <summary>The compiler convention, <c>path(line,col): error: message</c>.</summary>
    public string Describe() => $"{Location.Path}({Location.Line},{Location.Column}): error: {Message}";
}

internal enum StTokenKind
{
    Identifier,
    /// <summary>An integer literal (decimal or 2#, 8#, 16#); <see cref="StToken.Integer"/>.</summary>
    Integer,
    /// <summary>A REAL literal; <see cref="StToken.Text"/> holds its digits without underscores.</summary>
    Real,
    /// <summary>A TIME literal (T#..., TIME#...); <see cref="StToken.Integer"/> in microseconds.</summary>
    Time,
    /// <summary>A single-quoted STRING literal; <see cref="StToken.Text"/> holds the decoded characters.</summary>
    String,
    /// <summary>The type prefix of a typed literal (<c>INT#</c>, <c>SG_Status#</c>); <see cref="StToken.Text"/> holds the type name.</summary>
    TypePrefix,
    /// <summary>An operator or punctuation; <see cref="StToken.Text"/> holds it.</summary>
    Symbol,
    End,
}

internal readonly record struct StToken(StTokenKind Kind, string Text, long Integer, TextSpan Span)
{
    public bool Is(string symbol) => Kind == StTokenKind.Symbol && Text == symbol;

    /// <summary>Keywords and identifiers ignore case in IEC 61131-3.</summary>
    public bool IsWord(string word) => Kind == StTokenKind.Identifier && string.Equals(Text, word, StringComparison.OrdinalIgnoreCase);
}

/// <summary>
/// The lexer of the Structured Text subset ScaleGen emits: identifiers and keywords,
/// comments (<c>(* *)</c>, <c>/* */</c>, <c>//</c>), integer literals (with <c>_</c> and
/// 2#/8#/16# bases), REAL literals (<c>1.0E-5</c>), typed literals (<c>REAL#1.5</c>,
/// <c>SG_Status#SG_OK</c>), TIME literals (<c>T#5s</c>, <c>T#1m30s</c>, <c>T#150ms</c>)
/// and STRING literals with <c>$</c> escapes. Anything else stops with a positioned error.
/// </summary>
internal sealed class StLexer
{
    private static readonly string[] TwoCharSymbols = [":=", "=>", "<=", ">=", "<>", "**", ".."];
    private const string OneCharSymbols = "()[]:;,.+-*/=<>&^#";

    private readonly SourceText _source;
    private readonly string _text;
    private int _position;

    private StLexer(SourceText source)
    {
        _source = source;
        _text = source.Text;
    }

    public static List<StToken> Tokenize(SourceText source) => new StLexer(source).Run();

    private StReadException Error(int start, int length, string message) =>
        new(new SourceLocation(_source, new TextSpan(start, Math.Max(length, 1))), message);

    private char Peek(int offset = 0) => _position + offset < _text.Length ? _text[_position + offset] : '\0';

    private List<StToken> Run()
    {
        var tokens = new List<StToken>();
        if (Peek() == '\uFEFF') _position++;
        while (true)
        {
            SkipTrivia();
            if (_position >= _text.Length)
            {
                tokens.Add(new StToken(StTokenKind.End, "", 0, new TextSpan(_text.Length, 0)));
                return tokens;
            }
            tokens.Add(Next());
        }
    }

    private void SkipTrivia()
    {
        while (_position < _text.Length)
        {
            var c = Peek();
            if (c is ' ' or '\t' or '\r' or '\n' or '\f' or '\v') { _position++; continue; }
            if (c == '(' && Peek(1) == '*') { SkipBlockComment("*)"); continue; }
            if (c == '/' && Peek(1) == '*') { SkipBlockComment("*/"); continue; }
            if (c == '/' && Peek(1) == '/')
            {
                while (_position < _text.Length && Peek() is not ('\n' or '\r')) _position++;
                continue;
            }
            return;
        }
    }

    private void SkipBlockComment(string close)
    {
        var start = _position;
        var end = _text.IndexOf(close, _position + 2, StringComparison.Ordinal);
        if (end < 0) throw Error(start, 2, $"comment opened here is never closed with '{close}'");
        _position = end + 2;
    }

    private StToken Next()
    {
        var start = _position;
        var c = Peek();
        if (char.IsAsciiLetter(c) || c == '_') return IdentifierOrTyped(start);
        if (char.IsAsciiDigit(c)) return Number(start);
        if (c == '\'') return StringLiteral(start);
        if (c == '"') throw Error(start, 1, "double-quoted (WSTRING) literals are not in the Structured Text subset verify reads");
        if (c == '%') throw Error(start, 1, "direct addresses (%I, %Q, %M) are not in the Structured Text subset verify reads");
        if (c == '{') throw Error(start, 1, "pragmas ({ ... }) are not in the Structured Text subset verify reads");
        foreach (var symbol in TwoCharSymbols)
        {
            if (string.CompareOrdinal(_text, _position, symbol, 0, 2) == 0)
            {
                _position += 2;
                return new StToken(StTokenKind.Symbol, symbol, 0, new TextSpan(start, 2));
            }
        }
        if (OneCharSymbols.Contains(c))
        {
            _position++;
            return new StToken(StTokenKind.Symbol, c.ToString(), 0, new TextSpan(start, 1));
        }
        throw Error(start, 1, $"character '{Printable(c)}' cannot start any Structured Text token");
    }

    private static string Printable(char c) =>
        char.IsControl(c) || char.IsWhiteSpace(c) ? $"U+{(int)c:X4}" : c.ToString();

    private StToken IdentifierOrTyped(int start)
    {
        while (char.IsAsciiLetterOrDigit(Peek()) || Peek() == '_') _position++;
        var word = _text[start.._position];
        if (word.Contains("__", StringComparison.Ordinal))
            throw Error(start, word.Length, $"'{word}' is not an IEC 61131-3 identifier (no two underscores in a row)");
        if (Peek() != '#') return new StToken(StTokenKind.Identifier, word, 0, new TextSpan(start, word.Length));

        _position++; // '#'
        var upper = word.ToUpperInvariant();
        if (upper is "T" or "TIME") return Duration(start);
        if (upper is "LT" or "LTIME" or "D" or "DATE" or "TOD" or "TIME_OF_DAY" or "DT" or "DATE_AND_TIME" or "LTOD" or "LDT" or "LDATE" or "LTIME_OF_DAY" or "LDATE_AND_TIME")
            throw Error(start, _position - start, $"{word}# literals are not in the Structured Text subset verify reads");
        return new StToken(StTokenKind.TypePrefix, word, 0, new TextSpan(start, _position - start));
    }

    private string Digits(Func<char, bool> isDigit, int tokenStart)
    {
        var digits = new StringBuilder();
        while (true)
        {
            var c = Peek();
            if (isDigit(c)) { digits.Append(c); _position++; continue; }
            if (c == '_' && digits.Length > 0 && isDigit(Peek(1))) { _position++; continue; }
            break;
        }
        if (digits.Length == 0) throw Error(tokenStart, Math.Max(1, _position - tokenStart + 1), "a number needs digits here");
        return digits.ToString();
    }

    private StToken Number(int start)
    {
        var digits = Digits(char.IsAsciiDigit, start);
        if (Peek() == '#')
        {
            // 2#1010, 8#17, 16#FF
            _position++;
            var radix = digits switch { "2" => 2, "8" => 8, "16" => 16, _ => 0 };
            if (radix == 0) throw Error(start, _position - start, $"base {digits}# is not an IEC 61131-3 integer base (2, 8 or 16)");
            var body = Digits(c => radix == 16 ? char.IsAsciiHexDigit(c) : c >= '0' && c < (char)('0' + radix), start);
            ulong value = 0;
            foreach (var ch in body)
            {
                var d = (ulong)Convert.ToInt32(ch.ToString(), 16);
                if (value > (ulong.MaxValue - d) / (ulong)radix) throw Error(start, _position - start, "integer literal too large");
                value = value * (ulong)radix + d;
            }
            if (value > long.MaxValue) throw Error(start, _position - start, "integer literal too large");
            EndOfNumber(start);
            return new StToken(StTokenKind.Integer, _text[start.._position], (long)value, new TextSpan(start, _position - start));
        }

        if (Peek() == '.' && char.IsAsciiDigit(Peek(1)))
        {
            _position++;
            var fraction = Digits(char.IsAsciiDigit, start);
            var text = digits + "." + fraction;
            if (Peek() is 'e' or 'E')
            {
                _position++;
                var sign = "";
                if (Peek() is '+' or '-') { sign = Peek() == '-' ? "-" : ""; _position++; }
                text += "E" + sign + Digits(char.IsAsciiDigit, start);
            }
            EndOfNumber(start);
            return new StToken(StTokenKind.Real, text, 0, new TextSpan(start, _position - start));
        }

        EndOfNumber(start);
        if (!long.TryParse(digits, NumberStyles.None, CultureInfo.InvariantCulture, out var integer))
            throw Error(start, _position - start, "integer literal too large");
        return new StToken(StTokenKind.Integer, digits, integer, new TextSpan(start, _position - start));
    }

    /// <summary>A letter or digit glued to a number (<c>1E5</c>, <c>12abc</c>) is a malformed literal, not two tokens.</summary>
    private void EndOfNumber(int start)
    {
        if (char.IsAsciiLetterOrDigit(Peek()) || Peek() == '_')
        {
            while (char.IsAsciiLetterOrDigit(Peek()) || Peek() == '_' || Peek() == '.') _position++;
            throw Error(start, _position - start,
                $"'{_text[start.._position]}' is not a Structured Text number (a REAL needs digits on both sides of the point, as in 1.0E5)");
        }
    }

    /// <summary>The part after T# or TIME#: optional '-', then number-unit pairs from the largest unit down; only the last may have a fraction.</summary>
    private StToken Duration(int start)
    {
        var negative = false;
        if (Peek() == '-') { negative = true; _position++; }
        // In order from the largest unit down; each may appear once, in this order.
        ReadOnlySpan<(string Unit, long Micro)> units = [("d", 86_400_000_000), ("h", 3_600_000_000), ("m", 60_000_000), ("s", 1_000_000), ("ms", 1_000), ("us", 1), ("ns", 0)];
        decimal total = 0;
        var lastUnitRank = -1;
        var any = false;
        var sawFraction = false;
        while (char.IsAsciiDigit(Peek()))
        {
            if (sawFraction) throw Error(start, _position - start + 1, "in a TIME literal only the last part may have a fraction");
            var number = Digits(char.IsAsciiDigit, start);
            if (Peek() == '.' && char.IsAsciiDigit(Peek(1)))
            {
                _position++;
                number += "." + Digits(char.IsAsciiDigit, start);
                sawFraction = true;
            }
            var unitStart = _position;
            while (char.IsAsciiLetter(Peek())) _position++;
            var unit = _text[unitStart.._position].ToLowerInvariant();
            if (unit.Length == 0) throw Error(unitStart, 1, $"the {number} in a TIME literal needs a unit (d, h, m, s, ms, us)");
            var rank = -1;
            for (var i = 0; i < units.Length; i++) if (units[i].Unit == unit) rank = i;
            if (rank < 0) throw Error(unitStart, Math.Max(1, _position - unitStart), $"'{unit}' is not a TIME unit (d, h, m, s, ms, us)");
            if (rank <= lastUnitRank) throw Error(unitStart, _position - unitStart, "TIME literal units must go from the largest to the smallest, each once");
            if (units[rank].Micro == 0) throw Error(unitStart, _position - unitStart, "nanoseconds are finer than the 1 us TIME resolution verify uses");
            lastUnitRank = rank;
            if (number.Length > 18) throw Error(start, _position - start, "TIME literal too large");
            total += decimal.Parse(number, NumberStyles.AllowDecimalPoint, CultureInfo.InvariantCulture) * units[rank].Micro;
            any = true;
            if (Peek() == '_' && char.IsAsciiDigit(Peek(1))) _position++;
        }
        if (!any) throw Error(start, _position - start + 1, "a TIME literal needs a number and a unit, as in T#5s or T#150ms");
        EndOfNumber(start);
        if (total != decimal.Truncate(total)) throw Error(start, _position - start, "TIME literal finer than the 1 us resolution verify uses");
        if (total > long.MaxValue) throw Error(start, _position - start, "TIME literal too large");
        var micro = (long)total;
        return new StToken(StTokenKind.Time, _text[start.._position], negative ? -micro : micro, new TextSpan(start, _position - start));
    }

    private StToken StringLiteral(int start)
    {
        _position++; // opening quote
        var value = new StringBuilder();
        while (true)
        {
            if (_position >= _text.Length || Peek() is '\n' or '\r')
                throw Error(start, 1, "string literal is not closed on its line");
            var c = Peek();
            if (c == '\'') { _position++; break; }
            if (c == '$')
            {
                var escapeStart = _position;
                _position++;
                var e = Peek();
                switch (e)
                {
                    case '$': value.Append('$'); _position++; break;
                    case '\'': value.Append('\''); _position++; break;
                    case 'L' or 'l' or 'N' or 'n': value.Append('\n'); _position++; break;
                    case 'P' or 'p': value.Append('\f'); _position++; break;
                    case 'R' or 'r': value.Append('\r'); _position++; break;
                    case 'T' or 't': value.Append('\t'); _position++; break;
                    default:
                        if (char.IsAsciiHexDigit(e) && char.IsAsciiHexDigit(Peek(1)))
                        {
                            value.Append((char)Convert.ToInt32(_text.Substring(_position, 2), 16));
                            _position += 2;
                            break;
                        }
                        throw Error(escapeStart, 2, "unknown '$' escape in a string (use $$, $', $L, $N, $P, $R, $T or two hex digits)");
                }
                continue;
            }
            value.Append(c);
            _position++;
        }
        return new StToken(StTokenKind.String, value.ToString(), 0, new TextSpan(start, _position - start));
    }
}
