using System.Text.Json;
using Json.Schema;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Verify;

/// <summary>schemas/verify.schema.json, loaded once, and a check that lists every error.</summary>
internal static class VerifySchema
{
    private static readonly Lazy<JsonSchema> Schema = new(() =>
        JsonSchema.FromFile(Path.Combine(TestInputs.RepositoryRoot, "schemas", "verify.schema.json")));

    public static void AssertValid(string json)
    {
        using var document = JsonDocument.Parse(json);
        var results = Schema.Value.Evaluate(document.RootElement, new EvaluationOptions { OutputFormat = OutputFormat.List });
        var errors = (results.Details ?? [])
            .Where(d => d.Errors is { Count: > 0 })
            .SelectMany(d => d.Errors!.Select(e => $"{d.InstanceLocation}: {e.Key}: {e.Value}"))
            .ToList();
        Assert.True(results.IsValid, "schema errors:\n" + string.Join("\n", errors));
    }
}
