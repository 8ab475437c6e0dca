using ScaleGen.Emit;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Emit.StructuredText;

public class StDiffLocalityTests
{
    private static string PlantText(IEnumerable<SourceText> sources)
    {
        var compilation = Compilation.Compile(sources.ToArray());
        Assert.False(compilation.HasErrors);
        return new StructuredTextEmitter().Emit(EmitContext.From(compilation)).Single(f => f.RelativePath == StNames.PlantFile).Content;
    }

    [Theory]
    [InlineData("intake.scale", "alarm H 13.5 deadband 5 %", "alarm H 13.0 deadband 5 %", "LT-101")]
    [InlineData("treatment.scale", "alarm H 280 deadband 5 % delay 15 s text \"Filter 2", "alarm H 250 deadband 5 % delay 20 s text \"Filter 2", "FIT-202")]
    public void Changing_one_setpoint_changes_only_that_points_lines_and_the_header(string file, string from, string to, string tag)
    {
        var sources = TestInputs.ExampleFiles.Select(SourceText.FromFile).ToList();
        var before = PlantText(sources);
        var index = sources.FindIndex(s => Path.GetFileName(s.Path) == file);
        Assert.Contains(from, sources[index].Text);
        sources[index] = new SourceText(sources[index].Path, sources[index].Text.Replace(from, to, StringComparison.Ordinal));
        var after = PlantText(sources);

        var oldLines = before.Split('\n');
        var newLines = after.Split('\n');
        Assert.Equal(oldLines.Length, newLines.Length);
        var headerEnd = Array.IndexOf(oldLines, "*)"); // end of the generated header
        var banner = oldLines.Select((l, i) => (l, i)).Where(x => x.l.StartsWith("(* ====", StringComparison.Ordinal)).Select(x => x.i).ToList();
        var start = Array.FindIndex(oldLines, l => l.StartsWith($"(* {tag}: ", StringComparison.Ordinal));
        var end = banner.First(b => b > start);
        var changed = Enumerable.Range(0, oldLines.Length).Where(i => oldLines[i] != newLines[i]).ToList();

        Assert.NotEmpty(changed);
        Assert.All(changed, i => Assert.True(
            i < headerEnd || (i > start && i < end),
            $"line {i + 1} changed outside {tag}'s section: {newLines[i]}"));
        Assert.Contains(changed, i => i > start); // the point's own lines did change
    }
}
