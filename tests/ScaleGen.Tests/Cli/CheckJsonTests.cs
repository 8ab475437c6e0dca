using System.Text.Json.Nodes;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Cli;

/// <summary>`check --format json` against schemas/check.schema.json.</summary>
public class CheckJsonTests
{
    [Fact]
    public void Clean_example_gives_an_empty_valid_list()
    {
        var result = TestInputs.RunCli(["check", .. TestInputs.ExampleFiles, "--format", "json"]);
        Assert.Equal(0, result.ExitCode);
        SchemaFiles.AssertValid(SchemaFiles.Check, result.Out);
        Assert.Empty(JsonNode.Parse(result.Out)!["diagnostics"]!.AsArray());
    }

    [Fact]
    public void Errors_and_warnings_are_valid()
    {
        using var folder = new TempFolder();
        var file = folder.Write("bad.scale", """
            card ai { counts 0 .. 27648 at 4 .. 20 mA }
            point P-1 { card ai at "a"; range 0 .. 100 % }
            point P-2 { card nowhere at "a"; range 5 .. 5 % }
            point P-3 { bogus 12 }
            """);
        var result = TestInputs.RunCli("check", file, "--format", "json");
        Assert.Equal(1, result.ExitCode);
        SchemaFiles.AssertValid(SchemaFiles.Check, result.Out);
        var severities = JsonNode.Parse(result.Out)!["diagnostics"]!.AsArray().Select(d => (string?)d!["severity"]).ToHashSet();
        Assert.Contains("error", severities);
        Assert.Contains("warning", severities);
    }

    [Fact]
    public void Schema_rejects_a_wrong_severity()
    {
        const string json = """{ "diagnostics": [ { "code": "SG1001", "severity": "fatal", "file": "a.scale", "line": 1, "column": 1, "message": "x" } ] }""";
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Check, json));
    }
}
