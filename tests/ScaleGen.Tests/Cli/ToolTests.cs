using System.Diagnostics;
using System.Text.RegularExpressions;
using ScaleGen.Cli;
using ScaleGen.Cli.Commands;
using ScaleGen.Tests.Import;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Cli;

public class ToolTests
{
    private static IReadOnlyList<string> Names { get; } =
        CommandCatalog.Create(new ConsoleIo(TextWriter.Null, TextWriter.Null)).Select(c => c.Name).ToList();

    public static TheoryData<string> CommandNames() => new(Names);

    [Theory]
    [MemberData(nameof(CommandNames))]
    public void Help_works_on_every_command(string name)
    {
        var result = TestInputs.RunCli(name, "--help");

        Assert.Equal(0, result.ExitCode);
        Assert.Contains($"scalegen {name}", result.Out);
        Assert.Contains("Usage:", result.Out);
        Assert.Equal("", result.Error);
    }

    [Fact]
    public void Help_on_the_tool_lists_every_command()
    {
        var result = TestInputs.RunCli("--help");

        Assert.Equal(0, result.ExitCode);
        Assert.Contains("scalegen [command] [options]", result.Out);
        foreach (var name in Names) Assert.Contains($"  {name} ", result.Out);
    }

    [Fact]
    public void Version_prints_the_version_alone()
    {
        var result = TestInputs.RunCli("--version");

        Assert.Equal(0, result.ExitCode);
        Assert.Matches(new Regex(@"^\d+\.\d+\.\d+(-[0-9A-Za-z.-]+)?\n$"), result.Out);
        Assert.Equal(ScaleGenCli.Version + "\n", result.Out);
    }

    /// <summary>
    /// Packs the tool, installs it from the local package folder into a temporary tool path
    /// (no feed is asked, so this works offline) and runs it as a user would.
    /// </summary>
    [Fact]
    [Trait("Category", "Slow")]
    public void The_packed_tool_installs_from_the_local_package_and_runs()
    {
        using var scratch = new ScratchFolder();
        var toolPath = Path.Combine(scratch.Path, "tool");
        var script = Path.Combine(TestInputs.RepositoryRoot, "tools", "install-local-tool.sh");

        var install = Run("bash", script, toolPath, Path.Combine(scratch.Path, "packages"));
        Assert.True(install.ExitCode == 0, $"install failed:\n{install.Output}");

        var scalegen = Path.Combine(toolPath, "scalegen");
        var version = Run(scalegen, "--version");
        Assert.Equal(ScaleGenCli.Version, version.Output.Trim());

        var check = Run(scalegen, new[] { "check" }.Concat(TestInputs.ExampleFiles).ToArray());
        Assert.True(check.ExitCode == 0, check.Output);
        Assert.Contains("27 points checked: 0 errors, 0 warnings", check.Output);

        // The import needs the library's CSV dependency: it must have travelled in the package.
        var output = Path.Combine(scratch.Path, "sludge.scale");
        var import = Run(scalegen, "import", ImportCases.IoListFile, "--cards", ImportCases.CardsFile, "-o", output);
        Assert.True(import.ExitCode == 0, import.Output);
        Assert.True(File.Exists(output));
    }

    private static (int ExitCode, string Output) Run(string program, params string[] arguments)
    {
        var start = new ProcessStartInfo(program)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
            WorkingDirectory = TestInputs.RepositoryRoot,
        };
        foreach (var argument in arguments) start.ArgumentList.Add(argument);
        using var process = Process.Start(start)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(TimeSpan.FromMinutes(8)))
        {
            process.Kill(entireProcessTree: true);
            return (-1, $"{program} did not finish in 8 minutes");
        }
        return (process.ExitCode, stdout.Result + stderr.Result);
    }
}
