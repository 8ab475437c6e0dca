using System.Text.Json;
using Json.Schema;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Field;

/// <summary>The JSON Schemas in schemas/, loaded once, and a check that lists every error.</summary>
internal static class FieldSchemas
{
    private static readonly Lazy<JsonSchema> LoopSchema = new(() => Load("loop.schema.json"));
    private static readonly Lazy<JsonSchema> SheetsSchema = new(() => Load("sheets.schema.json"));

    public static void AssertLoop(string json) => AssertValid(LoopSchema.Value, json);

    public static void AssertSheets(string json) => AssertValid(SheetsSchema.Value, json);

    private static JsonSchema Load(string name) =>
        JsonSchema.FromFile(Path.Combine(TestInputs.RepositoryRoot, "schemas", name));

    private static void AssertValid(JsonSchema schema, string json)
    {
        using var document = JsonDocument.Parse(json);
        var results = schema.Evaluate(document.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List });
        var errors = (results.Details ?? [])
            .Where(d => d.Errors is { Count: > 0 })
            .SelectMany(d => d.Errors!.Select(e => $"{d.InstanceLocation}: {e.Key}: {e.Value}"))
            .ToList();
        Assert.True(results.IsValid, "schema errors:\n" + string.Join("\n", errors));
    }
}
