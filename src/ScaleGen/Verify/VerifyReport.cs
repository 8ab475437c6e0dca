using System.Globalization;
using System.Text;
using Newtonsoft.Json.Linq;
using ScaleGen.Emit;

namespace ScaleGen.Verify;

/// <summary>What `verify` prints: a table per point, or the JSON of the command-line contract.</summary>
public static class VerifyReport
{
    /// <summary>
    /// One row per point (cases, scans, largest error and largest derived tolerance in % of
    /// span, edge scans, mismatches, ok), then the first failure of each failing point, then
    /// one summary line. A problem that stopped the run comes first, in the compiler convention.
    /// </summary>
    public static string Text(VerifyResult result)
    {
        var text = new StringBuilder();
        var files = string.Join(", ", result.StFiles);
        text.Append(Invariant($"verify: {files} run against the reference model, one scan per {Cycle(result.CycleSeconds)} cycle\n"));
        if (result.Problem is { } problem)
        {
            text.Append(problem).Append('\n');
            text.Append("verify: FAILED: the Structured Text could not be run; no point was verified\n");
            return text.ToString();
        }

        string[] header = ["point", "cases", "scans", "max error %", "tolerance %", "edge", "mismatches", "ok"];
        var rows = result.Points.Select(p => new[]
        {
            p.Point,
            Invariant($"{p.Cases}"),
            Invariant($"{p.Scans}"),
            Percent(p.MaxErrorPercent),
            Percent(p.TolerancePercent),
            Invariant($"{p.EdgeScans}"),
            Invariant($"{p.Mismatches}"),
            p.Ok ? "ok" : "FAIL",
        }).ToList();
        var widths = header.Select((h, i) => rows.Select(r => r[i].Length).Append(h.Length).Max()).ToArray();
        void Row(string[] cells)
        {
            var line = new StringBuilder();
            for (var i = 0; i < cells.Length; i++)
            {
                if (i > 0) line.Append("  ");
                line.Append(i == 0 ? cells[i].PadRight(widths[i]) : cells[i].PadLeft(widths[i]));
            }
            text.Append(line.ToString().TrimEnd()).Append('\n');
        }
        Row(header);
        foreach (var row in rows) Row(row);

        foreach (var point in result.Points.Where(p => p.FirstFailure is not null))
        {
            var f = point.FirstFailure!;
            text.Append(Invariant($"{point.Point}: first failure in case {f.Case} ({f.CaseName}), scan {f.Scan}, raw {f.Raw}: {f.What} expected {f.Expected}, got {f.Got}\n"));
        }

        var cases = result.Points.Sum(p => (long)p.Cases);
        var scans = result.Points.Sum(p => p.Scans);
        var edges = result.Points.Sum(p => p.EdgeScans);
        var edgeNote = edges > 0 ? Invariant($"; {edges} scans with an alarm bit decided within REAL precision of its edge") : "";
        var failed = result.Points.Count(p => !p.Ok);
        var count = result.Points.Length;
        text.Append(failed == 0
            ? Invariant($"verify: ok: {(count == 1 ? "the 1 point agrees" : $"all {count} points agree")} with the reference ({cases} cases, {scans} scans{edgeNote})\n")
            : Invariant($"verify: FAILED: {failed} of {count} point{(count == 1 ? "" : "s")} disagree{(failed == 1 && count == 1 ? "s" : "")} with the reference ({cases} cases, {scans} scans{edgeNote})\n"));
        return text.ToString();
    }

    /// <summary><c>{ "points": [ { "point", "cases", "max_error", "mismatches", "ok", ... } ], "ok": bool, ... }</c>; max_error and tolerance in % of span.</summary>
    public static JObject Json(VerifyResult result)
    {
        var points = new JArray(result.Points.Select(p => new JObject
        {
            ["point"] = p.Point,
            ["cases"] = p.Cases,
            ["scans"] = p.Scans,
            ["max_error"] = JsonOutput.Number(p.MaxErrorPercent),
            ["tolerance"] = JsonOutput.Number(p.TolerancePercent),
            ["tolerance_units"] = JsonOutput.Number(p.ToleranceUnits),
            ["edge_scans"] = p.EdgeScans,
            ["mismatches"] = p.Mismatches,
            ["ok"] = p.Ok,
            ["first_failure"] = p.FirstFailure is { } f
                ? new JObject
                {
                    ["case"] = f.Case,
                    ["case_name"] = f.CaseName,
                    ["scan"] = f.Scan,
                    ["raw"] = f.Raw,
                    ["what"] = f.What,
                    ["expected"] = f.Expected,
                    ["got"] = f.Got,
                }
                : JValue.CreateNull(),
        }));
        return new JObject
        {
            ["points"] = points,
            ["ok"] = result.Ok,
            ["st_files"] = new JArray(result.StFiles),
            ["cycle_ms"] = JsonOutput.Number(result.CycleSeconds * 1000),
            ["error"] = result.Problem is { } problem
                ? new JObject
                {
                    ["file"] = problem.Path,
                    ["line"] = problem.Line,
                    ["column"] = problem.Column,
                    ["message"] = problem.Message,
                }
                : JValue.CreateNull(),
        };
    }

    /// <summary>A percentage for the table: plain decimals down to 0.001, scientific below, "0" for exactly zero.</summary>
    public static string Percent(double value) =>
        value == 0 ? "0"
        : Math.Abs(value) >= 0.001 ? value.ToString("0.####", CultureInfo.InvariantCulture)
        : value.ToString("0.00E+0", CultureInfo.InvariantCulture);

    private static string Cycle(double seconds) =>
        seconds < 1 ? Invariant($"{Math.Round(seconds * 1000, 6)} ms") : Invariant($"{Math.Round(seconds, 6)} s");

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
