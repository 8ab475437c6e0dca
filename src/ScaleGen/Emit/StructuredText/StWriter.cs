using System.Text;

namespace ScaleGen.Emit.StructuredText;

/// <summary>How declarations are laid out; the code is the same either way.</summary>
/// <param name="CommentColumn">The column a comment after a declaration starts at (at least one space after it); 0: one space.</param>
/// <param name="GroupBanner">A section with notes starts with a blank line and a banner line.</param>
/// <param name="CommentClosesOnOwnLine">A comment before a declaration ends with <c>*)</c> on a line of its own.</param>
public sealed record StLayout(int CommentColumn, bool GroupBanner, bool CommentClosesOnOwnLine)
{
    /// <summary>library.st: comments in one column, as a reader of the blocks expects.</summary>
    public static StLayout Library { get; } = new(34, GroupBanner: false, CommentClosesOnOwnLine: false);

    /// <summary>
    /// plant.st: nothing aligned across points, so that changing one point changes only its
    /// own lines; every point's declarations start under a banner.
    /// </summary>
    public static StLayout Plant { get; } = new(0, GroupBanner: true, CommentClosesOnOwnLine: true);
}

/// <summary>
/// Turns the declaration records into Structured Text. The one place that writes
/// declarations; library.st, plant.st and the text read back from PLCopen XML all come from here.
/// Lines end in '\n'.
/// </summary>
public static class StWriter
{
    private const string Indent = "    ";

    /// <summary>The line that sets off a group of declarations (a point's) and the program's calls.</summary>
    public static readonly string Banner = "(* " + new string('=', 72) + " *)";

    /// <summary>Types, then blocks, each with its comment, separated by blank lines.</summary>
    public static string Library(IEnumerable<StDataType> types, IEnumerable<StPou> blocks) =>
        string.Join("\n", types.Select(t => DataType(t, StLayout.Library)).Concat(blocks.Select(b => Pou(b, StLayout.Library))));

    public static string DataType(StDataType type, StLayout layout)
    {
        var text = new StringBuilder(LeadingComment(type.Comment, layout));
        text.Append("TYPE ").Append(type.Name).Append(" :\n");
        switch (type)
        {
            case StEnumType enumeration:
                text.Append(Indent).Append('(').Append(string.Join(", ", enumeration.Values)).Append(");\n");
                break;
            case StStructType structure:
                text.Append("STRUCT\n");
                foreach (var member in structure.Members) AppendVariable(text, member, layout);
                text.Append("END_STRUCT;\n");
                break;
            default:
                throw new ArgumentException($"No Structured Text form for {type.GetType().Name}.", nameof(type));
        }
        return text.Append("END_TYPE\n").ToString();
    }

    public static string Pou(StPou pou, StLayout layout) => TextChunks.Render(output => WritePou(output, pou, layout));

    /// <summary>The same text as <see cref="Pou"/>, spilled to <paramref name="output"/> section by section so a large program never sits whole in memory.</summary>
    public static void WritePou(TextWriter output, StPou pou, StLayout layout)
    {
        var text = new StringBuilder(LeadingComment(pou.Comment, layout));
        text.Append(pou.Keyword).Append(' ').Append(pou.Name).Append('\n');
        // The sections are enumerated (plant.st's are made as they are read); the small lists
        // inside them are walked by index: an enumerator through the interface is an
        // allocation, and plant.st walks a few hundred lists per point.
        foreach (var section in pou.Sections)
        {
            if (section.Notes.Count > 0)
            {
                text.Append('\n');
                if (layout.GroupBanner) text.Append(Banner).Append('\n');
                for (var i = 0; i < section.Notes.Count; i++) StFile.AppendComment(text, section.Notes[i]).Append('\n');
            }
            text.Append(section.Keyword).Append('\n');
            for (var i = 0; i < section.Variables.Count; i++) AppendVariable(text, section.Variables[i], layout);
            text.Append("END_VAR\n");
            TextChunks.Spill(text, output);
        }
        text.Append('\n');
        TextChunks.Spill(text, output, all: true);
        // A program's body has a line per point: written as it is, not copied into the builder.
        output.Write(pou.Body);
        output.Write('\n');
        output.Write("END_");
        output.Write(pou.Keyword);
        output.Write('\n');
    }

    /// <summary>An initial value; a structure value with members opens at <paramref name="depth"/> and closes there.</summary>
    public static string Value(StValue value, int depth = 1)
    {
        if (value is StSimpleValue simple) return simple.Literal;
        var text = new StringBuilder();
        AppendValue(text, value, depth);
        return text.ToString();
    }

    // Declarations are appended straight to the section's builder, without a string per line
    // or per value: plant.st writes some forty initial values per point.

    private static void AppendValue(StringBuilder text, StValue value, int depth)
    {
        switch (value)
        {
            case StSimpleValue simple:
                text.Append(simple.Literal);
                break;
            case StStructValue { Members: [{ Value: StSimpleValue only, Notes.Count: 0, Note: null } member] }:
                text.Append('(').Append(member.Member).Append(" := ").Append(only.Literal).Append(')');
                break;
            case StStructValue structure:
                AppendMultiLine(text, structure, depth);
                break;
            default:
                throw new ArgumentException($"No Structured Text form for {value.GetType().Name}.", nameof(value));
        }
    }

    private static void AppendMultiLine(StringBuilder text, StStructValue structure, int depth)
    {
        text.Append("(\n");
        var inner = (depth + 1) * Indent.Length;
        for (var i = 0; i < structure.Members.Count; i++)
        {
            var member = structure.Members[i];
            for (var n = 0; n < member.Notes.Count; n++) StFile.AppendComment(text.Append(' ', inner), member.Notes[n]).Append('\n');
            text.Append(' ', inner).Append(member.Member).Append(" := ");
            AppendValue(text, member.Value, depth + 1);
            if (member.Note is { } after) StFile.AppendComment(text.Append(' '), after);
            text.Append(i == structure.Members.Count - 1 ? "\n" : ",\n");
        }
        text.Append(' ', depth * Indent.Length).Append(')');
    }

    private static void AppendVariable(StringBuilder text, StVariable variable, StLayout layout)
    {
        for (var i = 0; i < variable.Notes.Count; i++) StFile.AppendComment(text.Append(Indent), variable.Notes[i]).Append('\n');
        var lineStart = text.Length;
        text.Append(Indent).Append(variable.Name).Append(" : ").Append(variable.Type.Text);
        if (variable.Initial is { } initial) AppendValue(text.Append(" := "), initial, 1);
        text.Append(';');
        if (variable.Comment is { } comment)
        {
            // Measured on the last line, for a value that spans several.
            var lastLine = text.Length - lineStart;
            for (var i = text.Length - 1; i >= lineStart; i--)
            {
                if (text[i] != '\n') continue;
                lastLine = text.Length - (i + 1);
                break;
            }
            StFile.AppendComment(text.Append(' ', Math.Max(1, layout.CommentColumn - lastLine)), comment);
        }
        text.Append('\n');
    }

    private static string LeadingComment(IReadOnlyList<string> lines, StLayout layout)
    {
        if (lines.Count == 0) return "";
        if (layout.CommentClosesOnOwnLine) return StFile.HeaderComment(lines);
        return "(* " + string.Join("\n   ", lines.Select(StSanitizer.Comment)) + " *)\n";
    }
}
