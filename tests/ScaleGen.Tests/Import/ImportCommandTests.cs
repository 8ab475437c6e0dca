using ScaleGen.Tests.Support;
using static ScaleGen.Tests.Import.ImportCases;

namespace ScaleGen.Tests.Import;

public class ImportCommandTests
{
    [Fact]
    public void Import_then_check_with_the_cards_passes()
    {
        using var scratch = new ScratchFolder();
        var output = scratch.File("sludge.scale");

        var import = TestInputs.RunCli("import", IoListFile, "--cards", CardsFile, "-o", output);
        var check = TestInputs.RunCli("check", CardsFile, output);

        Assert.Equal(0, import.ExitCode);
        Assert.Equal("", import.Out);
        Assert.Contains("imported 200 points from", import.Error);
        Assert.Equal(0, check.ExitCode);
        Assert.Equal("", check.Out);
        Assert.Contains("200 points checked: 0 errors, 0 warnings", check.Error);
    }

    [Fact]
    public void Without_an_output_file_the_text_goes_to_stdout()
    {
        using var scratch = new ScratchFolder();
        var csv = scratch.Write("list.csv", Lines(Header, GoodRow));

        var result = TestInputs.RunCli("import", csv);

        Assert.Equal(0, result.ExitCode);
        Assert.Contains("point PT-901 {", result.Out);
        Assert.Contains("card and profile names were not checked", result.Error);
    }

    [Fact]
    public void A_bad_row_writes_nothing_and_names_row_and_column()
    {
        using var scratch = new ScratchFolder();
        var csv = scratch.Write("io-list.csv", Lines(Header, GoodRow, IoListImportTests.WithCell(IoListImportTests.WithCell(GoodRow, "tag", "PT-902"), "lrv", "abc")));
        var output = scratch.File("out.scale");

        var result = TestInputs.RunCli("import", csv, "--cards", CardsFile, "-o", output);

        Assert.Equal(1, result.ExitCode);
        Assert.Contains($"{csv}(row 3, column G 'lrv'): error SG3004: 'abc' is not a number", result.Error);
        Assert.Contains("nothing was written", result.Error);
        Assert.Equal("", result.Out);
        Assert.False(File.Exists(output));
        Assert.Empty(Directory.GetFiles(scratch.Path, "*.scale"));
    }

    [Fact]
    public void A_bad_row_leaves_an_earlier_output_untouched()
    {
        using var scratch = new ScratchFolder();
        var csv = scratch.Write("io-list.csv", Lines(Header, IoListImportTests.WithCell(GoodRow, "urv", "\"1,5\"")));
        var output = scratch.Write("out.scale", "# the previous import\n");

        var result = TestInputs.RunCli("import", csv, "-o", output);

        Assert.Equal(1, result.ExitCode);
        Assert.Contains("(row 2, column H 'urv'): error SG3005: '1,5' has a comma in a number", result.Error);
        Assert.Equal("# the previous import\n", File.ReadAllText(output));
        Assert.Equal(2, Directory.GetFiles(scratch.Path).Length); // the list and the old output: no temporary file left
    }

    [Fact]
    public void Header_mappings_come_from_the_option_and_from_a_file()
    {
        using var scratch = new ScratchFolder();
        var csv = scratch.Write("foreign.csv", Lines(
            "Tag No.,Service,Card,Channel,\"Range, low\",\"Range, high\",Units,Health",
            "PT-901,Test pressure,ai_4_20,R9.S1.C0,0,10,bar,ne43"));
        var mapFile = scratch.Write("map.csv", Lines("header,column", "\"Range, low\",lrv", "\"Range, high\",urv"));

        var result = TestInputs.RunCli("import", csv, "--map", "Tag No.=tag,Service=description", "--map", "Channel=address,Units=unit",
            "--map-file", mapFile, "--cards", CardsFile);

        Assert.Equal(0, result.ExitCode);
        Assert.Contains("range 0 .. 10 bar", result.Out);
        Assert.Contains("desc \"Test pressure\"", result.Out);
    }

    [Theory]
    [InlineData("--map", "Tag No.=tagg")]
    [InlineData("--map", "no equals sign")]
    [InlineData("--delimiter", "x")]
    public void A_bad_option_is_a_usage_error(string option, string value)
    {
        using var scratch = new ScratchFolder();
        var csv = scratch.Write("list.csv", Lines(Header, GoodRow));

        var result = TestInputs.RunCli("import", csv, option, value);

        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("scalegen: ", result.Error);
        Assert.DoesNotContain("   at ", result.Error);
    }

    [Fact]
    public void A_missing_file_or_folder_is_a_usage_error()
    {
        using var scratch = new ScratchFolder();
        var csv = scratch.Write("list.csv", Lines(Header, GoodRow));

        var missingCsv = TestInputs.RunCli("import", scratch.File("nope.csv"));
        var missingFolder = TestInputs.RunCli("import", csv, "-o", Path.Combine(scratch.Path, "no-such-folder", "x.scale"));
        var missingCards = TestInputs.RunCli("import", csv, "--cards", scratch.File("nope.scale"));

        Assert.Equal((2, 2, 2), (missingCsv.ExitCode, missingFolder.ExitCode, missingCards.ExitCode));
        Assert.Contains("no such file", missingCsv.Error);
        Assert.Contains("there is no folder", missingFolder.Error);
        Assert.Contains("no such file", missingCards.Error);
    }
}
