using System.Globalization;
using BenchmarkDotNet.Running;
using ScaleGen.Bench;

// Benchmarks of ScaleGen (see docs/performance.md). Modes:
//   bench [--sizes 1000,5000,10000,50000] [--runs 5] [--cold 3]   stopwatch medians, and cold builds of every size
//   micro [BenchmarkDotNet options, e.g. --filter *FrontEnd*]      BenchmarkDotNet, short runs
//   phases [--points 10000] [--runs 5]                              front-end time and allocations by phase
//   generate --points N [--seed S] -o DIR                           write an invented site's .scale files
//   build-once -o DIR FILES...                                      one build; prints the peak working set
//   verify-1k                                                       verify on a 1,000-point plant, timed phase by phase
var mode = args.Length > 0 ? args[0] : "bench";
var rest = args.Skip(1).ToArray();
switch (mode)
{
    case "bench":
        var sizes = Option(rest, "--sizes", "1000,5000,10000,50000").Split(',').Select(s => int.Parse(s, CultureInfo.InvariantCulture)).ToArray();
        var runs = int.Parse(Option(rest, "--runs", "5"), CultureInfo.InvariantCulture);
        var cold = int.Parse(Option(rest, "--cold", "3"), CultureInfo.InvariantCulture);
        return MedianBench.Run(sizes, runs, cold, Console.Out);
    case "micro":
        BenchmarkSwitcher.FromAssembly(typeof(MedianBench).Assembly).Run(rest);
        return 0;
    case "phases":
        return Phases.Run(int.Parse(Option(rest, "--points", "10000"), CultureInfo.InvariantCulture),
            int.Parse(Option(rest, "--runs", "5"), CultureInfo.InvariantCulture), Console.Out);
    case "generate":
    {
        var folder = Option(rest, "-o", "site");
        Directory.CreateDirectory(folder);
        foreach (var file in ScaleGen.Samples.PlantGenerator.Site(int.Parse(Option(rest, "--points", "10000"), CultureInfo.InvariantCulture),
                     int.Parse(Option(rest, "--seed", "1"), CultureInfo.InvariantCulture)))
            File.WriteAllText(Path.Combine(folder, file.Name), file.Text);
        return 0;
    }
    case "build-once":
        return MedianBench.BuildOnce(rest);
    case "verify-1k" or "--verify-1k":
        return VerifyPlant.RunTimed();
    default:
        Console.Error.WriteLine("usage: ScaleGen.Bench [bench [--sizes N,N] [--runs N] [--cold N] | micro [BenchmarkDotNet options] | phases [--points N] [--runs N] | generate --points N [--seed S] -o DIR | build-once -o DIR FILES | verify-1k]");
        return 2;
}

static string Option(string[] args, string name, string fallback)
{
    var index = Array.IndexOf(args, name);
    return index >= 0 && index + 1 < args.Length ? args[index + 1] : fallback;
}
