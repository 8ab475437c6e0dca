using System.Diagnostics;
using System.Globalization;
using System.Runtime.InteropServices;
using System.Text;
using ScaleGen.Emit;

namespace ScaleGen.Bench;

/// <summary>
/// `bench` mode: plain stopwatch figures for the sizes the targets name. Each step runs once
/// to warm up and then <c>runs</c> times; the median is reported, as wall-clock time and as
/// the CPU time the process used (on a shared machine the CPU time is the steadier figure).
/// The largest plant's full build is also run cold in a fresh process, as a user runs it,
/// with that process's peak working set.
/// </summary>
public static class MedianBench
{
    private readonly record struct Timing(double Wall, double Cpu);

    public static int Run(int[] sizes, int runs, int coldRuns, TextWriter output)
    {
        var invariant = CultureInfo.InvariantCulture;
        var steps = new List<string> { "JSON read", "parse+bind", "compile" };
        steps.AddRange(OutputCatalog.All.Select(e => $"emit {e.Kind}"));
        steps.Add("build");
        var results = new SortedDictionary<int, Timing[]>();
        var bytes = new SortedDictionary<int, (long Scale, long Json)>();

        foreach (var size in sizes)
        {
            output.WriteLine($"[{size} points] generating...");
            var work = Workload.Create(size);
            bytes[size] = (work.ScaleBytes, work.JsonBytes);
            var folder = work.OutputFolder("median");
            var timings = new List<Timing>
            {
                Measure(runs, () => work.ReadJson()),
                Measure(runs, () => work.ParseAndBind()),
                Measure(runs, () => work.Compile()),
            };
            timings.AddRange(OutputCatalog.All.Select(e => Measure(runs, () => work.Emit(e))));
            timings.Add(Measure(runs, () => work.Build(folder)));
            results[size] = timings.ToArray();
            output.WriteLine($"[{size} points] done");
        }

        output.WriteLine();
        output.WriteLine($"Medians of {runs} runs after one warm-up, in one process; {Environment.ProcessorCount} logical CPUs, {RuntimeInformation.FrameworkDescription}, {RuntimeInformation.OSDescription}; server GC {System.Runtime.GCSettings.IsServerGC}.");
        foreach (var (title, pick) in new (string, Func<Timing, double>)[] { ("wall-clock ms", t => t.Wall), ("CPU ms", t => t.Cpu) })
        {
            output.WriteLine();
            output.WriteLine($"| points | .scale MB | JSON MB | {string.Join(" | ", steps.Select(s => $"{s} ({title})"))} | parse+bind / JSON |");
            output.WriteLine("|" + string.Concat(Enumerable.Repeat(" ---: |", steps.Count + 4)));
            foreach (var (size, timings) in results)
            {
                output.WriteLine(string.Create(invariant,
                    $"| {size} | {bytes[size].Scale / 1e6:0.0} | {bytes[size].Json / 1e6:0.0} | {string.Join(" | ", timings.Select(t => pick(t).ToString("0", invariant)))} | {pick(timings[1]) / pick(timings[0]):0.00} |"));
            }
        }
        if (results.TryGetValue(5000, out var at5k) && results.TryGetValue(50000, out var at50k))
        {
            output.WriteLine();
            output.WriteLine("Growth from 5,000 to 50,000 points (linear is x10, the target at most x11):");
            for (var i = 0; i < steps.Count; i++)
                output.WriteLine(string.Create(invariant, $"- {steps[i]}: wall x{at50k[i].Wall / at5k[i].Wall:0.0}, CPU x{at50k[i].Cpu / at5k[i].Cpu:0.0}"));
        }

        if (coldRuns > 0 && sizes.Length > 0)
        {
            // The figure a user sees: `build` in a fresh process, as the tool runs it, for every
            // size. In the one process above, the largest plant's measurements also carry the
            // workload's own live heap (its sources, compilation and JSON), which the tool never holds.
            output.WriteLine();
            output.WriteLine($"Cold `build` in a fresh process, start to exit, median of {coldRuns} (after one run that warms the disk cache):");
            output.WriteLine();
            output.WriteLine("| points | wall-clock ms | CPU ms | peak working set MB |");
            output.WriteLine("| ---: | ---: | ---: | ---: |");
            var cold = new SortedDictionary<int, (double Wall, double Cpu, long Peak)>();
            foreach (var size in sizes.Order())
            {
                var work = Workload.Create(size);
                var times = new List<double>();
                var cpus = new List<double>();
                var peaks = new List<long>();
                for (var i = 0; i < coldRuns + 1; i++)
                {
                    var (wall, cpu, peak) = ColdBuild(work);
                    if (i == 0) continue; // the first run warms the disk cache
                    times.Add(wall);
                    cpus.Add(cpu);
                    peaks.Add(peak);
                }
                cold[size] = (Median(times), Median(cpus), peaks.Max());
                output.WriteLine(string.Create(invariant, $"| {size} | {cold[size].Wall:0} | {cold[size].Cpu:0} | {cold[size].Peak / 1048576.0:0} |"));
            }
            if (cold.TryGetValue(5000, out var cold5k) && cold.TryGetValue(50000, out var cold50k))
            {
                output.WriteLine();
                output.WriteLine(string.Create(invariant,
                    $"Cold build growth from 5,000 to 50,000 points: wall x{cold50k.Wall / cold5k.Wall:0.0}, CPU x{cold50k.Cpu / cold5k.Cpu:0.0} (largest peak {cold50k.Peak / 1048576.0:0} MB)."));
            }
        }
        return 0;
    }

    /// <summary>Runs this program's `build-once` mode in a new process: the CLI's code, started cold.</summary>
    private static (double Wall, double Cpu, long PeakBytes) ColdBuild(Workload work)
    {
        var self = Environment.ProcessPath ?? throw new InvalidOperationException("no process path");
        var start = new ProcessStartInfo(self) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        if (Path.GetFileNameWithoutExtension(self) == "dotnet") start.ArgumentList.Add(typeof(MedianBench).Assembly.Location);
        foreach (var argument in new[] { "build-once", "-o", work.OutputFolder("cold") }.Concat(work.Files)) start.ArgumentList.Add(argument);
        var watch = Stopwatch.StartNew();
        using var process = Process.Start(start)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        process.WaitForExit();
        watch.Stop();
        if (process.ExitCode != 0) throw new InvalidOperationException($"cold build failed: {stderr.Result}");
        var report = stdout.Result.Trim().Split(' ');
        return (watch.Elapsed.TotalMilliseconds, double.Parse(report[1], CultureInfo.InvariantCulture), long.Parse(report[0], CultureInfo.InvariantCulture));
    }

    /// <summary>
    /// `build-once -o DIR FILES`: one `scalegen build` through the CLI's own entry, then this
    /// process's peak working set (bytes) and CPU time (ms) on stdout.
    /// </summary>
    public static int BuildOnce(string[] args)
    {
        var at = Array.IndexOf(args, "-o");
        if (at < 0 || at + 1 >= args.Length) throw new ArgumentException("build-once needs -o DIR");
        var files = args.Where((_, i) => i != at && i != at + 1).ToArray();
        var exit = Cli.ScaleGenCli.Run(["build", .. files, "-o", args[at + 1]], TextWriter.Null, Console.Error);
        using var self = Process.GetCurrentProcess();
        self.Refresh();
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"{self.PeakWorkingSet64} {self.TotalProcessorTime.TotalMilliseconds:0}"));
        return exit;
    }

    private static Timing Measure(int runs, Action action)
    {
        action();
        var walls = new List<double>();
        var cpus = new List<double>();
        using var self = Process.GetCurrentProcess();
        for (var i = 0; i < runs; i++)
        {
            self.Refresh();
            var cpu = self.TotalProcessorTime;
            var watch = Stopwatch.StartNew();
            action();
            walls.Add(watch.Elapsed.TotalMilliseconds);
            self.Refresh();
            cpus.Add((self.TotalProcessorTime - cpu).TotalMilliseconds);
        }
        return new Timing(Median(walls), Median(cpus));
    }

    private static Timing Measure(int runs, Func<object> action) => Measure(runs, () => { action(); });

    private static double Median(List<double> values)
    {
        var sorted = values.Order().ToArray();
        return sorted.Length % 2 == 1 ? sorted[sorted.Length / 2] : (sorted[sorted.Length / 2 - 1] + sorted[sorted.Length / 2]) / 2;
    }
}
