using System.Collections.Immutable;
using ScaleGen.Emit;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Model;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit.StructuredText;

public class StInjectionTests
{
    /// <summary>Everything that could close or open a comment or string, or start a line, in one text.</summary>
    private const string Hostile =
        "end *) PROGRAM Evil (* again (*) *)) ((* 'single' \"double\" $ $$ $' $N $L $0A \\n \\r\\n " +
        "new\nline\r\nCR\rtab\tnul\0bell\u0007 del\u007F nel\u0085 ls\u2028 ps\u2029 bidi\u202E rlo " +
        "lone\uD800surrogate emoji\U0001F600 degree\u00B0 END_PROGRAM";

    private const string Plain = "plain text";

    private static Compilation CompileHostileSource() => TestInputs.Compile(TestInputs.StandardCard + """

        plant "Title *) (* 'x' $N"
        card AV {
          counts 0 .. 4000 at 1 .. 5 V
          limits 0 .. 4500
          fault-code 100, 4400
          type UINT
        }
        point FT-1 {
          desc "Flow *) (* evil 'quote' \"dq\" $ $' $N \\ end"
          card AI16 at "R1 *) (*S2'$"
          range 0 .. 100 "m3/h *) (*"
          sqrt cutoff 2 %
          health ne43
          filter 2 s
          alarm HH 95 text "HH *)(* '$' $N"
          alarm H 90 deadband 2 % delay 3 s clear 1 s text "*)"
          alarm L 10 text "(*"
          alarm LL 5 text "'"
        }
        point PT-2 {
          desc "(*)"
          card AV at "*)"
          shunt 250 ohm
          range 10 .. 0 bar
          on-fault value 3.5
          alarm H 8
        }
        """);

    private static Plant WithTexts(Plant plant, string text) => plant with
    {
        Title = text,
        Points = plant.Points.Select(p => p with
        {
            Description = text,
            Address = text,
            Unit = text,
            Alarms = p.Alarms.Select(a => a with { Message = text }).ToImmutableArray(),
        }).ToImmutableArray(),
    };

    private static IReadOnlyList<GeneratedFile> Emit(Plant plant, IReadOnlyList<ScaleGen.Text.Diagnostic> diagnostics) =>
        new StructuredTextEmitter().Emit(new EmitContext(plant, diagnostics, "test")).ToArray();

    [Fact]
    public void Hostile_texts_from_source_keep_comments_and_strings_closed()
    {
        var compilation = CompileHostileSource();
        Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics));
        foreach (var file in Emit(compilation.Plant, compilation.Diagnostics))
        {
            var result = StTextChecker.Analyse(file.Content);
            Assert.Empty(result.Problems);
        }
    }

    [Fact]
    public void Hostile_texts_change_only_comments_and_strings_never_the_code()
    {
        var compilation = CompileHostileSource();
        var hostile = Emit(WithTexts(compilation.Plant, Hostile), compilation.Diagnostics);
        var plain = Emit(WithTexts(compilation.Plant, Plain), compilation.Diagnostics);
        foreach (var (evil, benign) in hostile.Zip(plain))
        {
            var evilScan = StTextChecker.Analyse(evil.Content);
            var benignScan = StTextChecker.Analyse(benign.Content);
            Assert.Empty(evilScan.Problems);
            Assert.Empty(benignScan.Problems);
            // The code skeleton (everything outside comments and strings) is the same: no text escaped.
            Assert.Equal(benignScan.Code, evilScan.Code);
            Assert.Equal(benignScan.Strings.Count, evilScan.Strings.Count);
        }
    }

    [Fact]
    public void Hostile_source_file_names_in_the_header_stay_inside_the_comment()
    {
        var compilation = Compilation.Compile(new ScaleGen.Text.SourceText("a *) (* b\n.scale", TestInputs.StandardCard));
        foreach (var file in Emit(compilation.Plant, compilation.Diagnostics))
            Assert.Empty(StTextChecker.Analyse(file.Content).Problems);
    }

    [Theory]
    [InlineData("*)", "* )")]
    [InlineData("(*", "( *")]
    [InlineData("(*)", "( * )")]
    [InlineData("**))", "** ))")]
    [InlineData("((**", "(( **")]
    [InlineData("a\nb\r\nc", "a b  c")]
    [InlineData("tab\there", "tab here")]
    [InlineData("x\u202Ey", "x y")]
    [InlineData("m3/h 'q' \"d\" $N", "m3/h 'q' \"d\" $N")]
    [InlineData("23 \u00B0C", "23 \u00B0C")]
    public void Comment_text_is_neutralised(string text, string expected) =>
        Assert.Equal(expected, StSanitizer.Comment(text));

    [Theory]
    [InlineData("plain", "'plain'")]
    [InlineData("it's", "'it$'s'")]
    [InlineData("$5 $N", "'$$5 $$N'")]
    [InlineData("say \"hi\"", "'say \"hi\"'")]
    [InlineData("a\nb", "'a b'")]
    [InlineData("23 \u00B0C", "'23 $B0C'")]
    [InlineData("\u20AC", "'?'")]
    [InlineData("\U0001F600!", "'?!'")]
    [InlineData("*) (*", "'*) (*'")]
    public void String_literals_escape_quote_dollar_and_controls(string text, string expected) =>
        Assert.Equal(expected, StSanitizer.StringLiteral(text, 80));

    [Fact]
    public void String_literals_are_cut_to_the_declared_length_counting_escapes_as_one()
    {
        Assert.Equal("'abc'", StSanitizer.StringLiteral("abcdef", 3));
        Assert.Equal("'$'$$'", StSanitizer.StringLiteral("'$x", 2));
        var literal = StSanitizer.StringLiteral(new string('\'', 100), 80);
        Assert.Equal(2 + 80 * 2, literal.Length);
    }
}
