using System.Globalization;
using CsvHelper;
using CsvHelper.Configuration;

namespace ScaleGen.Import;

/// <summary>
/// Other header names for the import columns: "Tag No.=tag, Service=description". A header
/// matches an entry when the two are equal after trimming, ignoring case. Mappings come from
/// `--map` or from a small two-column CSV file (`header,column`), where header names may
/// hold commas and '=' because the CSV quoting rules apply.
/// </summary>
public sealed class HeaderMap
{
    private readonly Dictionary<string, (string Header, IoListColumn Column)> _entries = new(StringComparer.OrdinalIgnoreCase);

    public static HeaderMap Empty => new();

    public IEnumerable<(string Header, IoListColumn Column)> Entries => _entries.Values;

    public IoListColumn? Find(string header) =>
        _entries.TryGetValue(header.Trim(), out var entry) ? entry.Column : null;

    /// <summary>Reads `--map` values, each a comma list of <c>Header Name=column</c>. Returns an error text or null.</summary>
    public string? AddSpecs(IEnumerable<string> specs)
    {
        foreach (var spec in specs)
        foreach (var part in spec.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            var equals = part.LastIndexOf('=');
            if (equals <= 0 || equals == part.Length - 1)
                return $"--map entry '{part}' is not of the form 'Header Name=column'";
            var error = Add(part[..equals], part[(equals + 1)..]);
            if (error is not null) return $"--map entry '{part}': {error}";
        }
        return null;
    }

    /// <summary>Reads a mapping file: a header row <c>header,column</c>, then one mapping a row. Returns an error text or null.</summary>
    public string? AddFile(string path, string text)
    {
        var configuration = new CsvConfiguration(CultureInfo.InvariantCulture)
        {
            HasHeaderRecord = false,
            AllowComments = true,
            Comment = '#',
            BadDataFound = null,
            MissingFieldFound = null,
        };
        using var parser = new CsvParser(new StringReader(text), configuration);
        var first = true;
        while (parser.Read())
        {
            var record = parser.Record ?? Array.Empty<string>();
            var row = parser.Row.ToString(CultureInfo.InvariantCulture);
            if (record.All(string.IsNullOrWhiteSpace)) continue;
            if (first)
            {
                first = false;
                if (record.Length >= 2 && record[0].Trim().Equals("header", StringComparison.OrdinalIgnoreCase)
                    && record[1].Trim().Equals("column", StringComparison.OrdinalIgnoreCase))
                    continue;
                return $"mapping file '{path}' row {row}: the first row must be the header 'header,column'";
            }
            if (record.Length < 2 || string.IsNullOrWhiteSpace(record[0]) || string.IsNullOrWhiteSpace(record[1]))
                return $"mapping file '{path}' row {row}: give a header name and a column name";
            var error = Add(record[0], record[1]);
            if (error is not null) return $"mapping file '{path}' row {row}: {error}";
        }
        return null;
    }

    private string? Add(string header, string columnName)
    {
        header = header.Trim();
        var column = IoListColumns.Find(columnName);
        if (column is null)
        {
            var near = Syntax.SyntaxParser.Suggest(IoListColumns.Normalize(columnName), IoListColumns.All.Select(c => c.Name));
            return near is null
                ? $"'{columnName.Trim()}' is not an import column; the columns are {IoListColumns.Names}"
                : $"'{columnName.Trim()}' is not an import column: did you mean '{near}'?";
        }
        if (_entries.TryGetValue(header, out var existing) && existing.Column != column)
            return $"header '{header}' is already mapped to '{existing.Column.Name}'";
        _entries[header] = (header, column);
        return null;
    }
}
