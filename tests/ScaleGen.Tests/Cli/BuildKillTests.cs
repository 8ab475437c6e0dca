using System.Diagnostics;
using ScaleGen.Emit;
using ScaleGen.Samples;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Cli;

/// <summary>
/// A real `scalegen build` process killed while it writes: the earlier outputs must
/// survive byte for byte, and the next build must clean up after the killed one (issue 8).
/// The library tests stop the write protocol at each step deterministically; this one
/// proves it against a real kill, on a plant large enough that the kill lands mid-write.
/// </summary>
public sealed class BuildKillTests : IDisposable
{
    /// <summary>Large enough that writing its outputs (over 100 MB) takes seconds, not milliseconds.</summary>
    private const int Points = 20_000;

    private readonly TempFolder _folder = new();

    public void Dispose() => _folder.Dispose();

    private string[] WriteLargePlant() =>
        PlantGenerator.Site(Points, seed: 11).Select(file => _folder.Write(Path.Combine("large", file.Name), file.Text)).ToArray();

    /// <summary>The built CLI in a process of its own, as CI runs it.</summary>
    private static Process StartBuild(IEnumerable<string> inputs, string output)
    {
        var cli = typeof(ScaleGen.Cli.ScaleGenCli).Assembly.Location;
        var start = new ProcessStartInfo("dotnet")
        {
            RedirectStandardError = true,
            RedirectStandardOutput = true,
            UseShellExecute = false,
        };
        foreach (var argument in new[] { "exec", cli, "build" }.Concat(inputs).Concat(["-o", output])) start.ArgumentList.Add(argument);
        return Process.Start(start) ?? throw new InvalidOperationException("could not start the CLI");
    }

    /// <summary>Bytes written so far into the folder a build fills before the swap, the marker aside.</summary>
    private static long BytesBeingWritten(string temporary)
    {
        try
        {
            return Directory.Exists(temporary)
                ? Directory.GetFiles(temporary).Where(f => Path.GetFileName(f) != OutputWriter.MarkerFileName).Sum(f => new FileInfo(f).Length)
                : 0;
        }
        catch (IOException)
        {
            return 0; // the folder is being created or removed; look again
        }
    }

    [Fact]
    public async Task Killing_a_build_mid_write_leaves_the_earlier_outputs_intact_and_the_next_build_recovers()
    {
        var target = _folder.Combine("out");
        Assert.Equal(0, TestInputs.RunCli(["build", .. TestInputs.ExampleFiles, "-o", target]).ExitCode);
        var earlier = TempFolder.Snapshot(target);
        var temporary = OutputWriter.TemporaryFolderFor(target);
        var large = WriteLargePlant();

        using (var process = StartBuild(large, target))
        {
            // Kill once the new set is being written: a few MB of it are in the temporary folder.
            var watch = Stopwatch.StartNew();
            while (!process.HasExited && BytesBeingWritten(temporary) < 4_000_000 && watch.Elapsed < TimeSpan.FromMinutes(5))
                Thread.Sleep(5);
            Assert.False(process.HasExited, "the build ended before it could be killed mid-write");
            process.Kill(entireProcessTree: true);
            process.WaitForExit();
        }

        // The killed build left its half-written set beside the folder, and the folder untouched.
        Assert.True(BytesBeingWritten(temporary) >= 4_000_000, "the kill did not land while the new outputs were being written");
        TempFolder.AssertSameFiles(earlier, TempFolder.Snapshot(target));

        // The next build, a separate process as in CI, removes the leftovers and writes its set.
        using (var next = StartBuild(TestInputs.ExampleFiles, target))
        {
            using var patience = new CancellationTokenSource(TimeSpan.FromMinutes(2));
            var error = next.StandardError.ReadToEndAsync(patience.Token);
            await next.WaitForExitAsync(patience.Token);
            Assert.True(next.ExitCode == 0, $"the next build failed: {await error}");
        }
        Assert.False(Directory.Exists(temporary), "the next build left the killed build's folder behind");
        Assert.False(Directory.Exists(OutputWriter.SetAsideFolderFor(target)));
        TempFolder.AssertSameFiles(earlier, TempFolder.Snapshot(target));
    }
}
