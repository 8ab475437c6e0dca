using System.Collections.Immutable;
using ScaleGen.Text;

namespace ScaleGen.Syntax;

/// <summary>A statement's extent as the scanner found it, before its words are parsed.</summary>
internal sealed class RawStatement
{
    public int Start;
    public int End;
    public List<string> LeadingComments = new();
    public string? TrailingComment;
    public bool BlankLineBefore;
    public RawBlock? Block;
    /// <summary>Already reported by the scanner; the grammar need not say more about it.</summary>
    public bool Broken;
}

internal sealed class RawBlock
{
    public int OpenBrace;
    public int CloseBrace = -1;
    public List<RawStatement> Statements = new();
    public List<string> TrailingComments = new();
}

/// <summary>
/// The first pass of the parser: splits a file into statements and blocks. Statements end
/// at a line end, at ';', or at a brace. Because this pass understands only strings,
/// comments and braces, it can always find where the next statement begins: that is what
/// lets the grammar recover after an error and report every mistake in one run.
/// </summary>
internal sealed class StatementScanner
{
    private readonly SourceText _source;
    private readonly DiagnosticBag _diagnostics;
    private readonly string _text;
    private readonly Stack<RawBlock> _open = new();
    private readonly RawBlock _top = new() { OpenBrace = -1 };
    private RawStatement? _current;
    private RawStatement? _lastOnLine;
    private List<string> _pendingComments = new();
    private bool _pendingBlank;
    private bool _lineHasContent;
    private bool _seenStatement;

    public StatementScanner(SourceText source, DiagnosticBag diagnostics)
    {
        _source = source;
        _diagnostics = diagnostics;
        _text = source.Text;
    }

    public RawBlock Scan()
    {
        var i = 0;
        // A byte-order mark is not content.
        if (_text.Length > 0 && _text[0] == '\uFEFF') i = 1;
        while (i < _text.Length)
        {
            var c = _text[i];
            switch (c)
            {
                case ' ' or '\t':
                    i++;
                    break;
                case '\r' or '\n':
                    EndStatement();
                    if (!_lineHasContent) NoteBlankLine();
                    _lineHasContent = false;
                    _lastOnLine = null;
                    i += c == '\r' && i + 1 < _text.Length && _text[i + 1] == '\n' ? 2 : 1;
                    break;
                case '#':
                    i = ScanComment(i);
                    break;
                case ';':
                    EndStatement();
                    i++;
                    break;
                case '{':
                    OpenBlock(i);
                    i++;
                    break;
                case '}':
                    CloseBlock(i);
                    i++;
                    break;
                case '"':
                    Touch(i);
                    i = SkipString(i, _current!);
                    _current!.End = i;
                    break;
                default:
                    Touch(i);
                    i++;
                    _current!.End = i;
                    break;
            }
        }

        EndStatement();
        while (_open.Count > 0)
        {
            var block = _open.Pop();
            block.TrailingComments.AddRange(_pendingComments);
            _pendingComments = new();
            _diagnostics.Report(DiagnosticCatalog.UnclosedBlock, _source, new TextSpan(block.OpenBrace, 1),
                "this '{' is never closed: add '}' at the end of the block");
        }
        _top.TrailingComments.AddRange(_pendingComments);
        return _top;
    }

    private RawBlock CurrentBlock => _open.Count > 0 ? _open.Peek() : _top;

    private void Touch(int position)
    {
        _lineHasContent = true;
        if (_current is not null) return;
        _current = new RawStatement
        {
            Start = position,
            End = position,
            LeadingComments = _pendingComments,
            BlankLineBefore = _pendingBlank,
        };
        _pendingComments = new();
        _pendingBlank = false;
        _seenStatement = true;
        CurrentBlock.Statements.Add(_current);
    }

    private void EndStatement()
    {
        if (_current is null) return;
        _lastOnLine = _current;
        _current = null;
    }

    /// <summary>
    /// A blank line before a statement is remembered as a flag; one among leading comments
    /// as an empty entry, so that fmt keeps comment paragraphs apart.
    /// </summary>
    private void NoteBlankLine()
    {
        if (_pendingComments.Count > 0)
        {
            if (_pendingComments[^1].Length > 0) _pendingComments.Add("");
        }
        else if (_seenStatement) _pendingBlank = true;
    }

    private int ScanComment(int i)
    {
        var end = i;
        while (end < _text.Length && _text[end] is not ('\r' or '\n')) end++;
        var text = _text.Substring(i, end - i).TrimEnd();
        var owner = _current ?? _lastOnLine;
        if (owner is not null && owner.TrailingComment is null)
            owner.TrailingComment = text;
        else
        {
            _pendingComments.Add(text);
            _lineHasContent = true;
        }
        return end;
    }

    private int SkipString(int i, RawStatement statement)
    {
        var start = i;
        i++;
        while (i < _text.Length)
        {
            var c = _text[i];
            if (c == '\\' && i + 1 < _text.Length && _text[i + 1] is not ('\r' or '\n')) { i += 2; continue; }
            if (c == '"') return i + 1;
            if (c is '\r' or '\n') break;
            i++;
        }
        statement.Broken = true;
        _diagnostics.Report(DiagnosticCatalog.UnterminatedString, _source, new TextSpan(start, 1),
            "this string is not closed: end it with '\"' on the same line");
        return i;
    }

    private void OpenBlock(int position)
    {
        var owner = _current;
        if (owner is null)
        {
            _diagnostics.Report(DiagnosticCatalog.BlockWithoutStatement, _source, new TextSpan(position, 1),
                "'{' must follow a declaration such as 'point FIT-101' on the same line");
            // Keep the braces balanced so that what follows is still read in the right block.
            owner = new RawStatement { Start = position, End = position };
        }
        var block = new RawBlock { OpenBrace = position };
        owner.Block = block;
        _current = null;
        // A comment after '{' on the same line belongs to the statement that opens the block,
        // which is where fmt writes that statement's trailing comment back.
        _lastOnLine = owner;
        _open.Push(block);
        _lineHasContent = true;
    }

    private void CloseBlock(int position)
    {
        EndStatement();
        _lineHasContent = true;
        if (_open.Count == 0)
        {
            _diagnostics.Report(DiagnosticCatalog.StrayCloseBrace, _source, new TextSpan(position, 1),
                "this '}' closes no block: remove it, or add the '{' it belongs to");
            return;
        }
        var block = _open.Pop();
        block.CloseBrace = position;
        block.TrailingComments.AddRange(_pendingComments);
        _pendingComments = new();
        _pendingBlank = false;
        // A comment after '}' on the same line belongs to the statement that owns the block.
        // The owner is the last statement of the enclosing block: nothing is added there while its block is open.
        var siblings = CurrentBlock.Statements;
        _lastOnLine = siblings.Count > 0 && ReferenceEquals(siblings[^1].Block, block) ? siblings[^1] : null;
    }
}
