using Newtonsoft.Json.Linq;
using ScaleGen.Text;

namespace ScaleGen.Emit;

/// <summary>Diagnostics as text (compiler convention), as JSON, and as SARIF 2.1.0.</summary>
public static class DiagnosticReport
{
    public static string Text(IEnumerable<Diagnostic> diagnostics) =>
        string.Concat(diagnostics.Select(d => d + "\n"));

    public static string Summary(IReadOnlyCollection<Diagnostic> diagnostics)
    {
        var errors = diagnostics.Count(d => d.IsError);
        var warnings = diagnostics.Count - errors;
        return $"{errors} error{(errors == 1 ? "" : "s")}, {warnings} warning{(warnings == 1 ? "" : "s")}";
    }

    public static string Json(IEnumerable<Diagnostic> diagnostics) =>
        JsonOutput.Write(new JObject
        {
            ["diagnostics"] = new JArray(diagnostics.Select(d => new JObject
            {
                ["code"] = d.Code,
                ["severity"] = d.IsError ? "error" : "warning",
                ["file"] = d.Location.Path,
                ["line"] = d.Location.Line,
                ["column"] = d.Location.Column,
                ["message"] = d.Message,
            })),
        });

    /// <summary>SARIF 2.1.0, the open static-analysis format code-review tools read.</summary>
    public static string Sarif(IReadOnlyCollection<Diagnostic> diagnostics, string toolVersion)
    {
        var usedCodes = diagnostics.Select(d => d.Code).ToHashSet(StringComparer.Ordinal);
        var rules = DiagnosticCatalog.All.Where(d => usedCodes.Contains(d.Code)).ToList();
        var ruleIndex = rules.Select((r, i) => (r.Code, i)).ToDictionary(t => t.Code, t => t.i, StringComparer.Ordinal);
        return JsonOutput.Write(new JObject
        {
            ["$schema"] = "https://json.schemastore.org/sarif-2.1.0.json",
            ["version"] = "2.1.0",
            ["runs"] = new JArray(new JObject
            {
                ["tool"] = new JObject
                {
                    ["driver"] = new JObject
                    {
                        ["name"] = "scalegen",
                        ["version"] = toolVersion,
                        ["rules"] = new JArray(rules.Select(r => new JObject
                        {
                            ["id"] = r.Code,
                            ["shortDescription"] = new JObject { ["text"] = r.Title },
                            ["defaultConfiguration"] = new JObject { ["level"] = r.Severity == Severity.Error ? "error" : "warning" },
                        })),
                    },
                },
                ["results"] = new JArray(diagnostics.Select(d => new JObject
                {
                    ["ruleId"] = d.Code,
                    ["ruleIndex"] = ruleIndex[d.Code],
                    ["level"] = d.IsError ? "error" : "warning",
                    ["message"] = new JObject { ["text"] = d.Message },
                    ["locations"] = new JArray(new JObject
                    {
                        ["physicalLocation"] = new JObject
                        {
                            ["artifactLocation"] = new JObject { ["uri"] = d.Location.Path.Replace('\\', '/') },
                            ["region"] = new JObject
                            {
                                ["startLine"] = d.Location.Line,
                                ["startColumn"] = d.Location.Column,
                            },
                        },
                    }),
                })),
            }),
        });
    }
}
