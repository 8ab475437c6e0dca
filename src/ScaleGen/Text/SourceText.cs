namespace ScaleGen.Text;

/// <summary>
/// One input file's text with its line table. Positions are UTF-16 offsets; lines and
/// columns are 1-based, as compilers and editors print them.
/// </summary>
public sealed class SourceText
{
    private readonly int[] _lineStarts;

    public SourceText(string path, string text)
    {
        Path = path;
        Text = text;
        _lineStarts = ComputeLineStarts(text);
    }

    /// <summary>The path as the user gave it; diagnostics print it unchanged.</summary>
    public string Path { get; }

    public string Text { get; }

    public int Length => Text.Length;

    public char this[int index] => Text[index];

    public int LineCount => _lineStarts.Length;

    public static SourceText FromFile(string path) => new(path, File.ReadAllText(path));

    public (int Line, int Column) GetLineColumn(int offset)
    {
        if (offset < 0) offset = 0;
        if (offset > Text.Length) offset = Text.Length;
        var index = Array.BinarySearch(_lineStarts, offset);
        var line = index >= 0 ? index : ~index - 1;
        var column = offset - _lineStarts[line] + 1;
        // A byte-order mark is invisible in an editor: the first line's columns start after it.
        if (line == 0 && offset > 0 && Text[0] == '\uFEFF') column--;
        return (line + 1, column);
    }

    public int GetLineStart(int line) => _lineStarts[line - 1];

    public string ToString(TextSpan span) => Text.Substring(span.Start, span.Length);

    private static int[] ComputeLineStarts(string text)
    {
        var starts = new List<int> { 0 };
        for (var i = 0; i < text.Length; i++)
        {
            if (text[i] == '\r' && i + 1 < text.Length && text[i + 1] == '\n') i++;
            if (text[i] == '\n' || text[i] == '\r') starts.Add(i + 1);
        }
        return starts.ToArray();
    }
}

/// <summary>A half-open range of characters in one source text.</summary>
public readonly record struct TextSpan(int Start, int Length)
{
    public int End => Start + Length;

    public static TextSpan FromBounds(int start, int end) => new(start, Math.Max(0, end - start));

    public override string ToString() => $"[{Start}..{End})";
}

/// <summary>A span in a particular file: what a diagnostic points at.</summary>
public readonly record struct SourceLocation(SourceText Source, TextSpan Span)
{
    public string Path => Source.Path;
    public int Line => Source.GetLineColumn(Span.Start).Line;
    public int Column => Source.GetLineColumn(Span.Start).Column;

    public override string ToString() => $"{Path}({Line},{Column})";
}
