using System.Text;
using CsCheck;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Syntax;

/// <summary>
/// One bad input a row: the first error's code, line and column, and that compiling never
/// throws. Most rows start from <see cref="TestInputs.StandardCard"/> (lines 1-5), so a
/// point written after it starts on line 6.
/// </summary>
public class BadInputTests
{
    /// <summary>The standard card (lines 1-5) and then the given text from line 6.</summary>
    private static string WithCard(string text) => TestInputs.StandardCard + "\n" + text;

    /// <summary>A point FT-1 on line 6 whose block holds the given lines from line 7.</summary>
    private static string Point(params string[] lines) =>
        WithCard("point FT-1 {\n" + string.Concat(lines.Select(l => "  " + l + "\n")) + "}\n");

    /// <summary>A sound point's settings: card, range, fault bands.</summary>
    private static readonly string[] Sound = { "card AI16", "range 0 .. 100 m3/h", "health ne43" };

    private static string SoundPointWith(params string[] lines) => Point(Sound.Concat(lines).ToArray());

    public sealed record BadInput(string Name, string Text, string Code, int Line, int Column, string? MessagePart)
    {
        public override string ToString() => Name;
    }

    private static readonly List<BadInput> Table = new();

    private static void Add(string name, string code, int line, int column, string text, string? messagePart = null) =>
        Table.Add(new BadInput(name, text, code, line, column, messagePart));

    static BadInputTests()
    {
        // ---- Keywords and statement forms (SG0010, SG0011, SG0014-SG0016)
        Add("keyword typo", "SG0010", 8, 3, Point("card AI16", "rnage 0 .. 100 m3/h", "health ne43"), "did you mean 'range'");
        Add("top-level keyword typo", "SG0010", 6, 1, WithCard("piont FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n"), "did you mean 'point'");
        Add("range with no values", "SG0011", 8, 8, Point("card AI16", "range", "health ne43"), "incomplete");
        Add("alarm with no setpoint", "SG0011", 10, 10, SoundPointWith("alarm H"));
        Add("number starting with a point", "SG0011", 8, 9, Point("card AI16", "range .5 .. 1 bar", "health ne43"));
        Add("card keyword in a point", "SG0010", 10, 3, SoundPointWith("counts 0 .. 10 at 4 .. 20 mA"), "belongs in a card");
        Add("alarm option as a statement", "SG0010", 11, 3, SoundPointWith("alarm H 80", "deadband 2 %"), "option of an alarm");
        Add("point keyword in a card", "SG0010", 3, 3, "card AI16 {\n  counts 0 .. 27648 at 4 .. 20 mA\n  range 0 .. 1 bar\n}\n", "belongs in a point");
        Add("trailing text after a statement", "SG0014", 10, 12, SoundPointWith("desc \"x\" y"));
        Add("trailing text after a range", "SG0014", 8, 23, Point("card AI16", "range 0 .. 100 m3/h extra", "health ne43"));
        Add("uses on a card", "SG0014", 1, 11, "card AI16 uses base {\n  counts 0 .. 27648 at 4 .. 20 mA\n}\n");
        Add("point without a block", "SG0015", 6, 1, WithCard("point FT-1\n"), "needs a block");
        Add("desc with a block", "SG0016", 10, 12, SoundPointWith("desc \"x\" {", "}"), "takes no block");

        // ---- Numbers (SG0012, SG0013)
        Add("NaN", "SG0013", 8, 9, Point("card AI16", "range NaN .. 100 m3/h", "health ne43"));
        Add("Infinity", "SG0013", 8, 14, Point("card AI16", "range 0 .. Infinity m3/h", "health ne43"));
        Add("hex number", "SG0013", 4, 14, "card AI16 {\n  counts 0 .. 27648 at 4 .. 20 mA\n  limits -4864 .. 32511\n  fault-code 0x1F\n}\n", "hexadecimal");
        Add("huge exponent", "SG0013", 8, 14, Point("card AI16", "range 0 .. 1e999 bar", "health ne43"), "too large");
        Add("decimal comma", "SG0012", 8, 15, Point("card AI16", "range 0 .. 1,5 bar", "health ne43"), "write '1.5'");
        Add("decimal comma in a quantity", "SG0012", 10, 11, SoundPointWith("filter 2,5 s"), "write '2.5'");

        // ---- Units (SG1008)
        Add("bad current unit", "SG1008", 8, 18, Point("card AI16", "signal 4 .. 20 ma", "range 0 .. 1 bar", "health ne43"), "did you mean '4 .. 20 mA'");
        Add("filter in kilograms", "SG1008", 10, 12, SoundPointWith("filter 2 kg"));
        Add("cycle in milliamps", "SG1008", 1, 11, "cycle 100 mA\n" + WithCard("point FT-1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"));
        Add("card counts without a unit", "SG1008", 2, 24, "card AI16 {\n  counts 0 .. 27648 at 4 .. 20\n}\npoint FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n");

        // ---- Names and tags (SG1001, SG1015, SG1016, SG0018)
        Add("duplicate tag", "SG1001", 11, 7, SoundPointWith() + "point FT-1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n", "already declared at test.scale(6,7)");
        Add("dash and underscore collide", "SG1015", 11, 7, SoundPointWith() + "point FT_1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n", "'FT_1' and 'FT-1'");
        Add("case collision", "SG1015", 11, 7, SoundPointWith() + "point ft-1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n");
        Add("tag is the TON block", "SG1016", 6, 7, WithCard("point TON {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"));
        Add("tag is END_IF", "SG1016", 6, 7, WithCard("point END_IF {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"));
        Add("tag with a double dash", "SG0018", 6, 7, WithCard("point FT--1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"), "'FT__1'");
        Add("tag with a trailing dash", "SG0018", 6, 7, WithCard("point FT- {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"));
        Add("card name with a dash", "SG0018", 1, 6, "card AI-16 {\n  counts 0 .. 27648 at 4 .. 20 mA\n}\n", "write 'AI_16'");
        Add("duplicate card", "SG1001", 6, 6, WithCard("card AI16 {\n  counts 0 .. 10000 at 0 .. 10 V\n}\n"));

        // ---- Cards and profiles (SG1002-SG1004)
        Add("unknown card", "SG1002", 7, 8, Point("card AI61", "range 0 .. 1 bar", "health ne43"), "did you mean 'AI16'");
        Add("unknown profile", "SG1003", 9, 17, WithCard("profile flow {\n  measure flow\n}\npoint FT-1 uses flwo {\n  card AI16\n  range 0 .. 1 bar\n}\n"), "did you mean 'flow'");
        Add("profile uses itself", "SG1004", 6, 19, WithCard("profile base uses base {\n  health ne43\n}\npoint FT-1 uses base {\n  card AI16\n  range 0 .. 1 bar\n}\n"));
        Add("profiles use each other", "SG1004", 9, 16, WithCard("profile a uses b {\n  health ne43\n}\nprofile b uses a {\n  filter 1 s\n}\npoint FT-1 uses a {\n  card AI16\n  range 0 .. 1 bar\n}\n"));

        // ---- Ranges, signals, health (SG1007, SG1018, SG1020, SG1023, SG1024)
        Add("LRV equals URV", "SG1007", 8, 9, Point("card AI16", "range 5 .. 5 bar", "health ne43"), "LRV and URV are both 5");
        Add("falling signal", "SG1023", 8, 10, Point("card AI16", "signal 20 .. 4 mA", "range 0 .. 1 bar"));
        Add("ne43 on 0..20 mA", "SG1018", 10, 10, Point("card AI16", "signal 0 .. 20 mA", "range 0 .. 1 bar", "health ne43"));
        Add("custom health inside the span", "SG1024", 9, 3, Point("card AI16", "range 0 .. 1 bar", "health below 5 mA above 21 mA"));
        Add("shunt on a current card", "SG1020", 10, 3, SoundPointWith("shunt 250 ohm"), "reads current");
        Add("voltage card without a shunt", "SG1020", 4, 7,
            "card AV {\n  counts 0 .. 4000 at 1 .. 5 V\n}\npoint FT-1 {\n  card AV\n  range 0 .. 1 bar\n  health ne43\n}\n", "shunt 250 ohm");

        // ---- Card definitions (SG1009, SG1010, SG1025)
        Add("counts with equal raw values", "SG1009", 2, 10, "card AI16 {\n  counts 0 .. 0 at 4 .. 20 mA\n}\npoint FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n", "raw values");
        Add("counts with equal electrical values", "SG1009", 2, 24, "card AI16 {\n  counts 0 .. 27648 at 4 .. 4 mA\n}\npoint FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n", "electrical values");
        Add("card with no counts", "SG1010", 1, 6, "card AI16 {\n  limits 0 .. 100\n}\npoint FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n");
        Add("limits reversed", "SG1025", 3, 10, "card AI16 {\n  counts 0 .. 27648 at 4 .. 20 mA\n  limits 32511 .. -4864\n}\npoint FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n");
        Add("fault code outside INT", "SG1025", 3, 14, "card AI16 {\n  counts 0 .. 27648 at 4 .. 20 mA\n  fault-code 40000\n}\npoint FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n", "-32768 .. 32767");
        Add("raw count outside INT", "SG1025", 2, 15, "card AI16 {\n  counts 0 .. 70000 at 4 .. 20 mA\n}\npoint FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n");

        // ---- Alarms (SG1012-SG1014)
        Add("HH below H", "SG1014", 10, 12, SoundPointWith("alarm HH 70", "alarm H 80"), "HH (70) is below H (80)");
        Add("LL above L", "SG1014", 11, 12, SoundPointWith("alarm L 20", "alarm LL 30"), "LL (30) is above L (20)");
        Add("duplicate alarm kind", "SG1013", 11, 9, SoundPointWith("alarm H 80", "alarm H 90"));
        Add("priority 0", "SG1012", 10, 23, SoundPointWith("alarm H 80 priority 0"));
        Add("priority 5", "SG1012", 10, 23, SoundPointWith("alarm H 80 priority 5"));
        Add("unknown alarm kind", "SG0019", 10, 9, SoundPointWith("alarm HI 80"), "did you mean 'H'");
        Add("duplicate alarm option", "SG1019", 10, 24, SoundPointWith("alarm H 80 delay 1 s delay 2 s"));

        // ---- Strings (SG0002, SG0020)
        Add("unterminated string", "SG0002", 10, 8, SoundPointWith("desc \"Inlet flow"));
        Add("bad escape in a string", "SG0020", 10, 14, SoundPointWith("desc \"Inlet\\nflow\""), "'\\n' is not an escape");

        // ---- Braces and files (SG0001, SG0003-SG0005, SG0017)
        Add("stray close brace", "SG0003", 11, 1, SoundPointWith() + "}\n");
        Add("unclosed block", "SG0004", 6, 12, WithCard("point FT-1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n"));
        Add("block with no declaration", "SG0005", 6, 1, WithCard("{\n  card AI16\n}\n"));
        Add("empty file", "SG0017", 1, 1, "");
        Add("only comments", "SG0017", 1, 1, "# nothing here yet\n\n   # still nothing\n");
        Add("binary garbage", "SG0001", 1, 1, Encoding.UTF8.GetString(Garbage));

        // ---- Loops (SG1017, SG1026)
        Add("unknown conductor", "SG1017", 13, 17, SoundPointWith("loop {", "  supply 24 V", "  device 10.5 V", "  cable 100 m 7 mm3", "}"), "mm2");
        Add("loop without supply", "SG1026", 10, 3, SoundPointWith("loop {", "  device 10.5 V", "}"), "supply 24 V");

        // ---- Settings and top level (SG1019, SG1021, SG1022)
        Add("duplicate setting", "SG1019", 10, 3, SoundPointWith("range 0 .. 200 m3/h"), "line 8");
        Add("plant given twice", "SG1021", 2, 1, "plant \"A\"\nplant \"B\"\n" + WithCard("point FT-1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"));
        Add("cycle 0 ms", "SG1022", 1, 7, "cycle 0 ms\n" + WithCard("point FT-1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"));
        Add("negative filter", "SG1022", 10, 10, SoundPointWith("filter -1 s"));
        Add("missing range", "SG1005", 6, 7, Point("card AI16", "health ne43"));
        Add("missing card", "SG1006", 6, 7, Point("range 0 .. 1 bar", "health ne43"));

        // ---- Choices (SG0019)
        Add("unknown measure", "SG0019", 10, 11, SoundPointWith("measure flwo"), "did you mean 'flow'");
        Add("unknown raw type", "SG0019", 3, 8, "card AI16 {\n  counts 0 .. 27648 at 4 .. 20 mA\n  type REAL\n}\npoint FT-1 {\n  card AI16\n  range 0 .. 1 bar\n}\n", "INT, DINT, UINT");
        Add("unknown health", "SG0019", 9, 10, Point("card AI16", "range 0 .. 1 bar", "health ne34"), "did you mean 'ne43'");
        Add("unknown fault action", "SG0019", 10, 12, SoundPointWith("on-fault keep"));

        // ---- Positions
        Add("CRLF line ends", "SG0010", 8, 3, Point("card AI16", "rnage 0 .. 1 bar", "health ne43").Replace("\n", "\r\n"));
        Add("byte-order mark", "SG0010", 1, 1, "\uFEFFpiont FT-1 {\n}\n");
        Add("tab before a keyword", "SG0010", 7, 2, WithCard("point FT-1 {\n\trnage 0 .. 1 bar\n}\n"));
        Add("no-break space before a unit", "SG0001", 8, 15, Point("card AI16", "range 0 .. 1\u00A0bar", "health ne43"), "not a plain one");
        Add("tag with a Turkish dotted capital I", "SG0018", 6, 7, WithCard("point F\u0130T-1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"), "U+0130");
        Add("tag with a Turkish dotless i", "SG0018", 6, 7, WithCard("point f\u0131t-1 {\n  card AI16\n  range 0 .. 1 bar\n  health ne43\n}\n"), "U+0131");
        Add("loop current 0 mA", "SG1022", 13, 13, SoundPointWith("loop {", "  supply 24 V", "  device 10.5 V", "  current 0 mA", "}"));
    }

    /// <summary>Bytes no editor would write, decoded as UTF-8: NUL, invalid sequences (U+FFFD), braces, quotes.</summary>
    private static readonly byte[] Garbage =
    {
        0x00, 0xC3, 0x28, 0xFF, 0xFE, 0x7B, 0x0A, 0xE2, 0x82, 0x22, 0x7D, 0x7D, 0x0D, 0x01, 0x9F, 0x3B,
        0x23, 0x0A, 0xF0, 0x9F, 0x98, 0x80, 0x2E, 0x2E, 0x5C, 0x0A, 0x70, 0x6F, 0x69, 0x6E, 0x74, 0x00,
    };

    public static TheoryData<BadInput> Cases()
    {
        var data = new TheoryData<BadInput>();
        foreach (var row in Table) data.Add(row);
        return data;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void First_error_has_the_expected_code_and_position(BadInput row)
    {
        var compilation = TestInputs.Compile(row.Text);

        var first = compilation.Diagnostics.FirstOrDefault(d => d.IsError);
        Assert.True(first is not null, $"no error for '{row.Name}'; got: {string.Join(" | ", compilation.Diagnostics)}");
        Assert.Equal((row.Code, row.Line, row.Column), (first.Code, first.Location.Line, first.Location.Column));
        Assert.Equal("test.scale", first.Location.Path);
        if (row.MessagePart is not null) Assert.Contains(row.MessagePart, first.Message, StringComparison.Ordinal);
        Assert.True(compilation.HasErrors);
    }

    [Fact]
    public void The_table_covers_enough_distinct_inputs_and_codes()
    {
        Assert.True(Table.Count >= 45, $"only {Table.Count} rows");
        Assert.Equal(Table.Count, Table.Select(r => r.Text).Distinct(StringComparer.Ordinal).Count());
        Assert.Equal(Table.Count, Table.Select(r => r.Name).Distinct(StringComparer.Ordinal).Count());
        // Every error code of the front end is hit by at least one row. SG1011 needs the
        // scaling math: the engine's analysis reports it, and its tests cover it. The SG3xxx
        // codes belong to the I/O-list import, whose own tests cover them.
        var errorCodes = DiagnosticCatalog.All.Where(d => d.Severity == Severity.Error && !d.Code.StartsWith("SG3", StringComparison.Ordinal))
            .Select(d => d.Code)
            .Except(new[] { DiagnosticCatalog.SpanOutsideLimits.Code });
        Assert.Empty(errorCodes.Except(Table.Select(r => r.Code)));
    }

    /// <summary>
    /// A statement the parser could not read is reported once; the binder does not add
    /// "no range" or "no card" because the broken statement may have been the one.
    /// </summary>
    [Theory]
    [InlineData("keyword typo")]
    [InlineData("range with no values")]
    [InlineData("number starting with a point")]
    [InlineData("NaN")]
    [InlineData("decimal comma")]
    [InlineData("trailing text after a range")]
    [InlineData("CRLF line ends")]
    public void A_broken_statement_is_reported_once_without_follow_on_errors(string name)
    {
        var compilation = TestInputs.Compile(Table.Single(r => r.Name == name).Text);
        Assert.Single(compilation.Diagnostics);
    }

    [Fact]
    public void An_unknown_profile_hides_what_the_profile_might_have_set()
    {
        var compilation = TestInputs.Compile(WithCard("point FT-1 uses flwo {\n  range 0 .. 1 bar\n}\n"));
        var error = Assert.Single(compilation.Diagnostics, d => d.IsError);
        Assert.Equal("SG1003", error.Code);
        Assert.DoesNotContain(compilation.Diagnostics, d => d.Code is "SG1006" or "SG2008");
    }

    [Fact]
    public void A_point_with_errors_is_not_a_plant_without_points()
    {
        var withBrokenPoint = TestInputs.Compile(Point("card AI16", "range 5 .. 5 bar", "health ne43"));
        Assert.DoesNotContain(withBrokenPoint.Diagnostics, d => d.Code == "SG2013");

        var withoutPoints = TestInputs.Compile(TestInputs.StandardCard + "\n");
        Assert.Contains(withoutPoints.Diagnostics, d => d.Code == "SG2013" && !d.IsError);
    }

    [Fact]
    public void One_run_reports_every_mistake_of_a_file_in_line_order()
    {
        var compilation = TestInputs.Compile(BadFiles.ManyMistakes);

        var errors = compilation.Diagnostics.Where(d => d.IsError).Select(d => (d.Code, d.Location.Line, d.Location.Column)).ToArray();
        Assert.Equal(BadFiles.ManyMistakesErrors, errors);
        Assert.True(errors.Select(e => e.Code).Distinct().Count() >= 6);
        var positions = compilation.Diagnostics.Select(d => (d.Location.Line, d.Location.Column)).ToArray();
        Assert.Equal(positions.OrderBy(p => p.Line).ThenBy(p => p.Column), positions);
    }

    /// <summary>Random bytes decoded as UTF-8, and random soups of the language's own tokens: never an exception.</summary>
    [Fact]
    public void Random_bytes_never_throw_and_always_get_a_placed_error()
    {
        Gen.Byte.Array[0, 300].Sample(bytes =>
        {
            var text = Encoding.UTF8.GetString(bytes);
            var compilation = TestInputs.Compile(text);
            Assert.True(compilation.HasErrors, text);
            AssertPlaced(compilation, text);
        }, iter: 300);
    }

    private static readonly string[] Tokens =
    {
        "card", "point", "profile", "uses", "plant", "cycle", "counts", "at", "limits", "fault-code", "type", "input",
        "desc", "signal", "shunt", "range", "sqrt", "cutoff", "health", "ne43", "below", "above", "on-fault", "value",
        "filter", "measure", "tolerance", "alarm", "HH", "H", "L", "LL", "priority", "deadband", "delay", "clear", "text",
        "loop", "supply", "device", "cable", "barrier", "extra", "hart", "current", "{", "}", ";", "\n", "\r\n", "#",
        "\"", "\"x\"", "\\", "..", "0", "-1", "4.5", "1e9", "1e999", "NaN", "0x1F", "1,5", "mA", "V", "ohm", "s", "%",
        "m3/h", "mm2", "AWG", "FT-1", "AI16", " ", "\t", "\0", "\uFFFD", "\u00A0", "\uFEFF", "\uD83D", "FİT",
    };

    [Fact]
    public void Random_token_soup_never_throws_and_always_gets_placed_diagnostics()
    {
        Gen.Int[0, Tokens.Length - 1].Array[0, 60].Select(ix => string.Join(" ", ix.Select(i => Tokens[i])))
            .Sample(text =>
            {
                var compilation = TestInputs.Compile(text);
                foreach (var d in compilation.Diagnostics) AssertInside(d, text);
            }, iter: 400);
    }

    private static void AssertPlaced(Compilation compilation, string text)
    {
        foreach (var d in compilation.Diagnostics) AssertInside(d, text);
    }

    private static void AssertInside(Diagnostic d, string text)
    {
        var source = d.Location.Source;
        Assert.InRange(d.Location.Line, 1, source.LineCount);
        Assert.InRange(d.Location.Column, 1, text.Length + 1);
        Assert.InRange(d.Location.Span.End, 0, text.Length);
        Assert.False(string.IsNullOrWhiteSpace(d.Message));
    }
}
