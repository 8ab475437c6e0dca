using System.Globalization;
using ScaleGen.Cli;
using ScaleGen.Text;

namespace ScaleGen.Tests.Support;

/// <summary>Shared ways for tests to compile text, find the repository and run the CLI in-process.</summary>
public static class TestInputs
{
    /// <summary>The repository root (the folder with ScaleGen.sln).</summary>
    public static string RepositoryRoot { get; } = FindRoot();

    public static string ExamplesFolder => Path.Combine(RepositoryRoot, "examples", "kestrel-ridge");

    public static IReadOnlyList<string> ExampleFiles =>
        Directory.GetFiles(ExamplesFolder, "*.scale").OrderBy(f => f, StringComparer.Ordinal).ToArray();

    public static Compilation CompileExample() =>
        Compilation.Compile(ExampleFiles.Select(SourceText.FromFile).ToArray());

    /// <summary>Compiles text as one file named test.scale.</summary>
    public static Compilation Compile(string text, string path = "test.scale") =>
        Compilation.Compile(new SourceText(path, text));

    /// <summary>A card every test plant can use: 16-bit counts for 4..20 mA, NE 43 friendly limits.</summary>
    public const string StandardCard = """
        card AI16 {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511
          fault-code 32767
        }
        """;

    public static CliResult RunCli(params string[] args)
    {
        var stdout = new StringWriter(CultureInfo.InvariantCulture) { NewLine = "\n" };
        var stderr = new StringWriter(CultureInfo.InvariantCulture) { NewLine = "\n" };
        var exit = ScaleGenCli.Run(args, stdout, stderr);
        return new CliResult(exit, stdout.ToString(), stderr.ToString());
    }

    /// <summary>Runs an action under another culture, to prove output does not depend on it.</summary>
    public static T UnderCulture<T>(string name, Func<T> action)
    {
        var saved = (CultureInfo.CurrentCulture, CultureInfo.CurrentUICulture);
        try
        {
            CultureInfo.CurrentCulture = CultureInfo.CurrentUICulture = CultureInfo.GetCultureInfo(name);
            return action();
        }
        finally
        {
            (CultureInfo.CurrentCulture, CultureInfo.CurrentUICulture) = saved;
        }
    }

    private static string FindRoot()
    {
        var directory = new DirectoryInfo(AppContext.BaseDirectory);
        while (directory is not null && !File.Exists(Path.Combine(directory.FullName, "ScaleGen.sln")))
            directory = directory.Parent;
        return directory?.FullName ?? throw new InvalidOperationException("ScaleGen.sln not found above the test folder.");
    }
}

public sealed record CliResult(int ExitCode, string Out, string Error);
