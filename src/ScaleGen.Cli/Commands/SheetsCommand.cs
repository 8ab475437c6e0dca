using System.CommandLine;
using ScaleGen.Emit;
using ScaleGen.Engine;

namespace ScaleGen.Cli.Commands;

/// <summary>
/// `sheets FILES [-o DIR] [--json]`: commissioning check sheets. Without -o it prints them
/// (JSON with --json, else a text summary); with -o it writes the CSV, HTML and JSON files
/// of the "sheets" output, each atomically.
/// </summary>
internal static class SheetsCommand
{
    public static Command Create(ConsoleIo io)
    {
        var files = Inputs.FilesArgument();
        var output = new Option<string?>("--output", "-o") { Description = "folder to write check-sheets.csv, .html and .json into (created if missing)" };
        var json = new Option<bool>("--json") { Description = "print { \"points\": [...] } as JSON" };
        var command = new Command("sheets",
            "Commissioning check sheets: five-point test, status band tests and alarm trip currents for every point.")
        {
            files, output, json,
        };
        command.SetAction(result =>
        {
            var compilation = Inputs.CompileOrReport(io, result.GetValue(files)!);
            if (compilation is null) return ExitCodes.Failed;

            if (result.GetValue(output) is { } folder)
            {
                Write(io, folder, new SheetsEmitter().Emit(EmitContext.From(compilation)).ToList());
                if (result.GetValue(json))
                    io.Out.Write(JsonOutput.Write(SheetsReport.Json(CheckSheets.For(compilation.Plant))));
                return ExitCodes.Ok;
            }
            var sheets = CheckSheets.For(compilation.Plant);
            io.Out.Write(result.GetValue(json) ? JsonOutput.Write(SheetsReport.Json(sheets)) : SheetsReport.Text(sheets));
            return ExitCodes.Ok;
        });
        return command;
    }

    private static void Write(ConsoleIo io, string folder, IReadOnlyList<GeneratedFile> generated)
    {
        try
        {
            Directory.CreateDirectory(folder);
            foreach (var file in generated)
            {
                var path = Path.Combine(folder, file.RelativePath);
                AtomicFile.WriteAllText(path, file.Content);
                io.Error.WriteLine($"wrote {path}");
            }
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            throw new UsageException($"cannot write to '{folder}': {e.Message}");
        }
    }
}
