using System.Buffers;
using System.Text;

namespace ScaleGen.Emit;

/// <summary>
/// CSV fields appended to a StringBuilder, quoted as RFC 4180 wants and exactly where
/// CsvHelper's default rule quotes (a quote, the delimiter or a line break inside, a space at
/// either end), so files keep the bytes they had when CsvHelper wrote them. A check sheet
/// of 50,000 points has some ten million fields: a call into CsvHelper per field cost more
/// than all the rest of the file.
/// </summary>
public static class CsvText
{
    private static readonly SearchValues<char> Special = SearchValues.Create("\",\n");

    /// <summary>True when the field is written in quotes.</summary>
    public static bool NeedsQuotes(string field) =>
        field.Length > 0 && (field[0] == ' ' || field[^1] == ' ' || field.AsSpan().IndexOfAny(Special) >= 0);

    /// <summary>The field as written: as it is, or in quotes with its quotes doubled.</summary>
    public static string Field(string field) => NeedsQuotes(field) ? Quoted(field) : field;

    /// <summary>Appends the field as written.</summary>
    public static StringBuilder AppendField(StringBuilder line, string field) =>
        NeedsQuotes(field) ? line.Append(Quoted(field)) : line.Append(field);

    /// <summary>A comment line: '#', the text as it is (never quoted), '\n'.</summary>
    public static StringBuilder AppendComment(StringBuilder text, string comment) =>
        text.Append('#').Append(comment).Append('\n');

    private static string Quoted(string field) => "\"" + field.Replace("\"", "\"\"") + "\"";
}
