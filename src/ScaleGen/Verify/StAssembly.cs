using System.Collections.Immutable;
using System.Reflection;
using System.Runtime.Loader;
using Microsoft.CodeAnalysis;
using Microsoft.CodeAnalysis.CSharp;
using ScaleGen.Verify.Runtime;

namespace ScaleGen.Verify;

/// <summary>
/// C# compiled in memory with Roslyn and loaded into a collectible load context, which
/// <see cref="Dispose"/> unloads: a verify run leaves nothing behind on disk or in memory.
/// </summary>
internal sealed class StAssembly : IDisposable
{
    private static readonly Lazy<ImmutableArray<MetadataReference>> References = new(LoadReferences);

    private readonly AssemblyLoadContext _context;

    private StAssembly(AssemblyLoadContext context, Assembly assembly)
    {
        _context = context;
        Assembly = assembly;
    }

    public Assembly Assembly { get; }

    /// <summary>Compiles the sources; null and the compiler's first errors when they do not compile.</summary>
    public static StAssembly? Compile(IReadOnlyList<string> sources, out IReadOnlyList<string> errors)
    {
        var options = new CSharpParseOptions(LanguageVersion.Latest);
        var trees = sources.Select(s => CSharpSyntaxTree.ParseText(s, options)).ToArray();
        var compilation = CSharpCompilation.Create(
            "ScaleGen.Verify.Generated",
            trees,
            References.Value,
            new CSharpCompilationOptions(
                OutputKind.DynamicallyLinkedLibrary,
                optimizationLevel: OptimizationLevel.Release,
                checkOverflow: false,
                deterministic: true,
                concurrentBuild: true));
        using var image = new MemoryStream();
        var result = compilation.Emit(image);
        if (!result.Success)
        {
            errors = result.Diagnostics.Where(d => d.Severity == DiagnosticSeverity.Error).Take(5).Select(d => d.ToString()).ToList();
            return null;
        }
        errors = [];
        image.Position = 0;
        var context = new AssemblyLoadContext("scalegen-verify", isCollectible: true);
        return new StAssembly(context, context.LoadFromStream(image));
    }

    public void Dispose() => _context.Unload();

    /// <summary>
    /// The core library, System.Runtime (the reference facade the runtime types are
    /// forwarded through) and ScaleGen itself, for <see cref="StClock"/> and friends.
    /// </summary>
    private static ImmutableArray<MetadataReference> LoadReferences()
    {
        var paths = new List<string>();
        var trusted = (AppContext.GetData("TRUSTED_PLATFORM_ASSEMBLIES") as string ?? "").Split(Path.PathSeparator);
        foreach (var name in new[] { "System.Private.CoreLib.dll", "System.Runtime.dll" })
        {
            var path = trusted.FirstOrDefault(p => string.Equals(Path.GetFileName(p), name, StringComparison.OrdinalIgnoreCase));
            if (path is not null) paths.Add(path);
        }
        if (!paths.Any(p => p.EndsWith("System.Private.CoreLib.dll", StringComparison.OrdinalIgnoreCase)) && typeof(object).Assembly.Location is { Length: > 0 } core)
            paths.Add(core);
        var self = typeof(StClock).Assembly.Location;
        if (string.IsNullOrEmpty(self))
            throw new InvalidOperationException("verify needs ScaleGen.dll on disk to compile against (a single-file build cannot run it)");
        paths.Add(self);
        return paths.Distinct(StringComparer.Ordinal).Select(p => (MetadataReference)MetadataReference.CreateFromFile(p)).ToImmutableArray();
    }
}
