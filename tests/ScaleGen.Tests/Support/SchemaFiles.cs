using System.Text.Json;
using Json.Schema;

namespace ScaleGen.Tests.Support;

/// <summary>
/// The JSON Schemas in schemas/, each loaded once per test run (the schema library keeps a
/// registry of schemas by $id), and a check that names every failure.
/// </summary>
public static class SchemaFiles
{
    private static readonly Lazy<JsonSchema> AlarmsSchema = new(() => Load("alarms.schema.json"));
    private static readonly Lazy<JsonSchema> EvalSchema = new(() => Load("eval.schema.json"));
    private static readonly Lazy<JsonSchema> CheckSchema = new(() => Load("check.schema.json"));

    public static JsonSchema Alarms => AlarmsSchema.Value;
    public static JsonSchema Eval => EvalSchema.Value;
    public static JsonSchema Check => CheckSchema.Value;

    /// <summary>The schema's failures for a JSON text; empty when it is valid.</summary>
    public static IReadOnlyList<string> Errors(JsonSchema schema, string json)
    {
        using var document = JsonDocument.Parse(json);
        var results = schema.Evaluate(document.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List });
        if (results.IsValid) return [];
        return (results.Details ?? [])
            .Where(d => d.Errors is { Count: > 0 })
            .SelectMany(d => d.Errors!.Select(e => $"{d.InstanceLocation}: {e.Key}: {e.Value}"))
            .DefaultIfEmpty("invalid (no details)")
            .ToList();
    }

    public static void AssertValid(JsonSchema schema, string json)
    {
        var errors = Errors(schema, json);
        Assert.True(errors.Count == 0, "schema violations:\n" + string.Join("\n", errors.Take(20)));
    }

    private static string PathOf(string name) => Path.Combine(TestInputs.RepositoryRoot, "schemas", name);

    private static JsonSchema Load(string name) => JsonSchema.FromText(File.ReadAllText(PathOf(name)));
}
