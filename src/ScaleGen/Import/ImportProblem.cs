using System.Globalization;
using ScaleGen.Text;

namespace ScaleGen.Import;

/// <summary>
/// A cell, a row or the whole of a CSV file, counted the way a spreadsheet user counts:
/// the header is row 1, the first column is A.
/// </summary>
public sealed record CsvPosition(string Path, int Row, int? ColumnIndex, string? Header)
{
    /// <summary>A column the file does not have; the message names it.</summary>
    public string? MissingColumn { get; init; }

    public static CsvPosition File(string path) => new(path, 0, null, null);

    /// <summary><c>io-list.csv(row 17, column G 'lrv')</c>, <c>io-list.csv(row 17)</c> or <c>io-list.csv</c>.</summary>
    public override string ToString()
    {
        if (Row <= 0) return Path;
        var row = Row.ToString(CultureInfo.InvariantCulture);
        if (ColumnIndex is { } index)
            return $"{Path}(row {row}, column {ColumnLetter(index)} '{Header}')";
        if (MissingColumn is not null)
            return $"{Path}(row {row}, no column '{MissingColumn}')";
        return $"{Path}(row {row})";
    }

    /// <summary>0 is A, 25 is Z, 26 is AA, as spreadsheets name columns.</summary>
    public static string ColumnLetter(int index)
    {
        var letters = "";
        for (var n = index + 1; n > 0; n = (n - 1) / 26)
            letters = (char)('A' + (n - 1) % 26) + letters;
        return letters;
    }
}

/// <summary>
/// One finding of `import`. Problems in the CSV name a row and column; problems found when
/// the imported points are checked with the card declarations keep the compiler's codes but
/// are moved to the row and column the offending setting came from.
/// </summary>
public sealed record ImportProblem(string Code, Severity Severity, string Location, string Message, int SortRow, int SortColumn)
{
    public bool IsError => Severity == Severity.Error;

    public static ImportProblem At(DiagnosticDescriptor descriptor, CsvPosition position, string message) =>
        new(descriptor.Code, descriptor.Severity, position.ToString(), message, position.Row, position.ColumnIndex ?? -1);

    /// <summary>A diagnostic in another file (a declarations file), shown as the compiler shows it.</summary>
    public static ImportProblem From(Diagnostic diagnostic) =>
        new(diagnostic.Code, diagnostic.Severity, diagnostic.Location.ToString(), diagnostic.Message, int.MaxValue, -1);

    /// <summary>The compiler convention with a CSV place: <c>io-list.csv(row 17, column G 'lrv'): error SG3004: ...</c>.</summary>
    public override string ToString() => $"{Location}: {(IsError ? "error" : "warning")} {Code}: {Message}";
}
