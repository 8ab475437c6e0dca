using ApprovalTests;
using ApprovalTests.Reporters;
using Newtonsoft.Json.Linq;
using ScaleGen.Emit;
using ScaleGen.Engine;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Field;

[UseReporter(typeof(QuietReporter))]
public class SheetsOutputTests
{
    private static string[] Sheets(params string[] options) => ["sheets", .. TestInputs.ExampleFiles, .. options];

    private static IReadOnlyDictionary<string, string> EmitExample() =>
        OutputCatalog.Find("sheets")!.Emit(EmitContext.From(TestInputs.CompileExample()))
            .ToDictionary(f => f.RelativePath, f => f.Content);

    [Fact]
    public void Example_sheets_csv_snapshot()
    {
        // Without the generated header: its source hashes change with every edit of the example.
        var sheets = CheckSheets.For(TestInputs.CompileExample().Plant);
        Approvals.Verify(SheetsReport.Csv(sheets, []));
    }

    [Fact]
    public void Sheets_json_follows_the_contract_and_the_schema()
    {
        var result = TestInputs.RunCli(Sheets("--json"));
        Assert.Equal(0, result.ExitCode);
        FieldSchemas.AssertSheets(result.Out);
        var json = JObject.Parse(result.Out);
        var points = (JArray)json["points"]!;
        Assert.Equal(TestInputs.CompileExample().Plant.Points.Length, points.Count);
        var flow = (JObject)points.Single(p => (string)p["point"]! == "FIT-101")!;
        Assert.Equal("m3/h", (string)flow["unit"]!);
        Assert.Equal([0.0, 25, 50, 75, 100], flow["steps"]!.Select(s => (double)s["percent"]!));
        // 900 m3/h span: 0, 50, 70.711, 86.603, 100 % of flow.
        Assert.Equal([0.0, 450, 636.396, 779.423, 900], flow["steps"]!.Select(s => Math.Round((double)s["value"]!, 3))); // ISO 5167-1
        var h = flow["trips"]!.Single(t => (string)t["alarm"]! == "H");
        Assert.Equal(850.0, (double)h["setpoint"]!);
        Assert.True((double)h["reset_ma"]! < (double)h["trip_ma"]!);
        FieldSchemas.AssertSheets(EmitExample()[SheetsEmitter.JsonFile]);
    }

    [Fact]
    public void The_file_json_and_the_printed_json_list_the_same_points()
    {
        var printed = JObject.Parse(TestInputs.RunCli(Sheets("--json")).Out);
        var file = JObject.Parse(EmitExample()[SheetsEmitter.JsonFile]);
        Assert.True(JToken.DeepEquals(printed["points"], file["points"]));
        Assert.NotNull(file["generated"]);
    }

    [Fact]
    public void Output_dir_gets_csv_html_and_json_written_atomically()
    {
        var folder = Path.Combine(Directory.CreateTempSubdirectory("scalegen-sheets-").FullName, "new", "sheets");
        var result = TestInputs.RunCli(Sheets("-o", folder));
        Assert.Equal(0, result.ExitCode);
        Assert.Equal("", result.Out);
        var expected = EmitExample();
        Assert.Equal(expected.Keys.Order(StringComparer.Ordinal), Directory.GetFiles(folder).Select(Path.GetFileName).Order(StringComparer.Ordinal));
        foreach (var (name, content) in expected)
            Assert.Equal(content, File.ReadAllText(Path.Combine(folder, name)));
        Assert.Contains("wrote ", result.Error);
    }

    [Fact]
    public void An_unwritable_output_folder_exits_2_without_a_stack_trace()
    {
        var file = Path.Combine(Directory.CreateTempSubdirectory("scalegen-sheets-").FullName, "a-file");
        File.WriteAllText(file, "");
        var result = TestInputs.RunCli(Sheets("-o", Path.Combine(file, "sub")));
        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("scalegen: cannot write", result.Error);
        Assert.DoesNotContain("   at ", result.Error);
    }

    [Fact]
    public void Text_summary_for_the_terminal()
    {
        var result = TestInputs.RunCli(Sheets());
        Assert.Equal(0, result.ExitCode);
        Assert.StartsWith("CAUTION: Injecting currents into a live loop is energised work", result.Out);
        Assert.Contains("\nLT-101  Reservoir level at intake tower\n", result.Out);
        Assert.Contains("FAULT_HIGH", result.Out);
        Assert.Contains("H trip", result.Out);
        Assert.Contains("27 points: 135 steps", result.Out);
    }

    [Fact]
    public void Csv_has_blank_as_found_and_as_left_and_a_sign_off_per_point()
    {
        var csv = EmitExample()[SheetsEmitter.CsvFile];
        var lines = csv.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.StartsWith("# Commissioning check sheets", lines[0]);
        Assert.Contains(lines, l => l.StartsWith("# CAUTION: Injecting currents", StringComparison.Ordinal));
        var header = lines.First(l => !l.StartsWith('#'));
        Assert.Equal("point,description,address,test,percent,ma,volts,raw,expected_value,unit,tolerance,expected_status,as_found,as_left,notes", header);
        Assert.Equal(27, lines.Count(l => l.Contains(",sign-off,", StringComparison.Ordinal)));
        Assert.Contains("LT-101,Reservoir level at intake tower,R2.S3.C0,step,50,12.000,3.000,13824,7.5,m,0.075,OK,,,", lines); // common practice: 12 mA x 250 ohm = 3 V
    }

    [Fact]
    public void Html_is_self_contained_printable_and_carries_the_cautions()
    {
        var html = EmitExample()[SheetsEmitter.HtmlFile];
        Assert.StartsWith("<!DOCTYPE html>\n<!--\n  Commissioning check sheets\n", html);
        Assert.Contains("@page { size: A4 portrait;", html);
        Assert.Contains("break-inside: avoid", html);
        Assert.Contains("<div class=\"caution\"><strong>CAUTION</strong>", html);
        Assert.Contains("energised work", html);
        Assert.Contains("intrinsic-safety entity check", html);
        Assert.DoesNotContain("http", html);
        Assert.DoesNotContain("<script", html);
        Assert.DoesNotContain("<link", html);
        Assert.DoesNotContain("<img", html);
        var plant = TestInputs.CompileExample().Plant;
        Assert.Equal(plant.Points.Length, CountOf(html, "<section class=\"point\">"));
        Assert.Equal(plant.Points.Length, CountOf(html, "<div class=\"signoff\"><span>Technician</span><span>Date</span><span>Witness</span></div>"));
        Assert.Equal(CountOf(html, "<section"), CountOf(html, "</section>"));
        Assert.Equal(CountOf(html, "<table"), CountOf(html, "</table>"));
        Assert.Equal(CountOf(html, "<tr>"), CountOf(html, "</tr>"));
    }

    [Fact]
    public void Html_escapes_what_the_source_says()
    {
        var compilation = FieldPlants.Compile("""
            point PT-1 {
              desc "Pump <b>\"A\"</b> & seal"
              card AI16 at "R1 <S2>"
              range 0 .. 10 "kg/m<sup>3</sup>"
            }
            """);
        var html = new SheetsEmitter().Emit(EmitContext.From(compilation)).Single(f => f.RelativePath == SheetsEmitter.HtmlFile).Content;
        Assert.Contains("Pump &lt;b&gt;&quot;A&quot;&lt;/b&gt; &amp; seal", html);
        Assert.Contains("R1 &lt;S2&gt;", html);
        Assert.DoesNotContain("<sup>", html);
        Assert.DoesNotContain("<b>", html);
    }

    [Fact]
    public void Every_output_is_the_same_under_de_DE()
    {
        var invariant = EmitExample();
        var german = TestInputs.UnderCulture("de-DE", EmitExample);
        Assert.Equal(invariant.Keys, german.Keys);
        foreach (var key in invariant.Keys) Assert.Equal(invariant[key], german[key]);
        Assert.Equal(TestInputs.RunCli(Sheets()).Out, TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli(Sheets()).Out));
        Assert.Equal(TestInputs.RunCli(Sheets("--json")).Out, TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli(Sheets("--json")).Out));
    }

    [Fact]
    public void Both_field_outputs_are_in_the_catalog()
    {
        Assert.IsType<SheetsEmitter>(OutputCatalog.Find("sheets"));
        Assert.IsType<LoopEmitter>(OutputCatalog.Find("loop"));
        Assert.Equal([SheetsEmitter.CsvFile, SheetsEmitter.HtmlFile, SheetsEmitter.JsonFile], EmitExample().Keys);
    }

    private static int CountOf(string text, string part)
    {
        var count = 0;
        for (var i = text.IndexOf(part, StringComparison.Ordinal); i >= 0; i = text.IndexOf(part, i + part.Length, StringComparison.Ordinal)) count++;
        return count;
    }
}
