using System.Globalization;
using System.Text.RegularExpressions;
using ScaleGen.Syntax;
using ScaleGen.Text;

namespace ScaleGen.Import;

/// <summary>
/// Reads single cells into the pieces of a syntax tree, or into a problem that names the
/// row and column. Numbers use a '.' decimal point whatever the spreadsheet's or the
/// machine's language; a decimal comma gets its own message because it is the usual slip.
/// </summary>
internal sealed class CellReader(IoListRow row, List<ImportProblem> problems)
{
    private static readonly Regex PlainNumber = new(@"^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$", RegexOptions.CultureInvariant);
    private static readonly Regex CommaNumber = new(@"^[+-]?\d+(,\d+)+$", RegexOptions.CultureInvariant);
    private static readonly Regex TagPattern = new(@"^[A-Za-z][A-Za-z0-9_-]*$", RegexOptions.CultureInvariant);
    private static readonly Regex NamePattern = new(@"^[A-Za-z][A-Za-z0-9_]*$", RegexOptions.CultureInvariant);

    public bool Failed { get; private set; }

    public string Cell(IoListColumn column) => row.Cell(column);

    public bool Has(IoListColumn column) => Cell(column).Length > 0;

    public void Report(DiagnosticDescriptor descriptor, IoListColumn column, string message)
    {
        problems.Add(ImportProblem.At(descriptor, row.At(column), message));
        if (descriptor.Severity == Severity.Error) Failed = true;
    }

    /// <summary>A number as the language writes it, or null (and a problem) when the cell holds none.</summary>
    public NumberSyntax? Number(IoListColumn column) => Number(column, Cell(column));

    /// <summary>Reads <paramref name="text"/>, a part of the column's cell, by the column's number rules.</summary>
    public NumberSyntax? Number(IoListColumn column, string text)
    {
        var cell = Cell(column);
        if (column.Unit is { } unit && text.EndsWith(unit, StringComparison.OrdinalIgnoreCase))
            text = text[..^unit.Length].TrimEnd();
        var inUnit = column.Unit is null ? "" : $" (the column is in {column.Unit})";

        if (PlainNumber.IsMatch(text))
        {
            var canonical = Canonical(text);
            var value = double.Parse(canonical, NumberStyles.Float, CultureInfo.InvariantCulture);
            if (double.IsFinite(value)) return new NumberSyntax(default, value, canonical);
            Report(DiagnosticCatalog.CellNotANumber, column, $"'{cell}' is too large for a number");
            return null;
        }
        if (CommaNumber.IsMatch(text))
        {
            var pieces = text.Split(',');
            var asPoint = pieces.Length == 2 ? $"'{pieces[0]}.{pieces[1]}'" : null;
            var asThousands = pieces.Skip(1).All(p => p.Length == 3) ? $"'{string.Concat(pieces)}'" : null;
            var advice = (asPoint, asThousands) switch
            {
                (not null, not null) => $"write {asPoint} if the comma is a decimal comma, or {asThousands} if it separates thousands",
                (not null, null) => $"write {asPoint}",
                (null, not null) => $"write {asThousands} without thousands separators",
                _ => "write the number with a '.' decimal point",
            };
            Report(DiagnosticCatalog.CellDecimalComma, column,
                $"'{cell}' has a comma in a number: numbers in the I/O list take a '.' decimal point whatever the spreadsheet's language; {advice}");
            return null;
        }
        Report(DiagnosticCatalog.CellNotANumber, column, $"'{cell}' is not a number{inUnit}");
        return null;
    }

    /// <summary>The number, or null without a problem when the cell is empty.</summary>
    public NumberSyntax? OptionalNumber(IoListColumn column) => Has(column) ? Number(column) : null;

    /// <summary>-?digits[.digits][e[+-]digits]: no '+', no bare '.', lower-case 'e'.</summary>
    private static string Canonical(string text)
    {
        var sign = text[0] == '-' ? "-" : "";
        var body = text.TrimStart('+', '-');
        var exponentAt = body.IndexOfAny(new[] { 'e', 'E' });
        var mantissa = exponentAt < 0 ? body : body[..exponentAt];
        var exponent = exponentAt < 0 ? "" : "e" + body[(exponentAt + 1)..];
        if (mantissa.StartsWith('.')) mantissa = "0" + mantissa;
        if (mantissa.EndsWith('.')) mantissa = mantissa[..^1];
        return sign + mantissa + exponent;
    }

    public WordSyntax? Tag(IoListColumn column)
    {
        var cell = Cell(column);
        if (TagPattern.IsMatch(cell)) return new WordSyntax(default, cell);
        Report(DiagnosticCatalog.CellInvalidName, column,
            $"'{cell}' is not a tag: a tag starts with a letter and holds letters, digits, '_' and '-' (no spaces), e.g. FIT-501");
        return null;
    }

    public WordSyntax? Name(IoListColumn column, string what)
    {
        var cell = Cell(column);
        if (NamePattern.IsMatch(cell)) return new WordSyntax(default, cell);
        Report(DiagnosticCatalog.CellInvalidName, column,
            $"'{cell}' is not a {what} name: a name starts with a letter and holds letters, digits and '_', e.g. ai_4_20");
        return null;
    }

    /// <summary>Free text for a one-line string: line breaks and runs of white space become one space.</summary>
    public string Text(IoListColumn column)
    {
        var text = string.Join(' ', Cell(column).Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries));
        var bad = text.FirstOrDefault(SyntaxParser.IsInvalidCharacter);
        if (bad == default) return text;
        Report(DiagnosticCatalog.CsvUnreadable, column,
            string.Create(CultureInfo.InvariantCulture, $"the cell holds the character U+{(int)bad:X4}, which a .scale file cannot hold: remove it") +
            (bad == '\uFFFD' ? " (it stands for bytes that are not UTF-8: save the list as CSV UTF-8)" : ""));
        return "";
    }

    public bool? YesNo(IoListColumn column)
    {
        var cell = Cell(column);
        switch (cell.ToLowerInvariant())
        {
            case "": return null;
            case "yes" or "y" or "true" or "1" or "x": return true;
            case "no" or "n" or "false" or "0": return false;
            default:
                Report(DiagnosticCatalog.CellUnknownChoice, column, $"'{cell}' is neither yes nor no");
                return null;
        }
    }

    /// <summary>One of a list of words, compared ignoring case, spaces and '-'; returns the word as the language writes it.</summary>
    public string? Choice(IoListColumn column, params string[] choices)
    {
        var cell = Cell(column);
        var key = cell.ToLowerInvariant().Replace(" ", "", StringComparison.Ordinal).Replace("-", "", StringComparison.Ordinal);
        var match = choices.FirstOrDefault(c => c == key);
        if (match is not null) return match;
        var near = SyntaxParser.Suggest(key, choices);
        Report(DiagnosticCatalog.CellUnknownChoice, column,
            $"'{cell}' is not one of {string.Join(", ", choices)}" + (near is null ? "" : $": did you mean '{near}'?"));
        return null;
    }
}
