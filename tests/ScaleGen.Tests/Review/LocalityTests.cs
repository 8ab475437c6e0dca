using System.Globalization;
using System.Text;
using ScaleGen.Emit;
using ScaleGen.Tests.Support;
using Xunit.Abstractions;

namespace ScaleGen.Tests.Review;

/// <summary>
/// Diff-local outputs: changing one point changes only that point's lines in every
/// generated file (and the source hash in its header). Runs over whatever emitters
/// <see cref="OutputCatalog"/> holds, so emitters added later are held to it too.
/// </summary>
public class LocalityTests(ITestOutputHelper output)
{
    /// <summary>
    /// "A handful at most": the lines one setpoint may change in one output file. A setpoint
    /// carries its trip and reset values, currents, volts and raw counts with it, and JSON
    /// written one field per line gives each its own line: up to 8 lines, all of one alarm.
    /// </summary>
    private const int MostChangedLines = 8;

    /// <summary>
    /// All the changed lines of a file lie within one point's share of it (the file's lines
    /// divided by the points, at least 10): they are that point's, not spread over the file.
    /// </summary>
    private static int MostLinesApart(int fileLines, int points) => Math.Max(10, fileLines / points);

    /// <summary>A 30-point plant with a mix of cards, kinds, square-root points, reverse action, alarms and loops.</summary>
    internal static string ThirtyPointPlant(double setpointOfPoint15 = 70)
    {
        static string N(double v) => v.ToString("R", CultureInfo.InvariantCulture);
        var text = new StringBuilder("""
            plant "Locality test plant"
            cycle 100 ms

            card AI16 {
              counts 0 .. 27648 at 4 .. 20 mA
              limits -4864 .. 32511
              fault-code 32767
            }

            card AV15 {
              counts 0 .. 4000 at 1 .. 5 V
              limits -500 .. 4500
              fault-code -32768, 32767
            }

            """);
        text.Append('\n');
        for (var i = 1; i <= 30; i++)
        {
            var kind = i % 5;
            var tag = kind switch { 0 => "FT", 1 => "FIT", 2 => "LT", 3 => "PT", _ => "TT" } + "-" + (100 + i).ToString(CultureInfo.InvariantCulture);
            text.Append($"point {tag} {{\n");
            text.Append($"  desc \"Test point {i}\"\n");
            text.Append(kind == 3 ? $"  card AV15 at \"R2.S1.C{i}\"\n  shunt 250 ohm\n" : $"  card AI16 at \"R1.S{i / 8}.C{i % 8}\"\n");
            text.Append(kind == 2 ? "  range 10 .. 0 m\n" : "  range 0 .. 100 %\n");
            if (kind == 1) text.Append("  sqrt cutoff 3 %\n");
            text.Append("  health ne43\n");
            text.Append(kind switch { 0 or 1 => "  measure flow\n", 2 => "  measure level\n", 3 => "  measure pressure\n", _ => "  measure temperature\n" });
            if (kind == 4) text.Append("  filter 5 s\n");
            var span = kind == 2 ? 10.0 : 100.0;
            var high = i == 15 ? setpointOfPoint15 : 70;
            text.Append($"  alarm HH {N(span * 0.9)} deadband 5 % priority {(i % 7 == 0 ? 1 : 2)} delay 5 s text \"{tag} very high\"\n");
            text.Append($"  alarm H {N(span * high / 100)} deadband 5 % delay 10 s\n");
            text.Append($"  alarm L {N(span * 0.2)} deadband 5 % delay 10 s text \"{tag} low\"\n");
            if (i % 2 == 0)
                text.Append($"  loop {{\n    supply 24 V\n    device 10.5 V\n    cable {100 + 10 * i} m 1.0 mm2\n  }}\n");
            text.Append("}\n\n");
        }
        return text.ToString();
    }

    [Fact]
    public void The_plant_is_thirty_clean_points()
    {
        var compilation = TestInputs.Compile(ThirtyPointPlant());
        Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics));
        Assert.Equal(30, compilation.Plant.Points.Length);
    }

    [Fact]
    public void Changing_one_setpoint_changes_a_handful_of_lines_in_every_output()
    {
        var before = TestInputs.Compile(ThirtyPointPlant(70), "plant.scale");
        var after = TestInputs.Compile(ThirtyPointPlant(75), "plant.scale");
        Assert.False(before.HasErrors || after.HasErrors);
        Assert.Equal(before.Diagnostics.Count, after.Diagnostics.Count);

        // Lines that carry a source hash (whole, or its first 12 digits) change with any edit; the header is allowed that.
        var hashes = before.Plant.Sources.Concat(after.Plant.Sources).Select(s => GeneratedHeader.Sha256(s.Text)[..12]).ToList();
        bool Counted(string line) => !hashes.Any(line.Contains);

        Assert.NotEmpty(OutputCatalog.All);
        var anyChanged = false;
        foreach (var emitter in OutputCatalog.All)
        {
            var oldFiles = emitter.Emit(EmitContext.From(before)).ToDictionary(f => f.RelativePath, f => f.Content, StringComparer.Ordinal);
            var newFiles = emitter.Emit(EmitContext.From(after)).ToDictionary(f => f.RelativePath, f => f.Content, StringComparer.Ordinal);
            Assert.Equal(oldFiles.Keys.Order(StringComparer.Ordinal), newFiles.Keys.Order(StringComparer.Ordinal));
            foreach (var path in oldFiles.Keys.Order(StringComparer.Ordinal))
            {
                var oldLines = oldFiles[path].Split('\n').Where(Counted).ToArray();
                var newLines = newFiles[path].Split('\n').Where(Counted).ToArray();
                var (deleted, inserted, apart) = LineDiff.Count(oldLines, newLines);
                var changed = Math.Max(deleted, inserted);
                output.WriteLine($"{emitter.Kind}: {path}: {changed} changed lines ({deleted} deleted, {inserted} inserted) within {apart} lines, of {newLines.Length}");
                Assert.True(changed <= MostChangedLines,
                    $"{emitter.Kind} output {path}: one setpoint changed {changed} lines (at most {MostChangedLines}): order and lay out the output so a point's change stays in that point's lines");
                var most = MostLinesApart(newLines.Length, after.Plant.Points.Length);
                Assert.True(apart <= most,
                    $"{emitter.Kind} output {path}: one setpoint changed lines {apart} lines apart (at most {most}, one point's share of the file): a point's change must stay in that point's lines");
                anyChanged |= changed > 0;
            }
        }
        Assert.True(anyChanged, "no output changed at all when a setpoint moved");
    }

    [Fact]
    public void The_line_count_is_a_real_diff()
    {
        Assert.Equal((0, 0, 0), LineDiff.Count(new[] { "a", "b" }, new[] { "a", "b" }));
        Assert.Equal((1, 1, 1), LineDiff.Count(new[] { "a", "b", "c" }, new[] { "a", "x", "c" }));
        Assert.Equal((0, 2, 2), LineDiff.Count(new[] { "a", "c" }, new[] { "a", "b", "b2", "c" }));
        // a moved line is one deletion and one insertion, not a changed file; but the changes are 4 lines apart
        Assert.Equal((1, 1, 4), LineDiff.Count(new[] { "a", "b", "c", "d" }, new[] { "b", "c", "d", "a" }));
    }
}

/// <summary>
/// Counts deleted and inserted lines between two texts (longest common subsequence, as a
/// line diff does), and how far apart the changes are: the length of the stretch between
/// the common head and the common tail.
/// </summary>
internal static class LineDiff
{
    public static (int Deleted, int Inserted, int Apart) Count(IReadOnlyList<string> oldLines, IReadOnlyList<string> newLines)
    {
        // The common head and tail are most of a file; only the middle needs the quadratic table.
        var head = 0;
        while (head < oldLines.Count && head < newLines.Count && oldLines[head] == newLines[head]) head++;
        var tail = 0;
        while (tail < oldLines.Count - head && tail < newLines.Count - head && oldLines[^(tail + 1)] == newLines[^(tail + 1)]) tail++;
        var a = oldLines.Skip(head).Take(oldLines.Count - head - tail).ToArray();
        var b = newLines.Skip(head).Take(newLines.Count - head - tail).ToArray();

        var lcs = new int[a.Length + 1, b.Length + 1];
        for (var i = a.Length - 1; i >= 0; i--)
            for (var j = b.Length - 1; j >= 0; j--)
                lcs[i, j] = a[i] == b[j] ? lcs[i + 1, j + 1] + 1 : Math.Max(lcs[i + 1, j], lcs[i, j + 1]);
        var common = lcs[0, 0];
        return (a.Length - common, b.Length - common, Math.Max(a.Length, b.Length));
    }
}
