using System.CommandLine;
using ScaleGen.Emit;
using ScaleGen.Text;

namespace ScaleGen.Cli.Commands;

/// <summary>What every command shares: the FILES argument, loading them, reporting diagnostics.</summary>
internal static class Inputs
{
    public static Argument<string[]> FilesArgument() => new("FILES")
    {
        Description = ".scale files; all files on one command line form one plant",
        Arity = ArgumentArity.OneOrMore,
    };

    public static IReadOnlyList<SourceText> Load(IEnumerable<string> paths)
    {
        var sources = new List<SourceText>();
        foreach (var path in paths)
        {
            if (Directory.Exists(path))
            {
                var files = Directory.GetFiles(path, "*.scale", SearchOption.AllDirectories).OrderBy(f => f, StringComparer.Ordinal).ToList();
                if (files.Count == 0) throw new UsageException($"no .scale files in folder '{path}'");
                sources.AddRange(files.Select(ReadOne));
            }
            else sources.Add(ReadOne(path));
        }
        return sources;
    }

    /// <summary>Reads one file; a missing or unreadable one is a usage error.</summary>
    public static SourceText ReadOne(string path)
    {
        try
        {
            return SourceText.FromFile(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            throw new UsageException(e is FileNotFoundException or DirectoryNotFoundException
                ? $"cannot read '{path}': no such file"
                : $"cannot read '{path}': {e.Message}");
        }
    }

    /// <summary>Compiles the files and prints diagnostics to stderr; null when there are errors.</summary>
    public static Compilation? CompileOrReport(ConsoleIo io, IEnumerable<string> paths) => Report(io, Compilation.Compile(Load(paths)));

    /// <summary>Prints a compilation's diagnostics to stderr; null when there are errors.</summary>
    public static Compilation? Report(ConsoleIo io, Compilation compilation)
    {
        if (compilation.Diagnostics.Count > 0)
            io.Error.Write(DiagnosticReport.Text(compilation.Diagnostics));
        if (!compilation.HasErrors) return compilation;
        io.Error.WriteLine($"scalegen: {DiagnosticReport.Summary(compilation.Diagnostics.ToList())}; nothing was written");
        return null;
    }
}
