using System.CommandLine;
using ScaleGen.Emit;
using ScaleGen.Review;
using ScaleGen.Text;

namespace ScaleGen.Cli.Commands;

/// <summary>
/// `diff OLD NEW [--json] [--format text|markdown] [--exit-code] [--with FILES]`: what changed
/// between two versions of a plant, point by point, field by field, with consequences.
/// </summary>
internal static class DiffCommand
{
    public static Command Create(ConsoleIo io)
    {
        var oldPath = new Argument<string>("OLD") { Description = "the old version: a .scale file, or a folder (all its .scale files are one plant); /dev/null for none" };
        var newPath = new Argument<string>("NEW") { Description = "the new version: a .scale file, or a folder" };
        var json = new Option<bool>("--json") { Description = "print one JSON object: added, removed, changed" };
        var format = new Option<string>("--format")
        {
            Description = "text (one line per change) or markdown (for a review comment)",
            DefaultValueFactory = _ => "text",
        };
        format.AcceptOnlyFromAmong("text", "markdown");
        var exitCode = new Option<bool>("--exit-code") { Description = "exit 1 when there are changes, 0 when there are none" };
        var with = new Option<string[]>("--with")
        {
            Description = ".scale files or folders that belong to both versions (e.g. the cards and profiles a compared file uses); a file named like a compared one is left out",
            AllowMultipleArgumentsPerToken = true,
            HelpName = "FILES",
        };
        var command = new Command("diff", "Show what changed between two versions of a plant: points added and removed, and every changed field with what it does.")
        {
            oldPath, newPath, json, format, exitCode, with,
        };
        command.SetAction(result =>
        {
            if (result.GetValue(json) && result.GetResult(format) is { Implicit: false })
                throw new UsageException("give either --json or --format, not both");

            var shared = Inputs.Load(result.GetValue(with) ?? []);
            var before = CompileSide(io, "OLD", result.GetValue(oldPath)!, shared);
            var after = CompileSide(io, "NEW", result.GetValue(newPath)!, shared);
            if (before is null || after is null) return ExitCodes.Failed;

            var diff = PlantDiff.Compare(before.Plant, after.Plant);
            io.Out.Write(result.GetValue(json) ? DiffReport.Json(diff)
                : result.GetValue(format) == "markdown" ? DiffReport.Markdown(diff)
                : DiffReport.Text(diff));
            return result.GetValue(exitCode) && !diff.IsEmpty ? ExitCodes.Failed : ExitCodes.Ok;
        });
        return command;
    }

    /// <summary>The empty version, as git names it.</summary>
    public const string NoFile = "/dev/null";

    /// <summary>
    /// Compiles one version: its own files plus the shared ones, leaving out a shared file with
    /// the same name as one of the version's own (that is the file being compared, in the
    /// other version or this one). Errors go to stderr; warnings stay quiet, the diff is about changes.
    /// </summary>
    private static Compilation? CompileSide(ConsoleIo io, string side, string path, IReadOnlyList<SourceText> shared)
    {
        // git passes /dev/null for the missing side of an added or deleted file: no files.
        var own = path == NoFile ? [] : Inputs.Load(new[] { path });
        var ownNames = own.Select(s => Path.GetFileName(s.Path)).ToHashSet(StringComparer.Ordinal);
        var sources = own.Concat(shared.Where(s => !ownNames.Contains(Path.GetFileName(s.Path)))).ToList();
        var compilation = Compilation.Compile(sources);
        if (!compilation.HasErrors) return compilation;
        var errors = compilation.Diagnostics.Where(d => d.IsError).ToList();
        io.Error.Write(DiagnosticReport.Text(errors));
        io.Error.WriteLine($"scalegen: the {side} version has {errors.Count} error{(errors.Count == 1 ? "" : "s")}; nothing was compared");
        return null;
    }
}
