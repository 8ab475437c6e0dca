using ScaleGen.Cli;
using ScaleGen.Emit;
using ScaleGen.Model;
using ScaleGen.Samples;
using ScaleGen.Syntax;
using ScaleGen.Text;

namespace ScaleGen.Bench;

/// <summary>
/// One invented site of a given size, ready to measure: its files on disk and in memory,
/// the compiled plant the emitters need, and the same points as JSON for the baseline.
/// </summary>
public sealed class Workload
{
    private Workload(int points, string folder, IReadOnlyList<SourceText> sources, Compilation compilation, string json)
    {
        Points = points;
        Folder = folder;
        Sources = sources;
        Compilation = compilation;
        Context = EmitContext.From(compilation);
        Json = json;
    }

    public int Points { get; }

    /// <summary>The folder holding the site's .scale files (under the system temp folder).</summary>
    public string Folder { get; }

    public IReadOnlyList<SourceText> Sources { get; }

    public string[] Files => Sources.Select(s => s.Path).ToArray();

    public Compilation Compilation { get; }

    public EmitContext Context { get; }

    public string Json { get; }

    public long ScaleBytes => Sources.Sum(s => (long)System.Text.Encoding.UTF8.GetByteCount(s.Text));

    public long JsonBytes => System.Text.Encoding.UTF8.GetByteCount(Json);

    public static Workload Create(int points, int seed = 1)
    {
        var folder = Path.Combine(Path.GetTempPath(), $"scalegen-bench-{points}-{seed}");
        Directory.CreateDirectory(folder);
        var sources = new List<SourceText>();
        foreach (var file in PlantGenerator.Site(points, seed))
        {
            var path = Path.Combine(folder, file.Name);
            if (!File.Exists(path) || File.ReadAllText(path) != file.Text) File.WriteAllText(path, file.Text);
            sources.Add(new SourceText(path, file.Text));
        }
        var compilation = Compilation.Compile(sources);
        if (compilation.HasErrors)
            throw new InvalidOperationException("the generated site has errors: " + string.Join("\n", compilation.Diagnostics.Where(d => d.IsError).Take(5)));
        if (compilation.Plant.Points.Length != points)
            throw new InvalidOperationException($"the generated site bound {compilation.Plant.Points.Length} of {points} points");
        return new Workload(points, folder, sources, compilation, JsonBaseline.Write(compilation.Plant));
    }

    // ---- What is measured ---------------------------------------------------------------

    public object ReadJson() => JsonBaseline.Read(Json);

    /// <summary>Parse every file and bind the plant: the front end without the engine's analysis.</summary>
    public object ParseAndBind()
    {
        var diagnostics = new DiagnosticBag();
        var units = SyntaxParser.ParseAll(Sources, diagnostics);
        return Binder.Bind(units, diagnostics);
    }

    /// <summary>The whole front end: parse, bind, the engine's checks, diagnostics sorted.</summary>
    public object Compile() => Compilation.Compile(Sources);

    public long Emit(IOutputEmitter emitter)
    {
        long characters = 0;
        foreach (var file in emitter.Emit(Context)) characters += file.Content.Length;
        return characters;
    }

    /// <summary>`scalegen build FILES -o DIR`, in this process, files read from disk and written all or nothing.</summary>
    public void Build(string output)
    {
        var exit = ScaleGenCli.Run(["build", .. Files, "-o", output], TextWriter.Null, TextWriter.Null);
        if (exit != ExitCodes.Ok) throw new InvalidOperationException($"build exited with {exit}");
    }

    public string OutputFolder(string name) => Path.Combine(Folder, "out-" + name);
}
