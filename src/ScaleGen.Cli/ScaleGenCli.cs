using System.CommandLine;
using System.CommandLine.Help;
using System.Reflection;
using ScaleGen.Cli.Commands;

namespace ScaleGen.Cli;

/// <summary>Exit codes of the command line contract.</summary>
public static class ExitCodes
{
    public const int Ok = 0;
    /// <summary>Input errors, a failed verification or loop budget, unformatted files, changes found.</summary>
    public const int Failed = 1;
    /// <summary>Usage error, missing file, unreadable or unwritable path, internal failure.</summary>
    public const int Usage = 2;
}

/// <summary>
/// The `scalegen` command: builds the command tree and runs it with the given writers, so
/// tests run exactly what a user runs, in-process.
/// </summary>
public static class ScaleGenCli
{
    public static string Version { get; } =
        typeof(ScaleGenCli).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0] ?? "0.0.0";

    public static int Run(string[] args, TextWriter stdout, TextWriter stderr) => Run(args, stdout, stderr, errorIsTerminal: false);

    /// <summary>
    /// <paramref name="errorIsTerminal"/>: stderr is a terminal a person watches, so long
    /// runs may show progress there. Redirected (a CI log, a file), they stay quiet.
    /// </summary>
    public static int Run(string[] args, TextWriter stdout, TextWriter stderr, bool errorIsTerminal)
    {
        var io = new ConsoleIo(stdout, stderr) { ErrorIsTerminal = errorIsTerminal };
        // A plain command named "scalegen", not RootCommand: RootCommand takes its name from the
        // running executable, which is ScaleGen.Cli (or a test host), so help would show the wrong name.
        var root = new Command("scalegen", "scalegen: turns .scale analog point files into PLC code, alarm configuration, loop budgets and check sheets.")
        {
            new HelpOption(),
            // The default action prints the entry assembly's version: a test host's in tests.
            new VersionOption { Action = new PrintVersion(stdout) },
        };
        foreach (var command in CommandCatalog.Create(io)) root.Add(command);

        try
        {
            var parsed = root.Parse(args);
            if (parsed.Errors.Count > 0)
            {
                foreach (var error in parsed.Errors) stderr.WriteLine($"scalegen: {error.Message}");
                stderr.WriteLine("Run 'scalegen --help' for usage.");
                return ExitCodes.Usage;
            }
            return parsed.Invoke(new InvocationConfiguration
            {
                Output = stdout,
                Error = stderr,
                EnableDefaultExceptionHandler = false,
            });
        }
        catch (UsageException usage)
        {
            stderr.WriteLine($"scalegen: {usage.Message}");
            return ExitCodes.Usage;
        }
        catch (Exception exception)
        {
            // Bad input never gets here: it is reported as diagnostics. This is a bug in scalegen.
            stderr.WriteLine($"scalegen: internal error ({exception.GetType().Name}: {exception.Message}); please report it with the input that caused it");
            return ExitCodes.Usage;
        }
    }
}

/// <summary>`scalegen --version`: the tool's own version, nothing else.</summary>
internal sealed class PrintVersion(TextWriter stdout) : System.CommandLine.Invocation.SynchronousCommandLineAction
{
    public override int Invoke(ParseResult parseResult)
    {
        stdout.WriteLine(ScaleGenCli.Version);
        return ExitCodes.Ok;
    }
}

/// <summary>A problem with the command line or a path: exit code 2, one line, no stack trace.</summary>
public sealed class UsageException(string message) : Exception(message);

/// <summary>Where a command writes.</summary>
public sealed record ConsoleIo(TextWriter Out, TextWriter Error)
{
    /// <summary>stderr is a terminal: progress of long runs may be shown there (see Commands/ProgressLine.cs).</summary>
    public bool ErrorIsTerminal { get; init; }
}
