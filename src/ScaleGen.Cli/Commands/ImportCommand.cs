using System.CommandLine;
using ScaleGen.Emit;
using ScaleGen.Import;
using ScaleGen.Text;

namespace ScaleGen.Cli.Commands;

/// <summary>
/// `import CSV [-o FILE] [--map "Header=column,..."] [--map-file FILE] [--cards FILE] [--delimiter C]`:
/// an I/O list in CSV to a .scale file of points. Any bad row: nothing is written, exit 1.
/// </summary>
internal static class ImportCommand
{
    public static Command Create(ConsoleIo io)
    {
        var csv = new Argument<string>("CSV") { Description = "the I/O list, saved as CSV with a header row (see docs/import.md for the columns)" };
        var output = new Option<string?>("--output", "-o") { Description = "write the .scale text to this file (replaced whole, or not at all); default: stdout" };
        var map = new Option<string[]>("--map")
        {
            Description = "other header names for the import columns: \"Tag No.=tag,Service=description\" (may be repeated)",
            DefaultValueFactory = _ => Array.Empty<string>(),
        };
        var mapFile = new Option<string?>("--map-file") { Description = "a CSV file of header mappings: a row 'header,column', then one mapping a row" };
        var cards = new Option<string[]>("--cards")
        {
            Description = ".scale files that declare the cards and profiles the rows name; the points are then checked as 'check' would (may be repeated)",
            DefaultValueFactory = _ => Array.Empty<string>(),
        };
        var delimiter = new Option<string>("--delimiter")
        {
            Description = "field delimiter: ',' (default), ';' or 'tab'",
            DefaultValueFactory = _ => ",",
        };
        delimiter.AcceptOnlyFromAmong(",", ";", "tab");
        var command = new Command("import", "Turn an I/O list in CSV into a .scale file of points, in canonical layout.")
        {
            csv, output, map, mapFile, cards, delimiter,
        };
        command.SetAction(result =>
        {
            var csvPath = result.GetValue(csv)!;
            var headerMap = new HeaderMap();
            if (headerMap.AddSpecs(result.GetValue(map)!) is { } mapError) throw new UsageException(mapError);
            if (result.GetValue(mapFile) is { } mapPath && headerMap.AddFile(mapPath, Inputs.ReadOne(mapPath).Text) is { } fileError)
                throw new UsageException(fileError);
            var cardFiles = result.GetValue(cards)!;
            var declarations = cardFiles.Length == 0 ? Array.Empty<SourceText>() : Inputs.Load(cardFiles);
            var separator = result.GetValue(delimiter) == "tab" ? "\t" : result.GetValue(delimiter)!;
            var outputPath = result.GetValue(output);
            if (outputPath is not null && Path.GetDirectoryName(Path.GetFullPath(outputPath)) is { } folder && !Directory.Exists(folder))
                throw new UsageException($"cannot write '{outputPath}': there is no folder '{folder}'");

            var imported = IoListImporter.Import(csvPath, Inputs.ReadOne(csvPath).Text, new ImportOptions(headerMap, separator, declarations), outputPath);
            foreach (var problem in imported.Problems) io.Error.WriteLine(problem.ToString());
            var errors = imported.Problems.Count(p => p.IsError);
            var warnings = imported.Problems.Count - errors;
            var summary = $"{errors} error{(errors == 1 ? "" : "s")}, {warnings} warning{(warnings == 1 ? "" : "s")}";
            if (imported.Text is null)
            {
                io.Error.WriteLine($"scalegen: {summary} in {csvPath}; nothing was written");
                return ExitCodes.Failed;
            }

            if (outputPath is null) io.Out.Write(imported.Text);
            else
            {
                try { AtomicFile.WriteAllText(outputPath, imported.Text); }
                catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
                {
                    throw new UsageException($"cannot write '{outputPath}': {e.Message}");
                }
            }
            var count = imported.PointCount;
            io.Error.WriteLine($"imported {count} point{(count == 1 ? "" : "s")} from {csvPath}{(outputPath is null ? "" : " into " + outputPath)}: {summary}");
            if (declarations.Count == 0)
                io.Error.WriteLine("card and profile names were not checked: give --cards FILE, or check the result together with the file that declares them");
            return ExitCodes.Ok;
        });
        return command;
    }
}
