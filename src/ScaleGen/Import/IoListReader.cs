using System.Globalization;
using CsvHelper;
using CsvHelper.Configuration;
using ScaleGen.Text;

namespace ScaleGen.Import;

/// <summary>Where a column sits in the file: its index (0 is A) and the header the user wrote.</summary>
public sealed record ColumnPlace(int Index, string Header);

/// <summary>One data row: the spreadsheet row number and the cells of the import columns.</summary>
public sealed record IoListRow(string Path, int Row, IReadOnlyDictionary<IoListColumn, ColumnPlace> Places, IReadOnlyList<string> Fields)
{
    /// <summary>The cell of a column, trimmed; empty when the file has no such column or the row is short.</summary>
    public string Cell(IoListColumn column) =>
        Places.TryGetValue(column, out var place) && place.Index < Fields.Count ? Fields[place.Index].Trim() : "";

    public CsvPosition At(IoListColumn column) =>
        Places.TryGetValue(column, out var place)
            ? new CsvPosition(Path, Row, place.Index, place.Header)
            : new CsvPosition(Path, Row, null, null) { MissingColumn = column.Name };

    public CsvPosition Whole => new(Path, Row, null, null);
}

/// <summary>The I/O list read from CSV: which column is where, and the data rows.</summary>
public sealed record IoListTable(string Path, IReadOnlyDictionary<IoListColumn, ColumnPlace> Places, IReadOnlyList<IoListRow> Rows);

/// <summary>
/// Reads an I/O list with CsvHelper (RFC 4180: quoted fields may hold the delimiter, quotes
/// and line breaks). Row numbers are records, as a spreadsheet numbers its rows, so a cell
/// with a line break does not shift the rows after it. Rows whose cells are all empty are
/// skipped (spreadsheets export trailing ",,,," rows) but still counted.
/// </summary>
public static class IoListReader
{
    public static IoListTable? Read(string path, string text, HeaderMap map, string delimiter, List<ImportProblem> problems)
    {
        var badRows = new HashSet<int>();
        var rowNumber = 0;
        var configuration = new CsvConfiguration(CultureInfo.InvariantCulture)
        {
            Delimiter = delimiter,
            HasHeaderRecord = false,
            IgnoreBlankLines = false,
            MissingFieldFound = null,
            DetectColumnCountChanges = false,
            Mode = CsvMode.RFC4180,
            BadDataFound = args =>
            {
                if (badRows.Add(rowNumber))
                    problems.Add(ImportProblem.At(DiagnosticCatalog.CsvUnreadable, new CsvPosition(path, rowNumber, null, null),
                        $"a '\"' inside a field that does not start with one: quote the whole field and double the inner quote (\"\"), e.g. \"12\"\" pipe\""));
            },
        };

        var records = new List<(int Row, string[] Fields)>();
        using (var parser = new CsvParser(new StringReader(text), configuration))
        {
            // The row number must be known before the parser reads a record: BadDataFound fires while it does.
            while (true)
            {
                rowNumber++;
                if (!parser.Read()) break;
                records.Add((rowNumber, parser.Record ?? Array.Empty<string>()));
            }
        }
        if (QuoteLeftOpen(text) && records.Count > 0)
            problems.Add(ImportProblem.At(DiagnosticCatalog.CsvUnreadable, new CsvPosition(path, records[^1].Row, null, null),
                "a quoted field is never closed, so it runs to the end of the file: close the quote"));

        var headerIndex = records.FindIndex(r => !IsBlank(r.Fields));
        if (headerIndex < 0)
        {
            problems.Add(ImportProblem.At(DiagnosticCatalog.NoDataRows, CsvPosition.File(path),
                $"the file is empty: the first row must be the header ({IoListColumns.Names})"));
            return null;
        }
        var (headerRow, headers) = records[headerIndex];
        var places = ResolveHeader(path, headerRow, headers, map, problems);
        if (places is null) return null;

        var rows = records.Skip(headerIndex + 1)
            .Where(r => !IsBlank(r.Fields) && !badRows.Contains(r.Row))
            .Select(r => new IoListRow(path, r.Row, places, r.Fields))
            .ToList();
        return new IoListTable(path, places, rows);
    }

    private static bool IsBlank(string[] fields) => fields.All(string.IsNullOrWhiteSpace);

    /// <summary>An odd number of quotes: some quoted field never ends (a doubled quote counts two).</summary>
    private static bool QuoteLeftOpen(string text) => text.Count(c => c == '"') % 2 == 1;

    private static Dictionary<IoListColumn, ColumnPlace>? ResolveHeader(
        string path, int row, string[] headers, HeaderMap map, List<ImportProblem> problems)
    {
        var places = new Dictionary<IoListColumn, ColumnPlace>();
        var ok = true;
        var matchedMappings = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        for (var index = 0; index < headers.Length; index++)
        {
            var header = headers[index].Trim();
            if (header.Length == 0) continue;
            var position = new CsvPosition(path, row, index, header);
            var column = map.Find(header);
            if (column is not null) matchedMappings.Add(header);
            column ??= IoListColumns.Find(header);
            if (column is null)
            {
                var near = Syntax.SyntaxParser.Suggest(IoListColumns.Normalize(header), IoListColumns.All.Select(c => c.Name));
                problems.Add(ImportProblem.At(DiagnosticCatalog.IgnoredColumn, position,
                    near is null
                        ? $"'{header}' is not an import column, so the column is ignored; map it with --map \"{header}=COLUMN\" if it holds one"
                        : $"'{header}' is not an import column, so the column is ignored: did you mean '{near}'?"));
                continue;
            }
            if (places.TryGetValue(column, out var first))
            {
                problems.Add(ImportProblem.At(DiagnosticCatalog.DuplicateColumn, position,
                    $"column {CsvPosition.ColumnLetter(first.Index)} '{first.Header}' already holds '{column.Name}': keep one of the two or map one to another column"));
                ok = false;
                continue;
            }
            places[column] = new ColumnPlace(index, header);
        }

        foreach (var (header, column) in map.Entries.OrderBy(e => e.Header, StringComparer.Ordinal))
            if (!matchedMappings.Contains(header))
                problems.Add(ImportProblem.At(DiagnosticCatalog.UnmatchedMapping, new CsvPosition(path, row, null, null),
                    $"the mapping '{header}={column.Name}' matches no header cell of the file"));

        foreach (var column in IoListColumns.All.Where(c => c.Required && !places.ContainsKey(c)))
        {
            problems.Add(ImportProblem.At(DiagnosticCatalog.MissingColumn, new CsvPosition(path, row, null, null),
                $"no column '{column.Name}' ({column.Meaning}): add a header cell '{column.Name}', or map yours with --map \"Your Header={column.Name}\""));
            ok = false;
        }
        return ok ? places : null;
    }
}
