using System.Diagnostics;
using System.Globalization;
using System.Text;
using BenchmarkDotNet.Attributes;
using ScaleGen.Text;
using ScaleGen.Verify;

namespace ScaleGen.Bench;

/// <summary>
/// A 1,000-point plant made in code (invented, in the style of the demo plant: levels,
/// flows with and without square root, pressures, temperatures, analysers, positions, with
/// filters, alarms, deadbands and delays), and verify's phases on it.
/// </summary>
public static class VerifyPlant
{
    private const string Cards = """
        plant "Benchmark works (invented)"
        cycle 100 ms
        card ai_4_20 {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511
          fault-code 32767
          type INT
        }
        card ai_0_20 {
          counts 0 .. 27648 at 0 .. 20 mA
          limits 0 .. 32511
          fault-code 32767
          type INT
          input 50 ohm
        }
        card av_1_5 {
          counts 0 .. 4000 at 1 .. 5 V
          limits -500 .. 4500
          fault-code -32768, 32767
          type INT
        }

        """;

    /// <summary>Point bodies by kind; {0} is a number that varies the range, {1} the channel.</summary>
    private static readonly string[] Kinds =
    [
        "card ai_4_20 at \"{1}\"\n  range 0 .. {0} m\n  health ne43\n  filter 5 s\n  alarm H {2} deadband 5 % delay 60 s\n  alarm L {3} deadband 5 % delay 60 s",
        "card ai_4_20 at \"{1}\"\n  range 0 .. {0} m3/h\n  sqrt cutoff 3 %\n  health ne43\n  filter 1 s\n  alarm H {2} deadband 5 % delay 15 s\n  alarm L {3} deadband 5 % delay 15 s clear 10 s",
        "card ai_4_20 at \"{1}\"\n  range 0 .. {0} kPa\n  health ne43\n  filter 0.5 s\n  alarm HH {2} deadband 2 % delay 15 s",
        "card ai_4_20 at \"{1}\"\n  range -20 .. {0} degC\n  health ne43\n  filter 10 s\n  alarm H {2} deadband 1 % delay 60 s",
        "card ai_0_20 at \"{1}\"\n  range 0 .. {0} mg/L\n  health ne43\n  on-fault low\n  filter 10 s\n  alarm H {2} deadband 2 %\n  alarm L {3} deadband 2 %",
        "card ai_4_20 at \"{1}\"\n  range 0 .. 100 %\n  health ne43",
        "card av_1_5 at \"{1}\"\n  shunt 250 ohm\n  range 0 .. {0} m3/h\n  health ne43\n  filter 2 s\n  alarm L {3} deadband 5 % delay 15 s",
        "card ai_4_20 at \"{1}\"\n  range {0} .. 0 m\n  health ne43\n  on-fault value 0\n  alarm HH {2} deadband 0.2 m delay 10 s\n  alarm LL {3} deadband 0.2 m delay 10 s",
        "card ai_4_20 at \"{1}\"\n  range 0 .. {0} kPa\n  health below 3.8 mA above 20.5 mA\n  alarm H {2} deadband 2 % delay 5 s clear 2 s",
        "card ai_0_20 at \"{1}\"\n  signal 0 .. 20 mA\n  range 0 .. {0} %\n  health none\n  on-fault hold",
    ];

    public static string Text(int points)
    {
        var text = new StringBuilder(Cards);
        for (var i = 0; i < points; i++)
        {
            var kind = i % Kinds.Length;
            var top = 10 + i % 37 * 25;
            var body = string.Format(CultureInfo.InvariantCulture, Kinds[kind], top, $"R{i / 256}.S{i / 16 % 16}.C{i % 16}", top * 0.85, top * 0.15);
            text.Append(CultureInfo.InvariantCulture, $"point B-{i:0000} {{\n  desc \"Benchmark point {i}\"\n  {body}\n}}\n");
        }
        return text.ToString();
    }

    public static Compilation Compile(int points)
    {
        var compilation = Compilation.Compile(new SourceText("bench.scale", Text(points)));
        if (compilation.HasErrors)
            throw new InvalidOperationException(string.Join("\n", compilation.Diagnostics.Where(d => d.IsError)));
        return compilation;
    }

    /// <summary>`--verify-1k`: times verify on a fresh 1,000-point plant, cold and warm, phase by phase.</summary>
    public static int RunTimed(int points = 1000, int runs = 3)
    {
        var compilation = Compile(points);
        var st = PlantVerifier.GenerateStructuredText(compilation);
        Console.WriteLine($"verify on a {points}-point plant: {st.Sum(s => s.Text.Length) / 1024} KiB of Structured Text, {Environment.ProcessorCount} cores, .NET {Environment.Version}");
        for (var run = 1; run <= runs; run++)
        {
            var watch = Stopwatch.StartNew();
            var result = PlantVerifier.Verify(compilation.Plant, st);
            var total = watch.Elapsed;
            var t = result.Timings;
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"run {run}{(run == 1 ? " (cold)" : "")}: ok={result.Ok} per-point={result.PerPoint} cases={result.Points.Sum(p => (long)p.Cases)} scans={result.Points.Sum(p => p.Scans)} " +
                $"translate={t.Translate.TotalSeconds:F2} s compile={t.Compile.TotalSeconds:F2} s run={t.Run.TotalSeconds:F2} s total={total.TotalSeconds:F2} s"));
            if (!result.Ok) return 1;
        }
        return 0;
    }
}

/// <summary>The phases of verify on the 1,000-point plant, for BenchmarkDotNet (few iterations: one run takes seconds).</summary>
[SimpleJob(launchCount: 1, warmupCount: 1, iterationCount: 3)]
[MemoryDiagnoser]
public class VerifyBenchmarks
{
    private Compilation _compilation = null!;
    private IReadOnlyList<SourceText> _st = null!;

    [GlobalSetup]
    public void Setup()
    {
        _compilation = VerifyPlant.Compile(1000);
        _st = PlantVerifier.GenerateStructuredText(_compilation);
    }

    [Benchmark]
    public int Translate() => StTranslator.Translate(_st).Code.Length;

    [Benchmark]
    public bool TranslateCompileRun() => PlantVerifier.Verify(_compilation.Plant, _st).Ok;
}
