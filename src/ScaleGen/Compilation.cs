using System.Collections.Immutable;
using ScaleGen.Model;
using ScaleGen.Syntax;
using ScaleGen.Text;

namespace ScaleGen;

/// <summary>
/// The front end in one call: parse every file, bind them into one plant, then run the
/// checks that need the scaling math. Everything downstream starts from a Compilation.
/// </summary>
public sealed class Compilation
{
    private Compilation(ImmutableArray<CompilationUnitSyntax> units, Plant plant, IReadOnlyList<Diagnostic> diagnostics)
    {
        Units = units;
        Plant = plant;
        Diagnostics = diagnostics;
    }

    public ImmutableArray<CompilationUnitSyntax> Units { get; }

    /// <summary>The bound plant. Points with errors are left out; use it only when <see cref="HasErrors"/> is false.</summary>
    public Plant Plant { get; }

    /// <summary>All diagnostics in file, line and column order.</summary>
    public IReadOnlyList<Diagnostic> Diagnostics { get; }

    public bool HasErrors => Diagnostics.Any(d => d.IsError);

    public static Compilation Compile(IReadOnlyList<SourceText> sources)
    {
        var diagnostics = new DiagnosticBag();
        var units = SyntaxParser.ParseAll(sources, diagnostics);
        var plant = Binder.Bind(units, diagnostics);
        Engine.PlantAnalyzer.Analyze(plant, diagnostics);
        return new Compilation(units, plant, diagnostics.ToSortedList(sources));
    }

    public static Compilation Compile(params SourceText[] sources) => Compile((IReadOnlyList<SourceText>)sources);
}
