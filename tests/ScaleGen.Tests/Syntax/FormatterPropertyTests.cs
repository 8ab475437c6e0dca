using CsCheck;
using ScaleGen.Samples;
using ScaleGen.Syntax;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Syntax;

/// <summary>
/// Properties of the parser and the formatter over random valid plants
/// (<see cref="PlantGenerator"/>) and over every example file: the text compiles with no
/// errors, formatting changes no meaning, and formatting twice changes nothing more.
/// </summary>
public class FormatterPropertyTests
{
    // Each plant costs two compilations and two formats (about 20 ms); 200 plants reach every
    // branch of the generator many times while the whole suite stays within its time budget.
    private const int Iterations = 200;

    private static CompilationUnitSyntax Parse(string text, string path = "test.scale")
    {
        var diagnostics = new DiagnosticBag();
        var unit = SyntaxParser.Parse(new SourceText(path, text), diagnostics);
        Assert.False(diagnostics.HasErrors, $"syntax errors:\n{string.Join("\n", diagnostics)}\n--- in ---\n{text}");
        return unit;
    }

    private static string Fmt(string text) => Formatter.Format(Parse(text));

    /// <summary>
    /// The three properties on one random plant x: (a) x compiles with no errors; (b) fmt(x)
    /// parses to the same tree as x apart from layout, and binds to the same model, with the
    /// same warnings; (c) fmt(fmt(x)) == fmt(x). One pass shares the work between them.
    /// </summary>
    private static void CheckPlant(string text)
    {
        // (a)
        var original = TestInputs.Compile(text);
        Assert.False(original.HasErrors, $"(a) errors in a valid plant:\n{string.Join("\n", original.Diagnostics.Where(d => d.IsError))}\n--- in ---\n{text}");
        Assert.NotEmpty(original.Plant.Points);

        // (b)
        var formatted = Formatter.Format(original.Units[0]);
        var reparsed = TestInputs.Compile(formatted);
        Assert.False(reparsed.HasErrors, $"(b) errors after fmt:\n{string.Join("\n", reparsed.Diagnostics)}\n--- formatted ---\n{formatted}");
        var treeDifference = StructuralComparer.FirstDifference(original.Units[0], reparsed.Units[0]);
        Assert.True(treeDifference is null, $"(b) tree: {treeDifference}\n--- original ---\n{text}\n--- formatted ---\n{formatted}");
        var modelDifference = StructuralComparer.FirstDifference(original.Plant, reparsed.Plant);
        Assert.True(modelDifference is null, $"(b) model: {modelDifference}\n--- original ---\n{text}\n--- formatted ---\n{formatted}");
        Assert.Equal(original.Diagnostics.Select(d => d.Code), reparsed.Diagnostics.Select(d => d.Code));

        // (c)
        var twice = Formatter.Format(reparsed.Units[0]);
        Assert.True(formatted == twice, $"(c) not idempotent\n--- original ---\n{text}\n--- once ---\n{formatted}\n--- twice ---\n{twice}");
    }

    [Fact]
    public void Random_valid_plants_compile_clean_and_keep_their_meaning_through_fmt() =>
        PlantGenerator.Text.Sample(CheckPlant, iter: Iterations);

    public static TheoryData<string> ExampleFiles()
    {
        var data = new TheoryData<string>();
        foreach (var path in TestInputs.ExampleFiles) data.Add(Path.GetFileName(path));
        return data;
    }

    [Theory]
    [MemberData(nameof(ExampleFiles))]
    public void An_example_file_keeps_its_tree_and_formats_idempotently(string name)
    {
        var text = File.ReadAllText(Path.Combine(TestInputs.ExamplesFolder, name));
        var once = Fmt(text);
        Assert.Null(StructuralComparer.FirstDifference(Parse(text), Parse(once)));
        Assert.Equal(once, Fmt(once));
    }

    [Fact]
    public void The_examples_formatted_bind_to_the_same_plant()
    {
        var originals = TestInputs.ExampleFiles.Select(SourceText.FromFile).ToArray();
        var formatted = originals.Select(s => new SourceText(s.Path, Fmt(s.Text))).ToArray();
        var before = Compilation.Compile(originals);
        var after = Compilation.Compile(formatted);
        Assert.Null(StructuralComparer.FirstDifference(before.Plant, after.Plant));
        Assert.NotEmpty(after.Plant.Points);
    }

    /// <summary>The comparer must see a real change, or the properties above prove nothing.</summary>
    [Fact]
    public void The_structural_comparer_sees_a_changed_value_but_not_a_moved_one()
    {
        const string point = "card C {\n  counts 0 .. 10 at 4 .. 20 mA\n}\npoint P-1 {\n  card C\n  range 0 .. 10 bar\n  health ne43\n}\n";
        var moved = TestInputs.Compile("\n\n" + point.Replace("  ", "\t"));
        var changed = TestInputs.Compile(point.Replace("0 .. 10 bar", "0 .. 11 bar"));
        var original = TestInputs.Compile(point);

        Assert.Null(StructuralComparer.FirstDifference(original.Plant, moved.Plant));
        Assert.Equal("Points[0].Urv: 10 vs 11", StructuralComparer.FirstDifference(original.Plant, changed.Plant));
        Assert.NotNull(StructuralComparer.FirstDifference(Parse(point), Parse(point.Replace("bar", "kPa"))));
        Assert.NotNull(StructuralComparer.FirstDifference(Parse(point), Parse(point.Replace("  range", "  # note\n  range"))));
    }
}
