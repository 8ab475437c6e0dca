using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Diagnosers;
using ScaleGen.Emit;

namespace ScaleGen.Bench;

/// <summary>
/// The front end against the JSON baseline, at each size. BenchmarkDotNet's short run
/// (3 iterations after warm-up, one process) is enough for figures of this size.
/// </summary>
[ShortRunJob, MemoryDiagnoser]
public class FrontEndBenchmarks
{
    private Workload _work = null!;

    [Params(1000, 10000, 50000)]
    public int Points { get; set; }

    [GlobalSetup]
    public void Setup() => _work = Workload.Create(Points);

    [Benchmark(Baseline = true, Description = "JSON baseline (Newtonsoft.Json)")]
    public object JsonBaseline() => _work.ReadJson();

    [Benchmark(Description = "parse+bind")]
    public object ParseAndBind() => _work.ParseAndBind();

    [Benchmark(Description = "compile (parse, bind, analyse)")]
    public object Compile() => _work.Compile();
}

/// <summary>Each emitter of <see cref="OutputCatalog.All"/> on an already compiled plant.</summary>
[ShortRunJob, MemoryDiagnoser]
public class EmitterBenchmarks
{
    private Workload _work = null!;
    private IOutputEmitter _emitter = null!;

    [Params(1000, 10000, 50000)]
    public int Points { get; set; }

    [ParamsSource(nameof(Kinds))]
    public string Kind { get; set; } = "";

    public static IEnumerable<string> Kinds() => OutputCatalog.All.Select(e => e.Kind);

    [GlobalSetup]
    public void Setup()
    {
        _work = Workload.Create(Points);
        _emitter = OutputCatalog.Find(Kind)!;
    }

    [Benchmark]
    public long Emit() => _work.Emit(_emitter);
}

/// <summary>`scalegen build` in-process: read the files, compile, emit everything, write all or nothing.</summary>
[ShortRunJob, MemoryDiagnoser]
public class BuildBenchmarks
{
    private Workload _work = null!;

    [Params(1000, 10000, 50000)]
    public int Points { get; set; }

    [GlobalSetup]
    public void Setup() => _work = Workload.Create(Points);

    [Benchmark]
    public void Build() => _work.Build(_work.OutputFolder("micro"));
}

/// <summary>
/// Not a figure: a CPU-sampling profile of the front end and the full build on a 10k site,
/// written as a speedscope file (run with --filter *Profile*). This is how the hot spots in
/// docs/performance.md were found.
/// </summary>
[ShortRunJob, EventPipeProfiler(EventPipeProfile.CpuSampling)]
public class ProfileBenchmarks
{
    private Workload _work = null!;

    [GlobalSetup]
    public void Setup() => _work = Workload.Create(10000);

    [Benchmark]
    public object ProfileCompile() => _work.Compile();

    [Benchmark]
    public void ProfileBuild() => _work.Build(_work.OutputFolder("profile"));
}
