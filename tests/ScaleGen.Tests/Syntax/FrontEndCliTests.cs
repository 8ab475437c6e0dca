using System.Text;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Syntax;

/// <summary>
/// The <c>check</c> and <c>fmt</c> commands as a user runs them: exit codes 0 (clean or
/// warnings), 1 (errors, unformatted files), 2 (usage, missing or unreadable file), and
/// never a stack trace.
/// </summary>
public class FrontEndCliTests
{
    private const string Clean = TestInputs.StandardCard + "\n\npoint FT-101 {\n  card AI16\n  range 0 .. 450 m3/h\n  health ne43\n}\n";

    /// <summary>The same plant in a layout fmt would change.</summary>
    private const string Unformatted = "card AI16 { counts 0 .. 27648 at 4 .. 20 mA; limits -4864..32511; fault-code 32767 }\n" +
                                       "point FT-101 {\n\tcard AI16 ; range 0..450m3/h\n  health ne43 }\n";

    private const string WarningsOnly = TestInputs.StandardCard + "\n\npoint FT-101 {\n  card AI16\n  range 0 .. 450 m3/h\n}\n";

    private static CliResult Run(params string[] args)
    {
        var result = TestInputs.RunCli(args);
        AssertNoStackTrace(result);
        return result;
    }

    private static void AssertNoStackTrace(CliResult result)
    {
        foreach (var output in new[] { result.Out, result.Error })
        {
            Assert.DoesNotContain("   at ", output, StringComparison.Ordinal);
            Assert.DoesNotContain("Exception", output, StringComparison.Ordinal);
            Assert.DoesNotContain("internal error", output, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Check_exits_0_on_a_clean_file_and_prints_nothing()
    {
        using var folder = new TempFolder();
        var result = Run("check", folder.Write("clean.scale", Clean));
        Assert.Equal(0, result.ExitCode);
        Assert.Equal("", result.Out);
        Assert.Equal("1 point checked: 0 errors, 0 warnings\n", result.Error);
    }

    [Fact]
    public void Check_exits_0_on_warnings_and_prints_them()
    {
        using var folder = new TempFolder();
        var path = folder.Write("warn.scale", WarningsOnly);
        var result = Run("check", path);
        Assert.Equal(0, result.ExitCode);
        Assert.StartsWith(path + "(7,7): warning SG2008: ", result.Out, StringComparison.Ordinal);
        Assert.Contains("0 errors, 1 warning", result.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("text")]
    [InlineData("json")]
    [InlineData("sarif")]
    public void Check_exits_1_on_errors_in_every_format(string format)
    {
        using var folder = new TempFolder();
        var result = Run("check", "--format", format, folder.Write("bad.scale", BadFiles.ManyMistakes));
        Assert.Equal(1, result.ExitCode);
        Assert.Contains("SG1022", result.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_exits_1_on_binary_garbage_without_a_stack_trace()
    {
        using var folder = new TempFolder();
        var path = Path.Combine(folder.Path, "garbage.scale");
        File.WriteAllBytes(path, new byte[] { 0x00, 0xFF, 0xFE, 0x7B, 0x0A, 0xC3, 0x28, 0x22, 0x7D, 0x7D, 0x01 });
        var result = Run("check", path);
        Assert.Equal(1, result.ExitCode);
        Assert.Contains("error SG0001", result.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_reads_every_scale_file_in_a_folder_as_one_plant()
    {
        using var folder = new TempFolder();
        folder.Write("cards.scale", TestInputs.StandardCard + "\n");
        folder.Write("points.scale", "point FT-101 {\n  card AI16\n  range 0 .. 450 m3/h\n  health ne43\n}\n");
        var result = Run("check", folder.Path);
        Assert.Equal(0, result.ExitCode);
        Assert.Equal("", result.Out);
    }

    [Theory]
    [InlineData("check")]
    [InlineData("fmt")]
    public void A_missing_file_exits_2_with_one_line(string command)
    {
        using var folder = new TempFolder();
        var missing = Path.Combine(folder.Path, "nowhere.scale");
        var result = Run(command, missing);
        Assert.Equal(2, result.ExitCode);
        Assert.Equal($"scalegen: cannot read '{missing}': no such file\n", result.Error);
        Assert.Equal("", result.Out);
    }

    [Fact]
    public void A_folder_without_scale_files_exits_2()
    {
        using var folder = new TempFolder();
        var result = Run("check", folder.Path);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("no .scale files", result.Error, StringComparison.Ordinal);
    }

    [Fact]
    public void A_path_the_system_cannot_read_exits_2()
    {
        var result = Run("check", "bad\0name.scale");
        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("scalegen: cannot read", result.Error, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData]
    [InlineData("check")]
    [InlineData("fmt")]
    [InlineData("check", "--format", "xml", "x.scale")]
    [InlineData("check", "--bogus", "x.scale")]
    [InlineData("fmt", "--check", "--nonsense", "x.scale")]
    [InlineData("frobnicate", "x.scale")]
    public void Usage_errors_exit_2(params string[] args)
    {
        var result = Run(args);
        Assert.Equal(2, result.ExitCode);
        Assert.NotEqual("", result.Error);
    }

    [Fact]
    public void Fmt_check_exits_1_on_an_unformatted_copy_and_changes_nothing()
    {
        using var folder = new TempFolder();
        var path = folder.Write("messy.scale", Unformatted);
        var result = Run("fmt", "--check", path);
        Assert.Equal(1, result.ExitCode);
        Assert.Contains(path + ": not in canonical layout", result.Error, StringComparison.Ordinal);
        Assert.Equal("", result.Out);
        Assert.Equal(Unformatted, File.ReadAllText(path));
    }

    [Fact]
    public void Fmt_check_exits_0_on_formatted_files()
    {
        var result = Run(new[] { "fmt", "--check" }.Concat(TestInputs.ExampleFiles).ToArray());
        Assert.Equal(0, result.ExitCode);
        Assert.Equal("", result.Error);
    }

    [Fact]
    public void Fmt_write_rewrites_the_file_into_canonical_layout()
    {
        using var folder = new TempFolder();
        var path = folder.Write("messy.scale", Unformatted);
        var written = Run("fmt", "--write", path);
        Assert.Equal(0, written.ExitCode);
        Assert.Equal("", written.Out);
        Assert.Equal(Clean, File.ReadAllText(path, Encoding.UTF8));
        Assert.Equal(0, Run("fmt", "--check", path).ExitCode);
        Assert.Equal(0, Run("check", path).ExitCode);
    }

    [Fact]
    public void Fmt_prints_the_canonical_layout_to_stdout_without_touching_the_file()
    {
        using var folder = new TempFolder();
        var path = folder.Write("messy.scale", Unformatted);
        var result = Run("fmt", path);
        Assert.Equal(0, result.ExitCode);
        Assert.Equal(Clean, result.Out);
        Assert.Equal(Unformatted, File.ReadAllText(path));
    }

    [Fact]
    public void Fmt_refuses_a_file_with_syntax_errors_and_leaves_it_alone()
    {
        using var folder = new TempFolder();
        var path = folder.Write("bad.scale", BadFiles.ManyMistakes);
        var result = Run("fmt", "--write", path);
        Assert.Equal(1, result.ExitCode);
        Assert.Contains("error SG0010", result.Error, StringComparison.Ordinal);
        Assert.Contains("not formatted", result.Error, StringComparison.Ordinal);
        Assert.Equal(BadFiles.ManyMistakes, File.ReadAllText(path));
    }
}
