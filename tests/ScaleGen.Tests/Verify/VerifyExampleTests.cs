using Newtonsoft.Json.Linq;
using ScaleGen.Tests.Support;
using ScaleGen.Verify;

namespace ScaleGen.Tests.Verify;

/// <summary>The generated Structured Text of the demo plant, run against the reference: every point agrees.</summary>
public class VerifyExampleTests
{
    /// <summary>One run of the example through the API, shared by the tests that only read it.</summary>
    internal static readonly Lazy<VerifyResult> Example = new(() =>
    {
        var compilation = TestInputs.CompileExample();
        return PlantVerifier.Verify(compilation.Plant, PlantVerifier.GenerateStructuredText(compilation));
    });

    [Fact]
    public void Every_point_of_the_example_agrees_with_the_reference()
    {
        var result = Example.Value;
        Assert.Null(result.Problem);
        Assert.Equal(27, result.Points.Length);
        Assert.True(result.PerPoint, "plant.st calls each point on its own line, so each point runs alone");
        foreach (var point in result.Points)
        {
            Assert.True(point.Ok, $"{point.Point}: {point.FirstFailure}");
            Assert.True(point.Cases > 2000, $"{point.Point}: only {point.Cases} cases");
            Assert.True(point.Scans >= point.Cases);
            // The derived tolerance is a few REAL ulps of the values involved, not a loose
            // constant: well under 0.01 % of span, and never zero. REAL has a 24-bit
            // significand (IEC 61131-3), so 2^-24 of span is the smallest honest figure.
            Assert.InRange(point.TolerancePercent, 100 * Math.Pow(2, -24), 0.01);
            Assert.True(point.MaxErrorPercent <= point.TolerancePercent);
        }
        Assert.True(result.Ok);
    }

    [Fact]
    public void The_command_prints_a_row_per_point_and_exits_0()
    {
        var args = new List<string> { "verify" };
        args.AddRange(TestInputs.ExampleFiles);
        var run = TestInputs.RunCli(args.ToArray());
        Assert.True(run.ExitCode == 0, run.Out + run.Error);
        var lines = run.Out.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.StartsWith("verify: library.st, plant.st run against the reference model, one scan per 100 ms cycle", lines[0]);
        Assert.Matches(@"^point\s+cases\s+scans\s+max error %\s+tolerance %\s+edge\s+mismatches\s+ok$", lines[1]);
        Assert.Matches(@"^FIT-101\s+\d+\s+\d+\s+\S+\s+\S+\s+0\s+0\s+ok$", lines.Single(l => l.StartsWith("FIT-101 ", StringComparison.Ordinal)));
        Assert.StartsWith("verify: ok: all 27 points agree with the reference", lines[^1]);
    }

    [Fact]
    public void The_JSON_follows_the_contract_and_the_schema_and_does_not_depend_on_the_culture()
    {
        var args = new List<string> { "verify" };
        args.AddRange(TestInputs.ExampleFiles);
        args.Add("--json");
        var run = TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli(args.ToArray()));
        Assert.True(run.ExitCode == 0, run.Out + run.Error);
        Assert.Equal(TestInputs.RunCli(args.ToArray()).Out, run.Out);
        VerifySchema.AssertValid(run.Out);
        var json = JObject.Parse(run.Out);
        Assert.True((bool)json["ok"]!);
        var points = (JArray)json["points"]!;
        Assert.Equal(27, points.Count);
        var first = (JObject)points[0];
        Assert.Equal(["point", "cases", "scans", "max_error", "tolerance", "tolerance_units", "edge_scans", "mismatches", "ok", "first_failure"],
            first.Properties().Select(p => p.Name));
        Assert.Equal("LT-101", (string)first["point"]!);
        Assert.Equal(JTokenType.Integer, first["cases"]!.Type);
        Assert.Equal(0, (int)first["mismatches"]!);
        Assert.DoesNotContain(",0", run.Out.Replace(", ", " ", StringComparison.Ordinal)); // no decimal commas
    }

    [Fact]
    public void The_PLCopen_export_is_verified_as_the_Structured_Text_it_carries()
    {
        using var folder = new TempFolder();
        var output = folder.Combine("out");
        var files = TestInputs.ExampleFiles.ToArray();
        Assert.Equal(0, TestInputs.RunCli(["build", .. files, "-o", output, "--only", "plcopen"]).ExitCode);

        var good = TestInputs.RunCli(["verify", .. files, "--st", Path.Combine(output, "plant.xml")]);
        Assert.Equal(0, good.ExitCode);
        Assert.Contains("all 27 points agree", good.Out, StringComparison.Ordinal);

        // A setpoint edited by hand in the XML (FIT-101 H, the only 850.0) makes verify fail.
        var xml = File.ReadAllText(Path.Combine(output, "plant.xml"));
        var edited = folder.Write("edited.xml", xml.Replace("<simpleValue value=\"850.0\" />", "<simpleValue value=\"860.0\" />", StringComparison.Ordinal));
        Assert.NotEqual(xml, File.ReadAllText(edited));
        var bad = TestInputs.RunCli(["verify", .. files, "--st", edited]);
        Assert.Equal(1, bad.ExitCode);
        Assert.Contains("FIT-101", bad.Out, StringComparison.Ordinal);

        var broken = folder.Write("broken.xml", "<?xml version=\"1.0\"?><project>");
        var unreadable = TestInputs.RunCli(["verify", .. files, "--st", broken]);
        Assert.Equal(1, unreadable.ExitCode);
        Assert.Contains("broken.xml", unreadable.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void A_missing_st_file_is_a_usage_error()
    {
        var args = new List<string> { "verify" };
        args.AddRange(TestInputs.ExampleFiles);
        args.AddRange(["--st", Path.Combine(Path.GetTempPath(), "no-such-folder-scalegen", "plant.st")]);
        var run = TestInputs.RunCli(args.ToArray());
        Assert.Equal(2, run.ExitCode);
        Assert.Contains("cannot read", run.Error);
        Assert.DoesNotContain("   at ", run.Error);
    }
}
