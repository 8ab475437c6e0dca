using CsCheck;
using ScaleGen.Samples;
using ScaleGen.Syntax;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Syntax;

/// <summary>
/// The parser reads well-formed statements with a direct reader and leaves everything else
/// to the Sprache grammar. The grammar is the definition: on every input the two must give
/// the same syntax tree and the same diagnostics.
/// </summary>
public class DirectReaderTests
{
    private static void SameAsGrammar(string text)
    {
        var source = new SourceText("test.scale", text);
        var directBag = new DiagnosticBag();
        var grammarBag = new DiagnosticBag();
        var direct = SyntaxParser.Parse(source, directBag, direct: true);
        var grammar = SyntaxParser.Parse(source, grammarBag, direct: false);

        // The comparer ignores spans; the diagnostics below carry positions and must match too.
        if (!grammarBag.HasErrors) Assert.Equal(Formatter.Format(grammar), Formatter.Format(direct));
        var difference = StructuralComparer.FirstDifference(grammar.Statements, direct.Statements);
        Assert.True(difference is null, difference);
        Assert.Equal(grammarBag.Select(d => d.ToString()), directBag.Select(d => d.ToString()));
    }

    [Fact]
    public void Random_valid_plants_read_the_same_both_ways() =>
        PlantGenerator.Text.Sample(SameAsGrammar, iter: 100);

    [Fact]
    public void The_example_files_read_the_same_both_ways()
    {
        foreach (var path in TestInputs.ExampleFiles) SameAsGrammar(File.ReadAllText(path));
    }

    [Theory]
    [InlineData("point FT-1 {\n  range 0 .. 1,5 bar\n}\n")]
    [InlineData("point FT-1 {\n  range NaN .. 4 m\n  alarm HH 5 prio 3\n}\n")]
    [InlineData("point FT-1 {\n  signal 4..20mA\n  range -1e3 .. 2.5E2 \"deg C\"\n  sqrt cutoff 1%\n}\n")]
    [InlineData("card A { counts 0 .. 27648 at 4 .. 20 mA; fault-code 32767 , 32766 }\n")]
    public void Odd_and_broken_statements_read_the_same_both_ways(string text) => SameAsGrammar(text);
}
