using System.Text.RegularExpressions;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Syntax;

/// <summary>
/// docs/language.md lists every diagnostic in <see cref="DiagnosticCatalog.All"/>, with its
/// severity and title, and nothing else. On failure the message carries the whole table as
/// it should be, ready to paste under "## Diagnostics".
/// </summary>
public class DiagnosticDocsTests
{
    private static readonly Regex Row = new(@"^\|\s*(SG\d{4})\s*\|\s*(error|warning)\s*\|\s*(.*?)\s*\|\s*$", RegexOptions.CultureInvariant);

    private static string ExpectedTable() =>
        "| code | severity | meaning |\n| --- | --- | --- |\n" + string.Concat(DiagnosticCatalog.All.Select(d =>
            $"| {d.Code} | {(d.Severity == Severity.Error ? "error" : "warning")} | {d.Title.Replace("|", "\\|", StringComparison.Ordinal)} |\n"));

    /// <summary>The lines of the "## Diagnostics" section, up to the next heading.</summary>
    private static string[] DiagnosticsSection()
    {
        var lines = File.ReadAllLines(Path.Combine(TestInputs.RepositoryRoot, "docs", "language.md"));
        var start = Array.FindIndex(lines, l => l.Trim() == "## Diagnostics");
        Assert.True(start >= 0, "docs/language.md has no '## Diagnostics' heading");
        return lines.Skip(start + 1).TakeWhile(l => !l.StartsWith("## ", StringComparison.Ordinal)).ToArray();
    }

    [Fact]
    public void The_language_reference_lists_every_diagnostic_code_with_its_severity_and_title()
    {
        var section = DiagnosticsSection();
        var table = section.SkipWhile(l => !l.StartsWith('|')).TakeWhile(l => l.StartsWith('|')).ToArray();
        var hint = "\nThe table should read:\n" + ExpectedTable();

        Assert.True(table.Length >= 2, "no table under '## Diagnostics'" + hint);
        Assert.Equal("| code | severity | meaning |", table[0].Trim());
        Assert.Equal("| --- | --- | --- |", table[1].Trim());

        var documented = table.Skip(2).Select(line =>
        {
            var match = Row.Match(line);
            Assert.True(match.Success, $"not a diagnostics row: '{line}'" + hint);
            return (Code: match.Groups[1].Value, Severity: match.Groups[2].Value, Title: match.Groups[3].Value.Replace("\\|", "|", StringComparison.Ordinal));
        }).ToList();

        var expected = DiagnosticCatalog.All
            .Select(d => (d.Code, Severity: d.Severity == Severity.Error ? "error" : "warning", d.Title)).ToList();
        var missing = expected.Where(e => !documented.Contains(e)).ToList();
        var extra = documented.Where(d => !expected.Contains(d)).ToList();
        Assert.True(missing.Count == 0 && extra.Count == 0,
            $"missing or different: {string.Join(", ", missing)}; extra or different: {string.Join(", ", extra)}" + hint);
        Assert.Equal(documented.Count, documented.Distinct().Count());
        Assert.Equal(expected.Select(e => e.Code), documented.Select(d => d.Code));
    }

    [Fact]
    public void Every_code_is_unique_and_named_by_its_range()
    {
        var all = DiagnosticCatalog.All;
        Assert.Equal(all.Count, all.Select(d => d.Code).Distinct(StringComparer.Ordinal).Count());
        foreach (var d in all)
        {
            Assert.Matches(@"^SG\d{4}$", d.Code);
            // SG0xxx lexical and syntax, SG1xxx binding and validation errors, SG2xxx warnings;
            // SG30xx I/O-list import errors, SG31xx import warnings.
            var isWarning = d.Code[2] == '2' || d.Code.StartsWith("SG31", StringComparison.Ordinal);
            Assert.Equal(isWarning ? Severity.Warning : Severity.Error, d.Severity);
            Assert.False(string.IsNullOrWhiteSpace(d.Title));
        }
    }
}
