using ScaleGen.Emit;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Cli;

/// <summary>`scalegen build` end to end, in-process.</summary>
public sealed class BuildCommandTests : IDisposable
{
    private readonly TempFolder _folder = new();
    private readonly string _target;

    public BuildCommandTests() => _target = _folder.Combine("out");

    public void Dispose() => _folder.Dispose();

    private CliResult Build(params string[] extra) =>
        TestInputs.RunCli(["build", .. TestInputs.ExampleFiles, "-o", _target, .. extra]);

    /// <summary>What every emitter in the catalog produces for the example, plus the marker.</summary>
    private static SortedDictionary<string, byte[]> ExpectedExampleFiles(Func<IOutputEmitter, bool> selected)
    {
        var context = EmitContext.From(TestInputs.CompileExample());
        var expected = new SortedDictionary<string, byte[]>(StringComparer.Ordinal);
        foreach (var file in OutputCatalog.All.Where(selected).SelectMany(e => e.Emit(context)))
            expected[file.RelativePath] = System.Text.Encoding.UTF8.GetBytes(file.Content);
        return expected;
    }

    private SortedDictionary<string, byte[]> OutputsWithoutMarker()
    {
        var snapshot = TempFolder.Snapshot(_target);
        Assert.True(snapshot.Remove(OutputWriter.MarkerFileName), "the marker file is missing");
        return snapshot;
    }

    [Fact]
    public void Writes_every_output_of_the_catalog()
    {
        var result = Build();
        Assert.True(result.ExitCode == 0, result.Error);
        Assert.Equal("", result.Out);
        var expected = ExpectedExampleFiles(_ => true);
        Assert.Contains("alarms.json", expected.Keys);
        TempFolder.AssertSameFiles(expected, OutputsWithoutMarker());
        SchemaFiles.AssertValid(SchemaFiles.Alarms, File.ReadAllText(Path.Combine(_target, "alarms.json")));
        // One line per file on stderr, nothing else (the example has no warnings).
        var lines = result.Error.TrimEnd('\n').Split('\n');
        Assert.Equal(expected.Count, lines.Length);
        Assert.Contains($"wrote {Path.Combine(_target, "alarms.json")} ({expected["alarms.json"].Length} bytes)", lines);
    }

    [Fact]
    public void Only_selects_output_kinds()
    {
        var result = Build("--only", "alarms");
        Assert.True(result.ExitCode == 0, result.Error);
        TempFolder.AssertSameFiles(ExpectedExampleFiles(e => e.Kind == "alarms"), OutputsWithoutMarker());
        Assert.Equal(["alarms.json"], OutputsWithoutMarker().Keys.ToArray());
    }

    [Fact]
    public void Only_accepts_spaces_and_repeats()
    {
        var result = Build("--only", " alarms , alarms,");
        Assert.True(result.ExitCode == 0, result.Error);
        Assert.Equal(["alarms.json"], OutputsWithoutMarker().Keys.ToArray());
    }

    [Theory]
    [InlineData("nonsense")]
    [InlineData("alarms,nonsense")]
    [InlineData("ALARMS")]
    public void Unknown_kind_is_a_usage_error_listing_the_known_ones(string only)
    {
        var result = Build("--only", only);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("known kinds: " + string.Join(", ", OutputCatalog.All.Select(e => e.Kind)), result.Error);
        Assert.False(Directory.Exists(_target));
    }

    [Fact]
    public void Empty_only_is_a_usage_error() =>
        Assert.Equal(2, Build("--only", " , ").ExitCode);

    [Fact]
    public void Output_folder_is_required() =>
        Assert.Equal(2, TestInputs.RunCli(["build", .. TestInputs.ExampleFiles]).ExitCode);

    [Fact]
    public void An_input_error_leaves_the_folder_byte_identical()
    {
        Assert.Equal(0, Build().ExitCode);
        var before = TempFolder.Snapshot(_target);
        var broken = _folder.Write("broken.scale", "point X-1 { card nowhere at \"a\"; range 0 .. 1 m }\n");
        var result = TestInputs.RunCli(["build", .. TestInputs.ExampleFiles, broken, "-o", _target]);
        Assert.Equal(1, result.ExitCode);
        Assert.Contains("nothing was written", result.Error);
        TempFolder.AssertSameFiles(before, TempFolder.Snapshot(_target));
        Assert.Equal(["broken.scale", "out"], Directory.GetFileSystemEntries(_folder.Path).Select(p => Path.GetFileName(p)).Order(StringComparer.Ordinal).ToArray());
    }

    [Fact]
    public void Two_runs_and_de_DE_give_the_same_bytes()
    {
        Assert.Equal(0, Build().ExitCode);
        var first = TempFolder.Snapshot(_target);
        Assert.Equal(0, Build().ExitCode);
        TempFolder.AssertSameFiles(first, TempFolder.Snapshot(_target));
        var german = TestInputs.UnderCulture("de-DE", () => Build());
        Assert.Equal(0, german.ExitCode);
        TempFolder.AssertSameFiles(first, TempFolder.Snapshot(_target));
    }

    [Fact]
    public void Refuses_to_replace_someone_elses_folder()
    {
        var notes = _folder.Write("out/notes.txt", "my notes\n");
        var result = Build();
        Assert.Equal(2, result.ExitCode);
        Assert.Single(result.Error.TrimEnd('\n').Split('\n'));
        Assert.Contains("did not write", result.Error);
        Assert.Equal("my notes\n", File.ReadAllText(notes));
        Assert.Equal(["notes.txt"], Directory.GetFiles(_target).Select(p => Path.GetFileName(p)).ToArray());
    }

    [Fact]
    public void Refuses_an_output_folder_that_holds_an_input()
    {
        Assert.Equal(0, Build().ExitCode);
        var input = _folder.Write("out/inside.scale", TestInputs.StandardCard + "\npoint P-1 { card AI16 at \"a\"; range 0 .. 1 m; health ne43 }\n");
        var result = TestInputs.RunCli("build", input, "-o", _target);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("holds the input file", result.Error);
        Assert.True(File.Exists(input));
    }

    [Fact]
    public void Unwritable_path_is_one_line_and_exit_2()
    {
        var file = _folder.Write("plain-file", "x\n");
        var result = TestInputs.RunCli(["build", .. TestInputs.ExampleFiles, "-o", Path.Combine(file, "out")]);
        Assert.Equal(2, result.ExitCode);
        Assert.Single(result.Error.TrimEnd('\n').Split('\n'));
        Assert.StartsWith("scalegen: cannot write outputs to", result.Error);
        Assert.DoesNotContain("   at ", result.Error);
    }

    [Fact]
    public void Warnings_are_printed_and_the_build_goes_on()
    {
        var file = _folder.Write("warn.scale", TestInputs.StandardCard + "\npoint P-1 { card AI16 at \"a\"; range 0 .. 1 m }\n");
        var result = TestInputs.RunCli("build", file, "-o", _target);
        Assert.Equal(0, result.ExitCode);
        Assert.Contains("warning SG", result.Error);
        Assert.True(File.Exists(Path.Combine(_target, "alarms.json")));
    }
}
