using System.Globalization;
using ScaleGen.Cli;
using ScaleGen.Cli.Commands;
using ScaleGen.Samples;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Cli;

/// <summary>
/// `build` on a large plant shows progress on a terminal, and only there: redirected
/// (a CI log), the output is what it always was.
/// </summary>
public sealed class ProgressTests : IDisposable
{
    private readonly TempFolder _folder = new();

    public void Dispose() => _folder.Dispose();

    private static CliResult Run(bool terminal, params string[] args)
    {
        var stdout = new StringWriter(CultureInfo.InvariantCulture) { NewLine = "\n" };
        var stderr = new StringWriter(CultureInfo.InvariantCulture) { NewLine = "\n" };
        var exit = ScaleGenCli.Run(args, stdout, stderr, errorIsTerminal: terminal);
        return new CliResult(exit, stdout.ToString(), stderr.ToString());
    }

    /// <summary>An invented site a little over the size from which progress is shown.</summary>
    private string[] LargePlant() =>
        PlantGenerator.Site(4000, seed: 5).Select(file => _folder.Write(Path.Combine("site", file.Name), file.Text)).ToArray();

    [Fact]
    public void A_large_build_on_a_terminal_shows_progress_on_one_line_and_clears_it()
    {
        var result = Run(true, ["build", .. LargePlant(), "-o", _folder.Combine("out")]);

        Assert.Equal(0, result.ExitCode);
        Assert.Contains("\rscalegen: compiling 5 files", result.Error, StringComparison.Ordinal);
        Assert.Contains("4000 points compiled; writing outputs", result.Error, StringComparison.Ordinal);
        Assert.Contains("\rscalegen: writing check-sheets.html (", result.Error, StringComparison.Ordinal);
        // The line is blanked before the summary, which reads as it always does.
        var summary = result.Error[(result.Error.LastIndexOf('\r') + 1)..];
        Assert.StartsWith("wrote ", summary, StringComparison.Ordinal);
        Assert.Equal(Run(false, ["build", .. LargePlant(), "-o", _folder.Combine("out2")]).Error.Replace("out2", "out"), summary);
        Assert.Empty(result.Out);
    }

    [Fact]
    public void Redirected_or_small_builds_show_no_progress()
    {
        var redirected = Run(false, ["build", .. LargePlant(), "-o", _folder.Combine("out")]);
        Assert.Equal(0, redirected.ExitCode);
        Assert.DoesNotContain('\r', redirected.Error);
        Assert.DoesNotContain("scalegen:", redirected.Error, StringComparison.Ordinal);

        var small = Run(true, ["build", .. TestInputs.ExampleFiles, "-o", _folder.Combine("small")]);
        Assert.Equal(0, small.ExitCode);
        Assert.DoesNotContain('\r', small.Error);
    }

    [Fact]
    public void Diagnostics_of_a_large_plant_are_not_mixed_into_the_progress_line()
    {
        var files = LargePlant();
        File.AppendAllText(files[^1], "\npoint BROKEN-1 {\n  range 0 .. 1 bar\n}\n");
        var result = Run(true, ["build", .. files, "-o", _folder.Combine("out")]);

        Assert.Equal(1, result.ExitCode);
        var afterProgress = result.Error[(result.Error.LastIndexOf('\r') + 1)..];
        Assert.Contains("error SG1006", afterProgress, StringComparison.Ordinal);
        Assert.EndsWith("nothing was written\n", afterProgress, StringComparison.Ordinal);
    }

    [Fact]
    public void Verify_of_a_large_plant_on_a_terminal_shows_its_phases_and_sweep_and_clears_the_line()
    {
        var files = PlantGenerator.Site(ProgressLine.LargeVerifyPoints, seed: 7)
            .Select(file => _folder.Write(Path.Combine("verify", file.Name), file.Text)).ToArray();

        var result = Run(true, ["verify", .. files]);

        Assert.Equal(0, result.ExitCode);
        Assert.Contains("\rscalegen: reading and translating the Structured Text", result.Error, StringComparison.Ordinal);
        Assert.Contains("\rscalegen: compiling the translation", result.Error, StringComparison.Ordinal);
        Assert.Contains($"\rscalegen: sweeping point 1 of {ProgressLine.LargeVerifyPoints} (", result.Error, StringComparison.Ordinal);
        // Blanked at the end; the verdict table on stdout is untouched by it.
        Assert.Equal("", result.Error[(result.Error.LastIndexOf('\r') + 1)..]);
        Assert.DoesNotContain('\r', result.Out);
    }
}
