using ScaleGen.Emit;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit;

/// <summary>The all-or-nothing protocol of <see cref="OutputWriter"/>, driven through the library API.</summary>
public sealed class OutputWriterTests : IDisposable
{
    private readonly TempFolder _folder = new();
    private readonly string _target;

    public OutputWriterTests() => _target = _folder.Combine("out");

    public void Dispose() => _folder.Dispose();

    private static readonly GeneratedFile[] OldSet = [new("a.txt", "old a\n"), new("sub/b.txt", "old b\n")];
    private static readonly GeneratedFile[] NewSet = [new("a.txt", "new a\n"), new("c.txt", "new c\n"), new("sub/d.txt", "new d\n")];

    private SortedDictionary<string, byte[]> Snapshot() => TempFolder.Snapshot(_target);

    private static SortedDictionary<string, byte[]> Expected(IEnumerable<GeneratedFile> files)
    {
        var expected = new SortedDictionary<string, byte[]>(StringComparer.Ordinal);
        foreach (var file in files) expected[file.RelativePath] = System.Text.Encoding.UTF8.GetBytes(file.Content);
        return expected;
    }

    /// <summary>Nothing but the output folder itself is left beside it: no temporary, set-aside or lock files.</summary>
    private void AssertNoLeftovers() =>
        Assert.Equal(Directory.Exists(_target) ? ["out"] : [],
            Directory.GetFileSystemEntries(_folder.Path).Select(p => Path.GetFileName(p)).ToArray());

    private static IEnumerable<GeneratedFile> ThrowingAfterOne()
    {
        yield return new GeneratedFile("a.txt", "half of a new set\n");
        throw new InvalidOperationException("emitter failed mid-way");
    }

    private sealed class FailingEmitter : IOutputEmitter
    {
        public string Kind => "failing";

        public IEnumerable<GeneratedFile> Emit(EmitContext context)
        {
            yield return new GeneratedFile("failing.txt", "first file\n");
            throw new InvalidOperationException("this emitter breaks after one file");
        }
    }

    [Fact]
    public void Writes_every_file_and_the_marker()
    {
        var written = OutputWriter.Write(_target, OldSet);
        Assert.Equal(["a.txt", "sub/b.txt"], written.Select(w => w.RelativePath).ToArray());
        Assert.Equal([6L, 6L], written.Select(w => w.Bytes).ToArray());
        var snapshot = Snapshot();
        Assert.True(snapshot.ContainsKey(OutputWriter.MarkerFileName));
        snapshot.Remove(OutputWriter.MarkerFileName);
        TempFolder.AssertSameFiles(Expected(OldSet), snapshot);
        AssertNoLeftovers();
    }

    [Fact]
    public void Replaces_an_earlier_output_whole()
    {
        OutputWriter.Write(_target, OldSet);
        OutputWriter.Write(_target, NewSet);
        var snapshot = Snapshot();
        snapshot.Remove(OutputWriter.MarkerFileName);
        TempFolder.AssertSameFiles(Expected(NewSet), snapshot); // sub/b.txt of the old set is gone
        AssertNoLeftovers();
    }

    [Fact]
    public void A_sequence_that_throws_mid_way_leaves_the_folder_untouched()
    {
        OutputWriter.Write(_target, OldSet);
        var before = Snapshot();
        var thrown = Assert.Throws<InvalidOperationException>(() => OutputWriter.Write(_target, ThrowingAfterOne()));
        Assert.Equal("emitter failed mid-way", thrown.Message);
        TempFolder.AssertSameFiles(before, Snapshot());
        AssertNoLeftovers();
    }

    [Fact]
    public void A_failing_emitter_leaves_the_folder_untouched()
    {
        var context = EmitContext.From(TestInputs.CompileExample());
        OutputWriter.Build(context, OutputCatalog.All, _target);
        var before = Snapshot();
        Assert.Throws<InvalidOperationException>(() =>
            OutputWriter.Build(context, [.. OutputCatalog.All, new FailingEmitter()], _target));
        TempFolder.AssertSameFiles(before, Snapshot());
        AssertNoLeftovers();
    }

    [Fact]
    public void A_failing_first_build_leaves_no_folder()
    {
        Assert.Throws<InvalidOperationException>(() => OutputWriter.Write(_target, ThrowingAfterOne()));
        Assert.False(Directory.Exists(_target));
        AssertNoLeftovers();
    }

    [Theory]
    [InlineData(nameof(WriteStep.FileWritten), 1)]
    [InlineData(nameof(WriteStep.FileWritten), 3)]
    [InlineData(nameof(WriteStep.MovedAside), 1)]
    [InlineData(nameof(WriteStep.Swapped), 1)]
    public void Killed_at_any_step_the_next_run_finds_a_complete_set(string stepName, int occurrence)
    {
        var step = Enum.Parse<WriteStep>(stepName);
        OutputWriter.Write(_target, OldSet);
        var old = Snapshot();
        var seen = 0;
        var result = OutputWriter.Write(_target, NewSet, s => s == step && ++seen == occurrence);
        Assert.Null(result); // stopped as if killed: no clean-up ran

        var afterKill = Snapshot();
        switch (step)
        {
            case WriteStep.FileWritten: TempFolder.AssertSameFiles(old, afterKill); break;
            case WriteStep.MovedAside: Assert.False(Directory.Exists(_target)); break; // between the two renames
            case WriteStep.Swapped: Assert.Equal(NewSet.Length + 1, afterKill.Count); break;
        }

        OutputWriter.Recover(_target); // what the next build does first
        var recovered = Snapshot();
        if (step == WriteStep.Swapped)
        {
            recovered.Remove(OutputWriter.MarkerFileName);
            TempFolder.AssertSameFiles(Expected(NewSet), recovered);
        }
        else TempFolder.AssertSameFiles(old, recovered);
        AssertNoLeftovers();

        OutputWriter.Write(_target, NewSet);
        var final = Snapshot();
        final.Remove(OutputWriter.MarkerFileName);
        TempFolder.AssertSameFiles(Expected(NewSet), final);
        AssertNoLeftovers();
    }

    [Fact]
    public void A_write_recovers_before_it_starts()
    {
        OutputWriter.Write(_target, OldSet);
        var old = Snapshot();
        OutputWriter.Write(_target, NewSet, s => s == WriteStep.MovedAside);
        Assert.False(Directory.Exists(_target));
        // The next build fails, but first it has put the earlier outputs back.
        Assert.Throws<InvalidOperationException>(() => OutputWriter.Write(_target, ThrowingAfterOne()));
        TempFolder.AssertSameFiles(old, Snapshot());
        AssertNoLeftovers();
    }

    [Fact]
    public void Refuses_a_folder_of_someone_elses_files()
    {
        _folder.Write("out/notes.txt", "mine\n");
        var before = Snapshot();
        var problem = Assert.Throws<OutputFolderException>(() => OutputWriter.Write(_target, NewSet));
        Assert.Contains("did not write", problem.Message);
        Assert.DoesNotContain('\n', problem.Message);
        TempFolder.AssertSameFiles(before, Snapshot());
        AssertNoLeftovers();
    }

    [Fact]
    public void Takes_an_empty_folder()
    {
        Directory.CreateDirectory(_target);
        OutputWriter.Write(_target, NewSet);
        Assert.Equal(NewSet.Length + 1, Snapshot().Count);
    }

    [Fact]
    public void Refuses_a_file_in_the_way()
    {
        _folder.Write("out", "a file\n");
        Assert.Throws<OutputFolderException>(() => OutputWriter.Write(_target, NewSet));
        Assert.Equal("a file\n", File.ReadAllText(_target));
        var problem = Assert.Throws<OutputFolderException>(() => OutputWriter.Write(Path.Combine(_target, "deeper"), NewSet));
        Assert.Contains("is a file, not a folder", problem.Message);
    }

    [Fact]
    public void Creates_missing_parent_folders() =>
        Assert.Equal(2, OutputWriter.Write(_folder.Combine("a", "b", "out"), OldSet).Count);

    [Fact]
    public void Does_not_touch_a_left_over_folder_it_did_not_write()
    {
        var stranger = OutputWriter.SetAsideFolderFor(_target);
        Directory.CreateDirectory(stranger);
        File.WriteAllText(Path.Combine(stranger, "keep.txt"), "keep\n");
        Assert.Throws<OutputFolderException>(() => OutputWriter.Write(_target, NewSet));
        Assert.Equal("keep\n", File.ReadAllText(Path.Combine(stranger, "keep.txt")));
    }

    [Fact]
    public void Two_writes_never_share_a_folder()
    {
        var lockPath = Path.Combine(_folder.Path, ".out.scalegen-lock");
        using (new FileStream(lockPath, FileMode.Create, FileAccess.ReadWrite, FileShare.None))
        {
            Assert.Throws<OutputFolderException>(() => OutputWriter.Write(_target, NewSet));
        }
        File.Delete(lockPath);
        OutputWriter.Write(_target, NewSet);
    }

    [Theory]
    [InlineData("../escape.txt")]
    [InlineData("/abs.txt")]
    [InlineData("")]
    [InlineData("a//b.txt")]
    [InlineData(OutputWriter.MarkerFileName)]
    public void Emitter_paths_must_stay_inside_the_folder(string path)
    {
        OutputWriter.Write(_target, OldSet);
        var before = Snapshot();
        Assert.Throws<InvalidOperationException>(() => OutputWriter.Write(_target, [new GeneratedFile(path, "x")]));
        TempFolder.AssertSameFiles(before, Snapshot());
        AssertNoLeftovers();
    }

    [Fact]
    public void Two_outputs_may_not_claim_one_file() =>
        Assert.Throws<InvalidOperationException>(() => OutputWriter.Write(_target, [new GeneratedFile("a.txt", "1"), new GeneratedFile("a.txt", "2")]));
}
