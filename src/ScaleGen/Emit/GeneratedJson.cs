using Newtonsoft.Json.Linq;

namespace ScaleGen.Emit;

/// <summary>
/// The "generated" object every generated JSON file starts with: the same provenance and
/// caution as <see cref="GeneratedHeader"/>, as fields a program can read.
/// </summary>
public static class GeneratedJson
{
    public static JObject Header(EmitContext context, string what) => new()
    {
        ["content"] = what,
        ["tool"] = "scalegen",
        ["version"] = context.ToolVersion,
        ["notice"] = "Do not edit: change the .scale source and regenerate.",
        ["sources"] = new JArray(context.Plant.Sources.Select(source => new JObject
        {
            ["file"] = GeneratedHeader.FileNameOf(source),
            ["sha256"] = GeneratedHeader.Sha256(source.Text),
        })),
        ["caution"] = string.Join(" ", GeneratedHeader.Caution),
    };
}
