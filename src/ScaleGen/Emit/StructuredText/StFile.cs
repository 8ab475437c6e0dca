using System.Text;

namespace ScaleGen.Emit.StructuredText;

/// <summary>Comment layout shared by library.st and plant.st. Lines end in '\n'.</summary>
public static class StFile
{
    /// <summary>The generated header as one block comment, every line sanitised.</summary>
    public static string HeaderComment(IEnumerable<string> lines)
    {
        var text = new StringBuilder();
        var first = true;
        foreach (var line in lines)
        {
            text.Append(first ? "(* " : "   ").Append(StSanitizer.Comment(line)).Append('\n');
            first = false;
        }
        return first ? "" : text.Append("*)\n").ToString();
    }

    /// <summary>A one-line comment; the text is sanitised.</summary>
    public static string Comment(string text) => "(* " + StSanitizer.Comment(text) + " *)";

    /// <summary>The same comment, appended.</summary>
    public static StringBuilder AppendComment(StringBuilder builder, string text) =>
        builder.Append("(* ").Append(StSanitizer.Comment(text)).Append(" *)");
}
