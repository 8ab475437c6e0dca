using System.Text;

namespace ScaleGen.Emit.PlcOpen;

/// <summary>
/// Writes XML text exactly as <see cref="System.Xml.XmlWriter"/> does with
/// <c>Indent = true</c>, two spaces, <c>NewLineChars = "\n"</c> and
/// <c>NewLineHandling.Replace</c>, for the documents the PLCopen export writes: elements that
/// hold either child elements or one run of text (never both), attributes, CDATA and comments.
/// </summary>
/// <remarks>
/// <para>Why not XmlWriter itself: at 50,000 points plant.xml is about 400 MB, and the checks
/// XmlWriter makes on every call (names, namespace scopes, state) cost more than building the
/// rest of the file; here the fixed markup is appended as it is and only the values are
/// escaped. The tests hold its output to XmlWriter's, escaping included.</para>
/// <para>Names are written as given (<c>xhtml:p</c> with its prefix); the caller declares the
/// namespaces on the root element. Values and text are escaped as XmlWriter escapes them;
/// comments and CDATA are written as they are but for line breaks. A character XML cannot
/// hold (most control characters, a lone surrogate, U+FFFE, U+FFFF) throws, as it does with
/// XmlWriter: free text goes through <see cref="XmlSafeText"/> before it comes here. The text
/// is spilled to the output every few ten thousand characters (<see cref="TextChunks.Spill"/>);
/// <see cref="Flush"/> writes the rest.</para>
/// </remarks>
internal sealed class IndentedXmlWriter(TextWriter output)
{
    private readonly StringBuilder _text = new();

    /// <summary>The open elements, innermost last, and whether each holds child elements yet.</summary>
    private string[] _names = new string[16];
    private bool[] _hasChildren = new bool[16];
    private int _depth;

    /// <summary>The innermost start tag still lacks its '&gt;' (attributes may follow).</summary>
    private bool _startTagOpen;

    /// <summary>Nothing written yet: the first node does not start on a new line.</summary>
    private bool _atStart = true;

    private static readonly string[] Indents = Enumerable.Range(0, 32).Select(depth => "\n" + new string(' ', 2 * depth)).ToArray();

    public void WriteComment(string text)
    {
        if (_depth > 0) throw new InvalidOperationException("Comments are written outside the root element only.");
        if (text.Contains("--", StringComparison.Ordinal) || text.EndsWith('-'))
            throw new ArgumentException("A comment cannot hold \"--\" or end in '-'.", nameof(text));
        NewLine();
        _text.Append("<!--");
        AppendText(text, TextKind.Raw);
        _text.Append("-->");
    }

    public void WriteStartElement(string name)
    {
        BeginChild();
        _text.Append('<').Append(name);
        if (_depth == _names.Length)
        {
            Array.Resize(ref _names, _depth * 2);
            Array.Resize(ref _hasChildren, _depth * 2);
        }
        _names[_depth] = name;
        _hasChildren[_depth] = false;
        _depth++;
        _startTagOpen = true;
    }

    /// <summary>An element with one attribute and no content, <c>&lt;name attribute="value" /&gt;</c>: the most common element here, in one call.</summary>
    public void WriteEmptyElement(string name, string attribute, string value)
    {
        BeginChild();
        _text.Append('<').Append(name).Append(' ').Append(attribute).Append("=\"");
        AppendText(value, TextKind.Attribute);
        _text.Append("\" />");
    }

    public void WriteAttributeString(string name, string value)
    {
        if (!_startTagOpen) throw new InvalidOperationException($"Attribute {name} outside a start tag.");
        _text.Append(' ').Append(name).Append("=\"");
        AppendText(value, TextKind.Attribute);
        _text.Append('"');
    }

    /// <summary>Text content; the element then holds no child elements.</summary>
    public void WriteString(string text)
    {
        BeginText();
        AppendText(text, TextKind.Content);
    }

    /// <summary>A CDATA section; a "]]&gt;" inside is split across two sections, as XmlWriter does.</summary>
    public void WriteCData(string text)
    {
        BeginText();
        _text.Append("<![CDATA[");
        var rest = text.AsSpan();
        for (var end = rest.IndexOf("]]>"); end >= 0; end = rest.IndexOf("]]>"))
        {
            AppendText(rest[..(end + 2)], TextKind.Raw);
            _text.Append("]]><![CDATA[");
            rest = rest[(end + 2)..];
        }
        AppendText(rest, TextKind.Raw);
        _text.Append("]]>");
    }

    /// <summary>Ends the innermost element: <c>&lt;name /&gt;</c> when it is empty.</summary>
    public void WriteEndElement() => End(full: false);

    /// <summary>Ends the innermost element: <c>&lt;name&gt;&lt;/name&gt;</c> when it is empty.</summary>
    public void WriteFullEndElement() => End(full: true);

    /// <summary>Writes out what is not yet written; every element must be closed.</summary>
    public void Flush()
    {
        if (_depth > 0) throw new InvalidOperationException($"<{_names[_depth - 1]}> is still open.");
        TextChunks.Spill(_text, output, all: true);
    }

    private void End(bool full)
    {
        if (_depth == 0) throw new InvalidOperationException("No element to end.");
        _depth--;
        var name = _names[_depth];
        if (_startTagOpen)
        {
            _startTagOpen = false;
            if (!full)
            {
                _text.Append(" />");
                TextChunks.Spill(_text, output);
                return;
            }
            _text.Append('>');
        }
        else if (_hasChildren[_depth])
        {
            _text.Append(Indent(_depth));
        }
        _text.Append("</").Append(name).Append('>');
        TextChunks.Spill(_text, output);
    }

    /// <summary>A child element starts: the parent's start tag closes, and the child goes on a new line.</summary>
    private void BeginChild()
    {
        if (_depth > 0)
        {
            if (_startTagOpen)
            {
                _text.Append('>');
                _startTagOpen = false;
            }
            else if (!_hasChildren[_depth - 1]) throw new InvalidOperationException($"<{_names[_depth - 1]}> holds text: no child elements after it.");
            _hasChildren[_depth - 1] = true;
        }
        NewLine();
    }

    private void BeginText()
    {
        if (_depth == 0) throw new InvalidOperationException("Text outside the root element.");
        if (_hasChildren[_depth - 1]) throw new InvalidOperationException($"<{_names[_depth - 1]}> holds elements: no text after them.");
        CloseStartTag();
    }

    private void CloseStartTag()
    {
        if (!_startTagOpen) return;
        _text.Append('>');
        _startTagOpen = false;
    }

    /// <summary>Every node but the first starts on a new line, indented two spaces a level.</summary>
    private void NewLine()
    {
        if (_atStart) _atStart = false;
        else _text.Append(Indent(_depth));
    }

    private static string Indent(int depth) => depth < Indents.Length ? Indents[depth] : "\n" + new string(' ', 2 * depth);

    /// <summary>Where text goes, which decides its escapes.</summary>
    private enum TextKind
    {
        /// <summary>Element content: &amp; &lt; &gt; escaped.</summary>
        Content,
        /// <summary>An attribute value in double quotes: also the quote, and tab and line breaks as character references.</summary>
        Attribute,
        /// <summary>CDATA or a comment: nothing escaped.</summary>
        Raw,
    }

    /// <summary>
    /// Text with XmlWriter's escapes for <paramref name="kind"/>. Outside attributes a "\r\n"
    /// or a lone '\r' becomes '\n', as with NewLineHandling.Replace.
    /// </summary>
    private void AppendText(ReadOnlySpan<char> text, TextKind kind)
    {
        // Nearly every value is printable ASCII without markup characters: appended whole.
        var plain = 0;
        while (plain < text.Length && text[plain] is >= ' ' and <= '~' and not ('<' or '>' or '&' or '"')) plain++;
        if (plain == text.Length)
        {
            _text.Append(text);
            return;
        }
        var start = 0;
        for (var i = plain; i < text.Length; i++)
        {
            var c = text[i];
            string? replacement = null;
            switch (c)
            {
                case '<' when kind != TextKind.Raw: replacement = "&lt;"; break;
                case '>' when kind != TextKind.Raw: replacement = "&gt;"; break;
                case '&' when kind != TextKind.Raw: replacement = "&amp;"; break;
                case '"' when kind == TextKind.Attribute: replacement = "&quot;"; break;
                case '\t' when kind == TextKind.Attribute: replacement = "&#x9;"; break;
                case '\n' when kind == TextKind.Attribute: replacement = "&#xA;"; break;
                case '\r' when kind == TextKind.Attribute: replacement = "&#xD;"; break;
                case '\r':
                    _text.Append(text[start..i]).Append('\n');
                    if (i + 1 < text.Length && text[i + 1] == '\n') i++;
                    start = i + 1;
                    continue;
                case '\t' or '\n':
                    break;
                default:
                    if (char.IsHighSurrogate(c) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1])) i++;
                    else if (c < ' ' || char.IsSurrogate(c) || c is '\uFFFE' or '\uFFFF')
                        throw new ArgumentException($"XML cannot hold the character U+{(int)c:X4}.", nameof(text));
                    break;
            }
            if (replacement is null) continue;
            _text.Append(text[start..i]).Append(replacement);
            start = i + 1;
        }
        _text.Append(text[start..]);
    }
}
