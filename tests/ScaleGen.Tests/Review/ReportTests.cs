using ApprovalTests;
using ApprovalTests.Reporters;
using ScaleGen.Emit;
using ScaleGen.Emit.Report;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Review;

/// <summary>The review report: the data behind it (snapshot), its check values, and the page.</summary>
[UseReporter(typeof(QuietReporter))]
public class ReportTests
{
    /// <summary>The diff test plant plus a point that draws warnings: a setpoint outside the range and a failing loop.</summary>
    private const string ExtraPoint = """

        point LT-5 {
          desc "Tank <level> & \"overfill\" alarm"
          card AI16 at "R1.S2.C0"
          range 0 .. 4 m
          health ne43
          on-fault high
          measure level
          alarm HH 4.2 deadband 0.2 m priority 1
          alarm L 0.5 deadband 0.2 m priority 2
          loop {
            supply 16 V
            device 12 V
            cable 500 m 0.5 mm2
          }
        }
        """;

    private static Compilation CompileTestPlant()
    {
        var compilation = TestInputs.Compile(DiffTests.BasePlant + ExtraPoint, "report-test.scale");
        Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics));
        return compilation;
    }

    /// <summary>A fixed tool version, so the snapshot does not change with every release.</summary>
    private static EmitContext Context(Compilation compilation) => new(compilation.Plant, compilation.Diagnostics, "0.0.0-test");

    private static ReportData Data() => ReportBuilder.Build(Context(CompileTestPlant()));

    [Fact]
    public void Report_data_snapshot() => Approvals.Verify(ReportJson.Write(Data()));

    [Fact]
    public void Report_data_does_not_depend_on_the_culture()
    {
        var invariant = ReportJson.Write(Data());
        Assert.Equal(invariant, TestInputs.UnderCulture("de-DE", () => ReportJson.Write(Data())));
        Assert.Equal(invariant, TestInputs.UnderCulture("sv-SE", () => ReportJson.Write(Data())));
    }

    [Fact]
    public void Square_root_curve_follows_iso_5167()
    {
        var point = Data().Points.Single(p => p.Tag == "FT-3");
        var rising = point.Curve.Pieces[1];
        // Q / Q_max = sqrt(dP / dP_max): 8 mA (25 % DP) -> 50 % flow, 20 mA -> 100 % (ISO 5167-1)
        var at8 = Assert.Single(rising, c => Math.Abs(c.Ma - 8) < 1e-9);
        Assert.Equal(50.0, at8.Value, 9);
        var at20 = Assert.Single(rising, c => Math.Abs(c.Ma - 20) < 1e-9);
        Assert.Equal(100.0, at20.Value, 9);
        Assert.All(rising, c => Assert.Equal(Math.Sqrt((c.Ma - 4) / 16) * 100, c.Value, 9));
        // below the 3 % cutoff the value is LRV; the cutoff is at 4 + 0.03^2 * 16 = 4.0144 mA (ISO 5167-1 and the cutoff)
        var flat = point.Curve.Pieces[0];
        Assert.All(flat, c => Assert.Equal(0.0, c.Value));
        Assert.Equal(4.0144, flat[^1].Ma, 9);
    }

    [Fact]
    public void Bands_are_the_ne43_bands()
    {
        var bands = Data().Points.Single(p => p.Tag == "FT-1").Bands;
        // failure at <= 3.6 mA and >= 21.0 mA (NAMUR NE 43); under and over outside 4..20 mA (IEC 60381-1)
        Assert.Equal(
            new[] { ("FAULT_LOW", 3.0, 3.6), ("UNDER", 3.6, 4.0), ("OK", 4.0, 20.0), ("OVER", 20.0, 21.0), ("FAULT_HIGH", 21.0, 22.0) },
            bands.Select(b => (b.Status, b.FromMa, b.ToMa)));
    }

    [Fact]
    public void A_card_that_stops_short_shows_card_fault()
    {
        // -250 .. 4250 counts on a 0..4000 = 1..5 V card is 0.75 .. 5.25 V, through 250 ohm 3 .. 21 mA (common practice: Ohm's law)
        var text = (DiffTests.BasePlant + ExtraPoint).Replace("limits -500 .. 4500", "limits -250 .. 4250");
        var compilation = TestInputs.Compile(text, "report-test.scale");
        var bands = ReportBuilder.Build(Context(compilation)).Points.Single(p => p.Tag == "PT-4").Bands;
        Assert.Equal(
            new[] { ("FAULT_LOW", 3.0, 3.6), ("UNDER", 3.6, 4.0), ("OK", 4.0, 20.0), ("OVER", 20.0, 21.0), ("CARD_FAULT", 21.0, 22.0) },
            bands.Select(b => (b.Status, Math.Round(b.FromMa, 9), Math.Round(b.ToMa, 9))));
    }

    [Fact]
    public void Loop_bars_add_up_to_what_the_loop_needs()
    {
        var loops = Data().Loops;
        var ft1 = loops.Loops.Single(l => l.Tag == "FT-1");
        // 250 ohm at 20 mA drops 5 V (common practice: Ohm's law)
        Assert.Equal(5.0, ft1.Needs.Single(n => n.Part == "card input").Volts, 9);
        Assert.Equal(10.5, ft1.Needs.Single(n => n.Part == "device").Volts);
        Assert.All(loops.Loops, l => Assert.Equal(l.MinSupplyVolts, l.Needs.Sum(n => n.Volts), 9));
        var failing = loops.Loops.Single(l => l.Tag == "LT-5");
        Assert.False(failing.Ok);
        Assert.Equal(30.0, loops.ScaleVolts);
    }

    [Fact]
    public void Priority_spread_is_against_80_15_5()
    {
        var spread = Data().Priorities;
        // FT-1 HH and LT-5 HH at 1, LT-5 L at 2, FT-1 H and L and PT-2 H at the default 3
        Assert.Equal(new[] { 2, 1, 3, 0 }, spread.ByPriority.Select(p => p.Alarms));
        // about 80 % low, 15 % medium, 5 % high (ISA-18.2 / EEMUA 191, from memory)
        Assert.Equal(new[] { ("high", 5.0), ("medium", 15.0), ("low", 80.0) }, spread.Shares.Select(s => (s.Level, s.UsualPercent)));
        Assert.Equal(100.0, spread.Shares.Sum(s => s.Percent), 9);
        Assert.Equal(100.0 * 2 / 6, spread.Shares.Single(s => s.Level == "high").Percent, 9);
    }

    [Fact]
    public void The_example_plant_has_the_spread_its_readme_states()
    {
        var spread = ReportBuilder.Build(EmitContext.From(TestInputs.CompileExample())).Priorities;
        // examples/README.md: 45 at priority 3, 9 at priority 2, 3 at priority 1
        Assert.Equal(new[] { 3, 9, 45, 0 }, spread.ByPriority.Select(p => p.Alarms));
    }

    private static string Html() => new ReportEmitter().Emit(Context(CompileTestPlant())).Single().Content;

    [Fact]
    public void The_emitter_is_in_the_catalog_as_report()
    {
        var emitter = OutputCatalog.Find("report");
        Assert.IsType<ReportEmitter>(emitter);
        var file = Assert.Single(emitter!.Emit(Context(CompileTestPlant())));
        Assert.Equal("report.html", file.RelativePath);
        Assert.StartsWith("<!DOCTYPE html>\n<!--\n  Review report for Diff test plant\n  Generated by scalegen 0.0.0-test. Do not edit", file.Content);
        Assert.Contains("  Source report-test.scale sha256 ", file.Content);
    }

    [Fact]
    public void The_page_is_self_contained()
    {
        var html = Html();
        Assert.DoesNotContain("<script", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<link", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<img", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("src=", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("url(", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("@import", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("http", html, StringComparison.OrdinalIgnoreCase);
    }

    [Fact]
    public void The_page_shows_every_point_diagnostic_and_caution()
    {
        var html = Html();
        var compilation = CompileTestPlant();
        foreach (var point in compilation.Plant.Points)
        {
            Assert.Contains($"<section class=\"point\" id=\"pt-{point.Tag}\">", html);
            Assert.Contains($"aria-label=\"transfer curve of {point.Tag}\"", html);
        }
        Assert.Equal(compilation.Plant.Points.Length, CountOf(html, "<polyline class=\"transfer\"") - 1); // FT-3 is drawn in two pieces
        Assert.NotEmpty(compilation.Diagnostics);
        foreach (var diagnostic in compilation.Diagnostics)
            Assert.Contains(System.Net.WebUtility.HtmlEncode(diagnostic.Message), html);
        Assert.Contains("It is not a safety function", html);
        Assert.Contains("local codes and licensed practice", html);
        // text from the file is escaped, never markup
        Assert.Contains("Tank &lt;level&gt; &amp; &quot;overfill&quot; alarm", html);
        Assert.DoesNotContain("<level>", html);
    }

    [Fact]
    public void The_page_prints_on_a4_without_splitting_a_point()
    {
        var html = Html();
        Assert.Contains("@media print", html);
        Assert.Contains("@page { size: A4;", html);
        Assert.Contains(".point { border: 1px solid var(--rule); border-radius: 6px; padding: 10px 14px 12px; margin: 14px 0; break-inside: avoid; page-break-inside: avoid; }", html);
        Assert.Contains("print-color-adjust: exact", html);
    }

    [Fact]
    public void The_page_is_balanced_markup()
    {
        var html = Html();
        foreach (var element in new[] { "section", "svg", "table", "tbody", "thead", "tr", "g", "div", "aside", "header", "nav", "ul" })
            Assert.True(CountOf(html, $"<{element}>") + CountOf(html, $"<{element} ") == CountOf(html, $"</{element}>"), $"<{element}> is not balanced");
    }

    [Fact]
    public void Shared_chart_parts_are_defined_before_they_are_used()
    {
        var html = Html();
        var uses = System.Text.RegularExpressions.Regex.Matches(html, "<use href=\"#([^\"]+)\"/>");
        // every chart places the frame and a current axis
        Assert.Equal(2 * CompileTestPlant().Plant.Points.Length, uses.Count);
        foreach (System.Text.RegularExpressions.Match use in uses)
        {
            var definition = html.IndexOf($" id=\"{use.Groups[1].Value}\"", StringComparison.Ordinal);
            Assert.True(definition >= 0 && definition < use.Index, $"#{use.Groups[1].Value} is not defined before it is used");
        }
    }

    [Fact]
    public void The_page_is_deterministic_and_culture_invariant()
    {
        var html = Html();
        Assert.Equal(html, Html());
        Assert.Equal(html, TestInputs.UnderCulture("de-DE", Html));
        // a culture whose minus sign is not '-' (U+2212): card limits and raw counts are negative
        Assert.Equal(html, TestInputs.UnderCulture("sv-SE", Html));
    }

    [Theory]
    [InlineData(0, 100, new[] { 0.0, 20, 40, 60, 80, 100 })]
    [InlineData(-6.25, 112.5, new[] { -20.0, 0, 20, 40, 60, 80, 100, 120 })]
    [InlineData(-37.5, 675, new[] { -100.0, 0, 100, 200, 300, 400, 500, 600, 700 })]
    [InlineData(0.5, 5.5, new[] { 0.0, 1, 2, 3, 4, 5, 6 })]
    public void Chart_ticks_are_round_and_cover_the_values(double min, double max, double[] expected) =>
        Assert.Equal(expected, ReportHtml.NiceTicks(min, max));

    private static int CountOf(string text, string part)
    {
        var count = 0;
        for (var at = text.IndexOf(part, StringComparison.Ordinal); at >= 0; at = text.IndexOf(part, at + part.Length, StringComparison.Ordinal)) count++;
        return count;
    }
}
