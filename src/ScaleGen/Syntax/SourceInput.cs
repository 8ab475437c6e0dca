using Sprache;

namespace ScaleGen.Syntax;

/// <summary>
/// A Sprache input over one statement of a larger text. It keeps absolute positions, so
/// every span the grammar makes points straight into the file, and it ends where the
/// statement ends, so a parser can never run on into the next statement.
/// </summary>
internal sealed class SourceInput : IInput
{
    private readonly int _end;
    private IDictionary<object, object>? _memos;

    public SourceInput(string source, int position, int end)
    {
        Source = source;
        Position = position;
        _end = end;
    }

    public string Source { get; }

    /// <summary>Where the statement ends (exclusive).</summary>
    public int End => _end;

    /// <summary>The same statement, read from another position.</summary>
    public SourceInput At(int position) => new(Source, position, _end);

    public int Position { get; }

    public bool AtEnd => Position >= _end;

    public char Current => AtEnd ? '\0' : Source[Position];

    // Lines and columns come from SourceText when a diagnostic is made; Sprache only
    // puts these into its own messages, which ScaleGen does not show.
    public int Line => 0;

    public int Column => Position;

    public IDictionary<object, object> Memos => _memos ??= new Dictionary<object, object>();

    public IInput Advance()
    {
        if (AtEnd) throw new InvalidOperationException("Cannot advance beyond the end of the statement.");
        return new SourceInput(Source, Position + 1, _end);
    }

    public bool Equals(IInput? other) => other is not null && ReferenceEquals(Source, other.Source) && Position == other.Position;

    public override bool Equals(object? obj) => obj is IInput other && Equals(other);

    public override int GetHashCode() => HashCode.Combine(Source.Length, Position);
}
