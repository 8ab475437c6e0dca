using System.Diagnostics;
using System.Globalization;
using ScaleGen.Engine;
using ScaleGen.Model;
using ScaleGen.Syntax;
using ScaleGen.Text;

namespace ScaleGen.Bench;

/// <summary>
/// `phases` mode: where the front end's time and allocations go on one plant, phase by
/// phase (scan, parse, bind, analyse), median of N runs. For finding hot spots, not a target.
/// </summary>
public static class Phases
{
    public static int Run(int points, int runs, TextWriter output)
    {
        var work = Workload.Create(points);
        var rows = new List<(string Phase, double Ms, double CpuMs, long Bytes)>();
        using var self = Process.GetCurrentProcess();
        void Step(string phase, Action action)
        {
            action();
            var times = new List<double>();
            var cpus = new List<double>();
            long bytes = 0;
            for (var i = 0; i < runs; i++)
            {
                var before = GC.GetTotalAllocatedBytes(precise: true);
                self.Refresh();
                var cpu = self.TotalProcessorTime;
                var watch = Stopwatch.StartNew();
                action();
                times.Add(watch.Elapsed.TotalMilliseconds);
                self.Refresh();
                cpus.Add((self.TotalProcessorTime - cpu).TotalMilliseconds);
                bytes = GC.GetTotalAllocatedBytes(precise: true) - before;
            }
            rows.Add((phase, times.Order().ElementAt(times.Count / 2), cpus.Order().ElementAt(cpus.Count / 2), bytes));
        }

        Step("scan", () => { foreach (var s in work.Sources) new StatementScanner(s, new DiagnosticBag()).Scan(); });
        Step("parse (scan included)", () => SyntaxParser.ParseAll(work.Sources, new DiagnosticBag()));
        var units = SyntaxParser.ParseAll(work.Sources, new DiagnosticBag());
        Step("bind", () => Binder.Bind(units, new DiagnosticBag()));
        var plant = Binder.Bind(units, new DiagnosticBag());
        Step("analyse", () => PlantAnalyzer.Analyze(plant, new DiagnosticBag()));
        Step("compile (all of it)", () => Compilation.Compile(work.Sources));
        Step("JSON baseline", () => work.ReadJson());

        output.WriteLine($"{points} points, median of {runs}, {GC.CollectionCount(0)} gen0 / {GC.CollectionCount(2)} gen2 collections in all");
        foreach (var (phase, ms, cpu, bytes) in rows)
            output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{phase,-24} {ms,8:0.0} ms wall {cpu,8:0.0} ms CPU {bytes / 1048576.0,8:0.0} MB allocated"));
        return 0;
    }
}
