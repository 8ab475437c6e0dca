using ScaleGen.Text;

namespace ScaleGen.Syntax;

/// <summary>
/// Reads the well-formed statements of a file straight from the text, without Sprache's
/// input and result objects per token: on a large plant that plumbing cost several times
/// the parse itself (docs/performance.md). Each rule of <see cref="Grammar"/> has a direct
/// form beside its Sprache form. The direct form only accepts; it never reports. Whenever it
/// meets anything unusual it gives up (returns null), and the Sprache form parses the
/// statement again and reports exactly what is wrong, so diagnostics come from one place.
/// A test keeps the two forms giving the same syntax tree.
/// </summary>
/// <remarks>One reader per thread: it holds the position in the statement being read.</remarks>
internal sealed class FastReader
{
    private string _text = "";
    private int _position;
    private int _end;

    public void Reset(string text, int start, int end)
    {
        _text = text;
        _position = start;
        _end = end;
    }

    /// <summary>Where the reader is: after the last token read and the blanks after it.</summary>
    public int Position => _position;

    public bool AtEnd => _position >= _end;

    private void MoveTo(int stop) => _position = Tokens.SkipBlanks(_text, stop, _end);

    public WordSyntax? Word()
    {
        var start = _position;
        var stop = Tokens.ScanWord(_text, start, _end);
        if (stop == start) return null;
        MoveTo(stop);
        return new WordSyntax(new TextSpan(start, stop - start), Words.Get(_text, start, stop - start));
    }

    /// <summary>The given word; null, having read nothing, for any other.</summary>
    public WordSyntax? Keyword(string keyword)
    {
        var start = _position;
        var stop = Tokens.ScanWord(_text, start, _end);
        if (stop - start != keyword.Length || string.CompareOrdinal(_text, start, keyword, 0, keyword.Length) != 0) return null;
        MoveTo(stop);
        return new WordSyntax(new TextSpan(start, stop - start), keyword);
    }

    public NumberSyntax? Number()
    {
        var start = _position;
        if (Tokens.ScanNumber(_text, start, _end, out var stop, out var value, out _) != Tokens.NumberScan.Number) return null;
        MoveTo(stop);
        return new NumberSyntax(new TextSpan(start, stop - start), value, Words.Get(_text, start, stop - start));
    }

    public StringSyntax? String()
    {
        var start = _position;
        if (!Tokens.ScanString(_text, start, _end, out var stop)) return null;
        MoveTo(stop);
        return new StringSyntax(TextSpan.FromBounds(start, stop), Tokens.StringValue(_text, start, stop));
    }

    /// <summary>A unit if one is there and is not one of <paramref name="notUnits"/>; else null, having read nothing.</summary>
    public UnitSyntax? Unit(string[] notUnits)
    {
        var start = _position;
        if (start < _end && _text[start] == '"')
            return String() is { } quoted ? new UnitSyntax(quoted.Span, quoted.Value, true) : null;
        var stop = Tokens.ScanUnitWord(_text, start, _end);
        if (stop == start) return null;
        var unit = Words.Get(_text, start, stop - start);
        if (Array.IndexOf(notUnits, unit) >= 0) return null;
        MoveTo(stop);
        return new UnitSyntax(new TextSpan(start, stop - start), unit, false);
    }

    public QuantitySyntax? Quantity(string[] notUnits)
    {
        if (Number() is not { } number) return null;
        var unit = Unit(notUnits);
        return new QuantitySyntax(TextSpan.FromBounds(number.Span.Start, unit?.Span.End ?? number.Span.End), number, unit);
    }

    public RangeSyntax? Range(string[] notUnits)
    {
        if (Number() is not { } low || !Literal("..") || Number() is not { } high) return null;
        var unit = Unit(notUnits);
        return new RangeSyntax(TextSpan.FromBounds(low.Span.Start, unit?.Span.End ?? high.Span.End), low, high, unit);
    }

    /// <summary>Fixed text such as '..' or ','; false, having read nothing, when it is not there.</summary>
    public bool Literal(string literal)
    {
        if (_end - _position < literal.Length || string.CompareOrdinal(_text, _position, literal, 0, literal.Length) != 0) return false;
        MoveTo(_position + literal.Length);
        return true;
    }
}
