using System.CommandLine;
using ScaleGen.Emit;
using ScaleGen.Syntax;
using ScaleGen.Text;

namespace ScaleGen.Cli.Commands;

/// <summary>`fmt FILES [--check] [--write]`: the canonical layout.</summary>
internal static class FmtCommand
{
    public static Command Create(ConsoleIo io)
    {
        var files = Inputs.FilesArgument();
        var check = new Option<bool>("--check") { Description = "change nothing; exit 1 if any file is not in canonical layout" };
        var write = new Option<bool>("--write") { Description = "rewrite the files in place (each file is replaced whole, or not at all)" };
        var command = new Command("fmt", "Lay out .scale files canonically; prints to stdout unless --write.") { files, check, write };
        command.SetAction(result =>
        {
            var sources = Inputs.Load(result.GetValue(files)!);
            var formatted = new List<(SourceText Source, string Text)>();
            var hadErrors = false;
            foreach (var source in sources)
            {
                // Formatting needs only the syntax: a file is laid out on its own.
                var diagnostics = new DiagnosticBag();
                var unit = SyntaxParser.Parse(source, diagnostics);
                var errors = diagnostics.Where(d => d.IsError).ToList();
                if (errors.Count > 0)
                {
                    io.Error.Write(DiagnosticReport.Text(diagnostics.ToSortedList(new[] { source })));
                    hadErrors = true;
                    continue;
                }
                formatted.Add((source, Formatter.Format(unit)));
            }
            if (hadErrors)
            {
                io.Error.WriteLine("scalegen: files with syntax errors were not formatted");
                return ExitCodes.Failed;
            }

            var changed = formatted.Where(f => f.Text != f.Source.Text).ToList();
            if (result.GetValue(check))
            {
                foreach (var (source, _) in changed) io.Error.WriteLine($"{source.Path}: not in canonical layout (run 'scalegen fmt --write')");
                return changed.Count > 0 ? ExitCodes.Failed : ExitCodes.Ok;
            }
            if (result.GetValue(write))
            {
                foreach (var (source, text) in changed)
                {
                    try { AtomicFile.WriteAllText(source.Path, text); }
                    catch (Exception e) when (e is IOException or UnauthorizedAccessException)
                    {
                        throw new UsageException($"cannot write '{source.Path}': {e.Message}");
                    }
                    io.Error.WriteLine($"formatted {source.Path}");
                }
                return ExitCodes.Ok;
            }
            foreach (var (_, text) in formatted) io.Out.Write(text);
            return ExitCodes.Ok;
        });
        return command;
    }
}
