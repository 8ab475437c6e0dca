using CsCheck;
using ScaleGen.Emit;
using ScaleGen.Samples;
using ScaleGen.Syntax;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Syntax;

/// <summary>
/// The machine's culture plays no part: compiling, <c>check --format json</c> and <c>fmt</c>
/// give the same bytes under the invariant culture, de-DE (decimal comma) and tr-TR
/// (dotted and dotless i), and tags compare by invariant rules.
/// </summary>
public class CultureTests
{
    private static readonly string[] Cultures = { "", "de-DE", "tr-TR" };

    /// <summary>Runs the action under each culture and asserts every result equals the invariant one.</summary>
    private static void SameUnderEveryCulture(Func<string> action)
    {
        var invariant = TestInputs.UnderCulture("", action);
        foreach (var culture in Cultures.Skip(1))
        {
            var result = TestInputs.UnderCulture(culture, action);
            Assert.True(invariant == result, $"output differs under {culture}:\n--- invariant ---\n{invariant}\n--- {culture} ---\n{result}");
        }
    }

    [Fact]
    public void Compiling_gives_the_same_diagnostics_and_model_under_every_culture()
    {
        var texts = new[] { BadFiles.ManyMistakes, BadFiles.LexicalTrouble, BadFiles.CardsFile + BadFiles.PointsFile };
        foreach (var text in texts)
            SameUnderEveryCulture(() => DiagnosticReport.Text(TestInputs.Compile(text).Diagnostics));

        var invariant = TestInputs.UnderCulture("", TestInputs.CompileExample);
        foreach (var culture in Cultures.Skip(1))
        {
            var compiled = TestInputs.UnderCulture(culture, TestInputs.CompileExample);
            Assert.Null(StructuralComparer.FirstDifference(invariant.Plant, compiled.Plant));
        }
    }

    [Fact]
    public void Random_plants_compile_the_same_under_every_culture()
    {
        PlantGenerator.Text.Sample(text =>
        {
            var invariant = TestInputs.UnderCulture("", () => TestInputs.Compile(text));
            foreach (var culture in Cultures.Skip(1))
            {
                var compiled = TestInputs.UnderCulture(culture, () => TestInputs.Compile(text));
                Assert.Equal(DiagnosticReport.Text(invariant.Diagnostics), DiagnosticReport.Text(compiled.Diagnostics));
                Assert.Null(StructuralComparer.FirstDifference(invariant.Plant, compiled.Plant));
                Assert.Equal(Formatter.Format(invariant.Units[0]), Formatter.Format(compiled.Units[0]));
            }
        }, iter: 25);
    }

    [Fact]
    public void Check_json_is_byte_identical_under_every_culture()
    {
        using var folder = new TempFolder();
        var bad = folder.Write("lexical.scale", BadFiles.LexicalTrouble);
        var files = TestInputs.ExampleFiles.Append(bad).ToArray();
        SameUnderEveryCulture(() =>
        {
            var result = TestInputs.RunCli(new[] { "check", "--format", "json" }.Concat(files).ToArray());
            Assert.Equal(1, result.ExitCode);
            return result.Out;
        });
        // The run printed decimals (0.05 s, 0.1 s): they stay decimal points.
        var json = TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli("check", "--format", "json", bad).Out);
        Assert.Contains("a delay of 0.05 s is shorter than the task cycle of 0.1 s", json, StringComparison.Ordinal);
    }

    [Fact]
    public void Fmt_output_is_byte_identical_under_every_culture()
    {
        using var folder = new TempFolder();
        var messy = folder.Write("messy.scale",
            "card AI16 { counts 0 .. 27648 at 4 .. 20 mA; limits -4864..32511 }\n" +
            "point LT-101 { card AI16; range 0.5..12.75 m; health below 3.6mA above 21mA; alarm H 11.5 deadband 2.5 % delay 0.5s }\n");
        var files = TestInputs.ExampleFiles.Append(messy).ToArray();
        SameUnderEveryCulture(() =>
        {
            var result = TestInputs.RunCli(new[] { "fmt" }.Concat(files).ToArray());
            Assert.Equal(0, result.ExitCode);
            return result.Out;
        });
        var formatted = TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli("fmt", messy).Out);
        Assert.Contains("  range 0.5 .. 12.75 m\n", formatted, StringComparison.Ordinal);
        Assert.Contains("  alarm H 11.5 deadband 2.5 % delay 0.5 s\n", formatted, StringComparison.Ordinal);
    }

    private static string PlantWithTags(params string[] tags) =>
        TestInputs.StandardCard + "\n" + string.Concat(tags.Select(t => $"point {t} {{\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}}\n"));

    /// <summary>The codes of the errors a plant with these tags gets, the same under every culture.</summary>
    private static string ErrorsFor(params string[] tags)
    {
        string Errors() => string.Join(" ", TestInputs.Compile(PlantWithTags(tags)).Diagnostics.Where(d => d.IsError).Select(d => d.Code));
        SameUnderEveryCulture(Errors);
        return Errors();
    }

    [Theory]
    // Plain i and I are the same letter to IEC 61131-3 (identifiers ignore case): they collide.
    [InlineData("FIT-1", "fit-1", "SG1015")]
    [InlineData("fit-1", "FIT_1", "SG1015")]
    [InlineData("LIT-1", "lit-1", "SG1015")]
    // Distinct tags stay distinct, whatever a Turkish upper-casing would make of them.
    [InlineData("FIT-1", "FIT-2", "")]
    [InlineData("fit-1", "fjt-1", "")]
    // Dotted capital I and dotless small i are not ASCII: not a tag at all, in any culture.
    [InlineData("FIT-1", "F\u0130T-1", "SG0018")]
    [InlineData("FIT-1", "f\u0131t-1", "SG0018")]
    public void Tags_with_i_collide_exactly_as_invariant_rules_say(string first, string second, string expected) =>
        Assert.Equal(expected, ErrorsFor(first, second));

    [Theory]
    // Reserved words are found without regard to case, the invariant way: 'if' is IF and
    // 'int' is INT even where upper-casing 'i' gives a dotted capital I.
    [InlineData("if")]
    [InlineData("int")]
    [InlineData("Time")]
    [InlineData("limit")]
    public void A_lower_case_reserved_word_with_i_is_reserved_under_every_culture(string tag) =>
        Assert.Equal("SG1016", ErrorsFor(tag));
}
