using System.CommandLine;
using ScaleGen.Emit;

namespace ScaleGen.Cli.Commands;

/// <summary>`build FILES -o DIR [--only LIST]`: write every output kind, all or nothing.</summary>
internal static class BuildCommand
{
    public static Command Create(ConsoleIo io)
    {
        var files = Inputs.FilesArgument();
        var output = new Option<string>("--output", "-o")
        {
            Description = "output folder; replaced whole on success, untouched on failure",
            HelpName = "DIR",
            Required = true,
        };
        var only = new Option<string>("--only")
        {
            Description = $"comma-separated output kinds to write (default all): {KnownKinds()}",
            HelpName = "KINDS",
        };
        var command = new Command("build", "Write every output (PLC code, alarm configuration, ...) into one folder, all or nothing.")
        {
            files, output, only,
        };
        command.SetAction(result =>
        {
            // Settle the command line before compiling, so a typo costs no time.
            var emitters = Select(result.GetValue(only));
            var directory = result.GetValue(output)!;

            var sources = Inputs.Load(result.GetValue(files)!);
            var progress = ProgressLine.For(io, sources.Sum(s => (long)s.Length));
            progress.Show($"compiling {sources.Count} file{(sources.Count == 1 ? "" : "s")}");
            var compiled = Compilation.Compile(sources);
            progress.Clear(); // out of the way of the diagnostics
            var compilation = Inputs.Report(io, compiled);
            if (compilation is null) return ExitCodes.Failed;

            IReadOnlyList<WrittenFile> written;
            var started = 0;
            try
            {
                var points = compilation.Plant.Points.Length;
                progress.Show($"{points} points compiled; writing outputs");
                written = OutputWriter.Build(EmitContext.From(compilation), emitters, directory,
                    writing: file => progress.Show($"writing {file} ({Interlocked.Increment(ref started)} files started)"));
            }
            catch (OutputFolderException problem)
            {
                throw new UsageException(problem.Message);
            }
            finally
            {
                progress.Clear();
            }
            foreach (var file in written)
                io.Error.WriteLine($"wrote {Path.Combine(directory, file.RelativePath)} ({file.Bytes} bytes)");
            return ExitCodes.Ok;
        });
        return command;
    }

    /// <summary>The emitters --only names, in catalog order; all of them when it is absent.</summary>
    private static IReadOnlyList<IOutputEmitter> Select(string? only)
    {
        if (only is null) return OutputCatalog.All;
        var kinds = only.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries);
        if (kinds.Length == 0) throw new UsageException($"--only needs at least one output kind: {KnownKinds()}");
        foreach (var kind in kinds)
        {
            if (OutputCatalog.Find(kind) is null)
                throw new UsageException($"unknown output kind '{kind}' in --only; known kinds: {KnownKinds()}");
        }
        return OutputCatalog.All.Where(e => kinds.Contains(e.Kind, StringComparer.Ordinal)).ToList();
    }

    private static string KnownKinds() => string.Join(", ", OutputCatalog.All.Select(e => e.Kind));
}
