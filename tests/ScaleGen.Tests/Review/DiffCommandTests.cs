using System.Text.Json;
using Json.Schema;
using Newtonsoft.Json.Linq;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Review;

/// <summary>`scalegen diff` as a user runs it: files and folders, formats, exit codes, the JSON contract.</summary>
public sealed class DiffCommandTests : IDisposable
{
    private readonly string _folder = Path.Combine(Path.GetTempPath(), "scalegen-diff-" + Guid.NewGuid().ToString("N"));

    public DiffCommandTests() => Directory.CreateDirectory(_folder);

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    private string Write(string name, string text)
    {
        var path = Path.Combine(_folder, name);
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        File.WriteAllText(path, text);
        return path;
    }

    /// <summary>Copies the demo plant into a folder, changing one text in one file.</summary>
    private string ExampleCopy(string folder, string file = "", string old = "", string @new = "")
    {
        foreach (var path in TestInputs.ExampleFiles)
        {
            var text = File.ReadAllText(path);
            if (Path.GetFileName(path) == file)
            {
                Assert.Contains(old, text);
                text = text.Replace(old, @new);
            }
            Write(Path.Combine(folder, Path.GetFileName(path)), text);
        }
        return Path.Combine(_folder, folder);
    }

    private static readonly Lazy<JsonSchema> Schema = new(() =>
        JsonSchema.FromText(File.ReadAllText(Path.Combine(TestInputs.RepositoryRoot, "schemas", "diff.schema.json"))));

    private static void AssertValid(string json)
    {
        var result = Schema.Value.Evaluate(JsonDocument.Parse(json).RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List });
        Assert.True(result.IsValid, json);
    }

    [Fact]
    public void A_file_against_itself_prints_nothing_and_exits_0()
    {
        var file = Write("plant.scale", DiffTests.BasePlant);
        var text = TestInputs.RunCli("diff", file, file, "--exit-code");
        Assert.Equal(0, text.ExitCode);
        Assert.Equal("", text.Out);
        Assert.Equal("", text.Error);

        var json = TestInputs.RunCli("diff", file, file, "--json");
        Assert.Equal(0, json.ExitCode);
        var parsed = JObject.Parse(json.Out);
        Assert.Empty((JArray)parsed["added"]!);
        Assert.Empty((JArray)parsed["removed"]!);
        Assert.Empty((JArray)parsed["changed"]!);
        AssertValid(json.Out);
    }

    [Fact]
    public void Exit_code_is_1_with_changes_only_when_asked()
    {
        var before = Write("a.scale", DiffTests.BasePlant);
        var after = Write("b.scale", DiffTests.BasePlant.Replace("alarm HH 90 ", "alarm HH 95 "));
        Assert.Equal(1, TestInputs.RunCli("diff", before, after, "--exit-code").ExitCode);
        Assert.Equal(1, TestInputs.RunCli("diff", before, after, "--exit-code", "--json").ExitCode);
        var plain = TestInputs.RunCli("diff", before, after);
        Assert.Equal(0, plain.ExitCode);
        Assert.Equal(
            "~ FT-1 HH setpoint moved from 90 to 95 m3/h: trips at 19.20 mA (raw 26266) instead of 18.40 mA (raw 24884)\n" +
            "0 points added, 0 removed, 1 changed (1 field)\n",
            plain.Out);
    }

    [Fact]
    public void Json_follows_the_contract_and_the_schema()
    {
        // One of everything: a plant setting, a point added, one removed, numbers, strings, flags and nulls.
        var changed = DiffTests.BasePlant
            .Replace("cycle 100 ms", "cycle 200 ms")
            .Replace("point PT-2 {", "point PT-9 {")
            .Replace("desc \"Test flow\"", "desc \"Raw water flow\"")
            .Replace("range 0 .. 100 m3/h\n  health", "range 0 .. 100 m3/h\n  sqrt cutoff 2 %\n  health")
            .Replace("    current 20 mA\n", "    hart\n    current 20 mA\n")
            .Replace("  alarm L 20 deadband 5 m3/h\n", "");
        var result = TestInputs.RunCli("diff", Write("a.scale", DiffTests.BasePlant), Write("b.scale", changed), "--json");
        Assert.Equal(0, result.ExitCode);
        AssertValid(result.Out);

        var json = JObject.Parse(result.Out);
        Assert.Equal(new[] { "added", "removed", "changed", "plant" }, json.Properties().Select(p => p.Name));
        Assert.Equal(new[] { "PT-9" }, json["added"]!.Values<string>());
        Assert.Equal(new[] { "PT-2" }, json["removed"]!.Values<string>());
        var fields = json["changed"]!.Select(c => $"{c["point"]} {c["field"]}").ToList();
        Assert.Equal(new[] { "FT-1 desc", "FT-1 sqrt", "FT-1 sqrt.cutoff_pct", "FT-1 alarm.L", "FT-1 loop.hart" }, fields);
        var first = json["changed"]![0]!;
        Assert.Equal(new[] { "point", "field", "old", "new", "summary", "consequence" }, ((JObject)first).Properties().Select(p => p.Name));
        var cutoff = json["changed"]!.Single(c => (string?)c["field"] == "sqrt.cutoff_pct");
        Assert.Equal(JTokenType.Null, cutoff["old"]!.Type);
        Assert.Equal(JTokenType.Integer, cutoff["new"]!.Type);
        var hart = json["changed"]!.Single(c => (string?)c["field"] == "loop.hart");
        Assert.Equal(JTokenType.Boolean, hart["new"]!.Type);
        var cycle = Assert.Single(json["plant"]!);
        Assert.Equal("cycle_s", (string?)cycle["field"]);
        Assert.Equal(0.1, (double)cycle["old"]!);
        Assert.Equal(0.2, (double)cycle["new"]!);
    }

    [Fact]
    public void The_schema_rejects_a_renamed_field()
    {
        var json = """{ "added": [], "removed": [], "changes": [] }""";
        var result = Schema.Value.Evaluate(JsonDocument.Parse(json).RootElement);
        Assert.False(result.IsValid);
    }

    [Fact]
    public void Folders_compare_whole_plants()
    {
        var before = ExampleCopy("old");
        var after = ExampleCopy("new", "intake.scale", "alarm H 850 deadband 5 %", "alarm H 860 deadband 5 %");
        var result = TestInputs.RunCli("diff", before, after);
        Assert.Equal(0, result.ExitCode);
        // 850 of 900 m3/h through square-root extraction: (850/900)^2 = 0.892 of the DP span, 4 + 0.892 * 16 = 18.27 mA (ISO 5167-1)
        Assert.StartsWith("~ FIT-101 H setpoint moved from 850 to 860 m3/h: trips at 18.61 mA (raw ", result.Out);
        Assert.Contains("instead of 18.27 mA (raw ", result.Out);
        Assert.EndsWith("0 points added, 0 removed, 1 changed (1 field)\n", result.Out);
    }

    [Fact]
    public void With_adds_the_rest_of_the_plant_to_both_versions()
    {
        var before = ExampleCopy("old");
        var after = ExampleCopy("new", "intake.scale", "alarm H 850 deadband 5 %", "alarm H 860 deadband 5 %");
        var cards = Path.Combine(before, "cards.scale");
        var alone = TestInputs.RunCli("diff", Path.Combine(before, "intake.scale"), Path.Combine(after, "intake.scale"));
        Assert.Equal(1, alone.ExitCode);
        Assert.Contains("error", alone.Error);

        var result = TestInputs.RunCli("diff", Path.Combine(before, "intake.scale"), Path.Combine(after, "intake.scale"), "--with", cards);
        Assert.Equal(0, result.ExitCode);
        Assert.StartsWith("~ FIT-101 H setpoint moved from 850 to 860 m3/h", result.Out);

        // The file that is also a compared version is taken once, not declared twice.
        var cardsChanged = ExampleCopy("new2", "cards.scale", "filter 1 s", "filter 1.5 s");
        var both = TestInputs.RunCli("diff", cards, Path.Combine(cardsChanged, "cards.scale"), "--with", before);
        Assert.Equal(0, both.ExitCode);
        Assert.Contains("~ FIT-101 filter time constant changed from 1 to 1.5 s", both.Out);
    }

    [Fact]
    public void Dev_null_is_an_empty_version()
    {
        var file = Write("plant.scale", DiffTests.BasePlant);
        var added = TestInputs.RunCli("diff", "/dev/null", file, "--json");
        Assert.Equal(0, added.ExitCode);
        Assert.Equal(new[] { "FT-1", "FT-3", "PT-2", "PT-4" }, JObject.Parse(added.Out)["added"]!.Values<string>());
        var removed = TestInputs.RunCli("diff", file, "/dev/null");
        Assert.Contains("- FT-1 removed: \"Test flow\", 0 .. 100 m3/h on AI16 at \"R1.S1.C0\", 3 alarms\n", removed.Out);
    }

    [Fact]
    public void Errors_in_either_version_exit_1_with_diagnostics()
    {
        var good = Write("good.scale", DiffTests.BasePlant);
        var bad = Write("bad.scale", DiffTests.BasePlant.Replace("range 0 .. 6 bar", "range 6 .. 6 bar"));
        var result = TestInputs.RunCli("diff", good, bad);
        Assert.Equal(1, result.ExitCode);
        Assert.Equal("", result.Out);
        Assert.Matches(@"bad\.scale\(\d+,\d+\): error SG\d{4}: ", result.Error);
        Assert.Contains("the NEW version has 1 error", result.Error);
    }

    [Fact]
    public void Usage_problems_exit_2()
    {
        var file = Write("plant.scale", DiffTests.BasePlant);
        Assert.Equal(2, TestInputs.RunCli("diff", file, Path.Combine(_folder, "missing.scale")).ExitCode);
        Assert.Equal(2, TestInputs.RunCli("diff", file, file, "--json", "--format", "markdown").ExitCode);
        Assert.Equal(2, TestInputs.RunCli("diff", file, file, "--format", "html").ExitCode);
        Assert.Equal(2, TestInputs.RunCli("diff", file).ExitCode);
    }

    [Fact]
    public void Markdown_is_a_table_that_pipes_and_html_cannot_break()
    {
        var before = Write("a.scale", DiffTests.BasePlant);
        var after = Write("b.scale", DiffTests.BasePlant
            .Replace("desc \"Test flow\"", "desc \"Flow | <b>bold</b>\"")
            .Replace("point PT-2 {", "point PT-9 {"));
        var result = TestInputs.RunCli("diff", before, after, "--format", "markdown");
        Assert.Equal(0, result.ExitCode);
        var lines = result.Out.Split('\n');
        Assert.Equal("### Point changes", lines[0]);
        Assert.Contains("- `PT-9`: 0 .. 10 bar on AI16 at \"R1.S1.C1\", 1 alarm", lines);
        Assert.Contains("- `PT-2`: 0 .. 10 bar on AI16 at \"R1.S1.C1\", 1 alarm", lines);
        var row = Assert.Single(lines, l => l.StartsWith("| `FT-1` |", StringComparison.Ordinal));
        Assert.Equal("| `FT-1` | `desc` | description changed from \"Test flow\" to \"Flow \\| &lt;b&gt;bold&lt;/b&gt;\" |  |", row);

        var same = TestInputs.RunCli("diff", before, before, "--format", "markdown");
        Assert.Equal("### Point changes\n\nNo changes.\n", same.Out);
    }

    [Fact]
    public void Output_does_not_depend_on_the_culture()
    {
        var before = Write("a.scale", DiffTests.BasePlant);
        var after = Write("b.scale", DiffTests.BasePlant
            .Replace("alarm HH 90 ", "alarm HH 92.5 ")
            .Replace("cable 100 m 1.0 mm2", "cable 137.5 m 1.5 mm2")
            .Replace("sqrt cutoff 3 %", "sqrt cutoff 2.5 %"));
        var invariant = TestInputs.RunCli("diff", before, after);
        var german = TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli("diff", before, after));
        var germanJson = TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli("diff", before, after, "--json"));
        Assert.Equal(invariant.Out, german.Out);
        Assert.Contains("moved from 90 to 92.5 m3/h", german.Out);
        Assert.Contains("\"new\": 92.5", germanJson.Out);
        AssertValid(germanJson.Out);
    }
}
