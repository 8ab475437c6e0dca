using System.Collections.Immutable;
using System.Globalization;
using System.Text.RegularExpressions;
using ScaleGen.Syntax;
using ScaleGen.Text;

namespace ScaleGen.Import;

/// <summary>How to read the I/O list, and the declarations to check it against (may be none).</summary>
public sealed record ImportOptions(HeaderMap Map, string Delimiter, IReadOnlyList<SourceText> Declarations)
{
    public static ImportOptions Default { get; } = new(HeaderMap.Empty, ",", Array.Empty<SourceText>());
}

/// <summary>
/// What an import gives: the .scale text (null when any row is bad: then nothing is to be
/// written), every problem in row order, and how many points were made.
/// </summary>
public sealed record ImportResult(string? Text, IReadOnlyList<ImportProblem> Problems, int PointCount)
{
    public bool HasErrors => Problems.Any(p => p.IsError);
}

/// <summary>
/// The import phase: CSV rows to a syntax tree of points, printed by the formatter in
/// canonical layout. The printed text is then compiled the way `check` compiles it, together
/// with the declarations (cards, profiles) when given, and every finding is moved back to
/// the row and column it came from. So import accepts what check accepts, and the language
/// rules stay in the binder and the engine.
/// </summary>
/// <remarks>
/// Points reference cards (and profiles) by name; the names are declared in another .scale
/// file that is given on the same command line as the imported file. Without declarations
/// only the rows themselves are checked: unknown card or profile names are not reported,
/// and neither are warnings of a row that uses a profile (its settings are not known).
/// </remarks>
public static class IoListImporter
{
    public static ImportResult Import(string csvPath, string csvText, ImportOptions options, string? outputPath = null)
    {
        var problems = new List<ImportProblem>();
        var table = IoListReader.Read(csvPath, csvText, options.Map, options.Delimiter, problems);
        if (table is null) return Finish(null, problems, 0);

        var seenTags = new Dictionary<string, int>(StringComparer.Ordinal);
        var points = new List<(PointSyntax Point, IoListRow Row)>();
        foreach (var row in table.Rows)
        {
            var point = PointBuilder.Build(row, problems);
            // Tags are counted even on bad rows, so a duplicate shows up whichever row is fixed first.
            var tag = row.Cell(IoListColumns.Tag);
            if (tag.Length > 0 && !seenTags.TryAdd(tag, row.Row))
            {
                problems.Add(ImportProblem.At(DiagnosticCatalog.DuplicateTagRow, row.At(IoListColumns.Tag),
                    $"tag '{tag}' is already on row {seenTags[tag].ToString(CultureInfo.InvariantCulture)}: each point once"));
                continue;
            }
            if (point is not null) points.Add((point, row));
        }
        if (table.Rows.Count == 0)
            problems.Add(ImportProblem.At(DiagnosticCatalog.NoDataRows, new CsvPosition(csvPath, 1, null, null),
                "the file has a header row but no points: add one row per point below it"));
        if (points.Count == 0) return Finish(null, problems, 0);

        var text = Formatter.Format(new CompilationUnitSyntax(new SourceText(csvPath, ""), Declarations(points, csvPath), ImmutableArray<string>.Empty));
        var generated = new SourceText(outputPath ?? Path.ChangeExtension(csvPath, ".scale"), text);
        var rowOfTag = points.ToDictionary(p => p.Point.Name.Text, p => p.Row, StringComparer.Ordinal);
        CheckLikeCompiler(generated, rowOfTag, options.Declarations, problems);
        return Finish(text, problems, points.Count);
    }

    private static ImportResult Finish(string? text, List<ImportProblem> problems, int count)
    {
        var ordered = problems.OrderBy(p => p.SortRow).ThenBy(p => p.SortColumn).ToList();
        var failed = ordered.Any(p => p.IsError);
        return new ImportResult(failed ? null : text, ordered, failed ? 0 : count);
    }

    private static ImmutableArray<StatementSyntax> Declarations(List<(PointSyntax Point, IoListRow Row)> points, string csvPath)
    {
        var header = ImmutableArray.Create(
            $"# Points imported from {Path.GetFileName(csvPath)} by scalegen import: one point per row of the I/O list.",
            "# Cards and profiles are declared in another .scale file: give it on the same command line.",
            "# Review every point against the loop drawings and instrument data sheets before use.",
            "# Alarms are process alarms, not safety functions; defer to local codes and licensed practice.",
            "");
        var statements = points.Select(p => (StatementSyntax)p.Point).ToImmutableArray();
        return statements.SetItem(0, statements[0] with { Trivia = new Trivia(header, null, false) });
    }

    private static void CheckLikeCompiler(SourceText generated, Dictionary<string, IoListRow> rowOfTag, IReadOnlyList<SourceText> declarations, List<ImportProblem> problems)
    {
        var compilation = Compilation.Compile(declarations.Append(generated).ToArray());
        // The printed text read back: its spans are the ones the diagnostics point into.
        var pointSyntax = compilation.Units[^1].Statements.OfType<PointSyntax>()
            .Where(p => rowOfTag.ContainsKey(p.Name.Text)).ToList();
        var haveDeclarations = declarations.Count > 0;

        foreach (var diagnostic in compilation.Diagnostics)
        {
            // The import made points; whether it made any is not the compiler's question here.
            if (diagnostic.Code == DiagnosticCatalog.NoPoints.Code) continue;
            if (diagnostic.Location.Source != generated)
            {
                // A mistake in the declarations file itself; its warnings (unused cards, ...) are not the import's business.
                if (diagnostic.IsError) problems.Add(ImportProblem.From(diagnostic));
                continue;
            }
            var point = pointSyntax.FirstOrDefault(p => Contains(p.Span, diagnostic.Location.Span.Start));
            if (point is null)
            {
                problems.Add(ImportProblem.From(diagnostic));
                continue;
            }
            var row = rowOfTag[point.Name.Text];
            if (!haveDeclarations)
            {
                if (diagnostic.Code == DiagnosticCatalog.UnknownCard.Code || diagnostic.Code == DiagnosticCatalog.UnknownProfile.Code) continue;
                if (!diagnostic.IsError && point.Uses is not null) continue;
            }
            var column = ColumnOf(diagnostic, point);
            problems.Add(new ImportProblem(diagnostic.Code, diagnostic.Severity, row.At(column).ToString(),
                RowsForPlaces(diagnostic.Message, generated, pointSyntax, rowOfTag), row.Row, row.Places.TryGetValue(column, out var place) ? place.Index : -1));
        }
    }

    private static bool Contains(TextSpan span, int offset) => offset >= span.Start && offset < Math.Max(span.End, span.Start + 1);

    /// <summary>The column whose cell produced the part of the point a diagnostic points at.</summary>
    private static IoListColumn ColumnOf(Diagnostic diagnostic, PointSyntax point)
    {
        var at = diagnostic.Location.Span.Start;
        var code = diagnostic.Code;
        if (point.Uses is { } uses && Contains(uses.Span, at)) return IoListColumns.Profile;
        var statement = point.Block.Statements.FirstOrDefault(s => Contains(s.Span, at));
        switch (statement)
        {
            case DescriptionSyntax:
                return IoListColumns.Description;
            case CardReferenceSyntax card:
                return card.Address is { } address && Contains(address.Span, at) ? IoListColumns.Address : IoListColumns.Card;
            case RangeSettingSyntax { Keyword.Text: "signal" } signal:
                return at >= signal.Range.High.Span.Start ? IoListColumns.SignalHigh : IoListColumns.SignalLow;
            case RangeSettingSyntax range:
                if (range.Range.Unit is { } unit && Contains(unit.Span, at)) return IoListColumns.Unit;
                return at >= range.Range.High.Span.Start ? IoListColumns.Urv : IoListColumns.Lrv;
            case QuantitySettingSyntax { Keyword.Text: "shunt" }:
                return IoListColumns.Shunt;
            case QuantitySettingSyntax { Keyword.Text: "filter" }:
                return IoListColumns.Filter;
            case QuantitySettingSyntax { Keyword.Text: "tolerance" }:
                return IoListColumns.Tolerance;
            case SqrtSyntax sqrt:
                return sqrt.Cutoff is { } cutoff && Contains(cutoff.Span, at) ? IoListColumns.Cutoff : IoListColumns.Sqrt;
            case HealthSyntax:
                return IoListColumns.Health;
            case OnFaultSyntax:
                return IoListColumns.OnFault;
            case MeasureSyntax:
                return IoListColumns.Measure;
            case AlarmSyntax alarm:
                var columns = IoListColumns.Alarms.First(a => a.Kind == alarm.Kind.Text);
                var option = alarm.Options.FirstOrDefault(o => Contains(o.Span, at));
                if (code == DiagnosticCatalog.DeadbandBelowOneCount.Code && alarm.Options.Any(o => o.Name.Text == "deadband"))
                    return IoListColumns.Deadband;
                return option?.Name.Text switch
                {
                    "deadband" => IoListColumns.Deadband,
                    "delay" => IoListColumns.Delay,
                    "priority" => columns.Priority,
                    _ => columns.Setpoint,
                };
        }

        // At the point's tag: the binder and the engine report whole-point findings there.
        if (code == DiagnosticCatalog.MissingCard.Code || code == DiagnosticCatalog.SpanOutsideLimits.Code
            || code == DiagnosticCatalog.CoarseResolution.Code)
            return IoListColumns.Card;
        if (code == DiagnosticCatalog.ShuntMismatch.Code) return IoListColumns.Shunt;
        if (code == DiagnosticCatalog.MissingRange.Code) return IoListColumns.Lrv;
        if (code == DiagnosticCatalog.NoHealthOnLiveZero.Code) return IoListColumns.Health;
        return IoListColumns.Tag;
    }

    /// <summary>Messages that name a place in the imported text ("at io-list.scale(40,7)") name the row instead.</summary>
    private static string RowsForPlaces(string message, SourceText generated, List<PointSyntax> points, Dictionary<string, IoListRow> rowOfTag)
    {
        var pattern = new Regex(Regex.Escape(generated.Path) + @"\((\d+),(\d+)\)", RegexOptions.CultureInvariant);
        return pattern.Replace(message, match =>
        {
            var line = int.Parse(match.Groups[1].Value, CultureInfo.InvariantCulture);
            var column = int.Parse(match.Groups[2].Value, CultureInfo.InvariantCulture);
            if (line > generated.LineCount) return match.Value;
            var offset = generated.GetLineStart(line) + column - 1;
            var point = points.FirstOrDefault(p => Contains(p.Span, offset));
            return point is null ? match.Value : $"row {rowOfTag[point.Name.Text].Row.ToString(CultureInfo.InvariantCulture)}";
        });
    }
}
