using System.Diagnostics;
using System.Text;
using ScaleGen.Emit;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Cli;

/// <summary>
/// A real `scalegen build` process killed while it writes: the earlier outputs must
/// survive whole (issue 8). The library tests stop the protocol at each step
/// deterministically; this one proves it against a real kill.
/// </summary>
public sealed class BuildKillTests : IDisposable
{
    private const int Points = 1000;

    private readonly TempFolder _folder = new();

    public void Dispose() => _folder.Dispose();

    /// <summary>An invented plant large enough that emitting it takes a visible moment.</summary>
    private static string LargePlant()
    {
        var text = new StringBuilder(TestInputs.StandardCard).Append('\n');
        for (var i = 1; i <= Points; i++)
        {
            text.Append($"point PT-{i} {{\n  desc \"Test pressure {i}\"\n  card AI16 at \"R{i / 16}.C{i % 16}\"\n");
            text.Append($"  range 0 .. {100 + i} kPa\n  health ne43\n  alarm H {90 + i} deadband 2 %\n  alarm L 5 deadband 2 %\n}}\n");
        }
        return text.ToString();
    }

    private static Process StartBuild(string input, string output)
    {
        var cli = typeof(ScaleGen.Cli.ScaleGenCli).Assembly.Location;
        var start = new ProcessStartInfo("dotnet")
        {
            RedirectStandardError = true,
            RedirectStandardOutput = true,
            UseShellExecute = false,
        };
        foreach (var argument in new[] { cli, "build", input, "-o", output }) start.ArgumentList.Add(argument);
        return Process.Start(start) ?? throw new InvalidOperationException("could not start the CLI");
    }

    [Fact]
    public void Killing_a_build_mid_write_leaves_the_earlier_outputs_intact()
    {
        var target = _folder.Combine("out");
        Assert.Equal(0, TestInputs.RunCli(["build", .. TestInputs.ExampleFiles, "-o", target]).ExitCode);
        var earlier = TempFolder.Snapshot(target);

        var large = _folder.Write("large.scale", LargePlant());
        var complete = _folder.Combine("complete");
        Assert.Equal(0, TestInputs.RunCli("build", large, "-o", complete).ExitCode);
        var later = TempFolder.Snapshot(complete);

        var temporary = OutputWriter.TemporaryFolderFor(target);
        var killedMidWrite = 0;
        for (var attempt = 0; attempt < 2; attempt++)
        {
            using var process = StartBuild(large, target);
            // Kill as soon as the new set is being written: the temporary folder exists.
            var watch = Stopwatch.StartNew();
            while (!process.HasExited && !Directory.Exists(temporary) && watch.Elapsed < TimeSpan.FromSeconds(60))
                Thread.Sleep(1);
            if (!process.HasExited)
            {
                process.Kill(entireProcessTree: true);
                killedMidWrite++;
            }
            process.WaitForExit();

            // At every instant the folder is the earlier set, or missing with the earlier set
            // set aside (restored by the next run), or the complete new set.
            OutputWriter.Recover(target);
            var now = TempFolder.Snapshot(target);
            var isEarlier = now.Keys.SequenceEqual(earlier.Keys) && now.All(f => f.Value.AsSpan().SequenceEqual(earlier[f.Key]));
            var isLater = now.Keys.SequenceEqual(later.Keys) && now.All(f => f.Value.AsSpan().SequenceEqual(later[f.Key]));
            Assert.True(isEarlier || isLater, $"attempt {attempt}: the output folder holds a mix: {string.Join(", ", now.Keys)}");
            if (isLater) TestInputs.RunCli(["build", .. TestInputs.ExampleFiles, "-o", target]); // start again from the earlier set
            Assert.False(Directory.Exists(temporary));
        }
        Assert.True(killedMidWrite > 0, "no attempt was killed while writing");
    }
}
