using ApprovalTests;
using ApprovalTests.Reporters;
using ScaleGen.Emit;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Syntax;

/// <summary>
/// What a user sees for a few bad files, approved as a whole: the compiler-convention text,
/// and the JSON and SARIF of <c>check</c>. The approved files sit beside this file.
/// </summary>
[UseReporter(typeof(QuietReporter))]
public class DiagnosticSnapshotTests
{
    /// <summary>
    /// ApprovalTests finds the approved files through the source path in the PDB; if a build
    /// setting hid it (deterministic source paths), every snapshot would fail as "missing".
    /// </summary>
    [Fact]
    public void Approved_files_are_looked_for_beside_this_test_file()
    {
        var expected = Path.Combine(TestInputs.RepositoryRoot, "tests", "ScaleGen.Tests", "Syntax");
        Assert.Equal(expected, Path.TrimEndingDirectorySeparator(Path.GetFullPath(Approvals.GetDefaultNamer().SourcePath)));
    }

    [Fact]
    public void Text_for_a_file_with_many_mistakes() =>
        Approvals.Verify(TextFor(("many-mistakes.scale", BadFiles.ManyMistakes)));

    /// <summary>Run under de-DE: messages with decimals must still print a decimal point.</summary>
    [Fact]
    public void Text_for_lexical_trouble_under_german_culture() =>
        Approvals.Verify(TestInputs.UnderCulture("de-DE", () => TextFor(("lexical.scale", BadFiles.LexicalTrouble))));

    [Fact]
    public void Text_for_two_files_of_one_plant() =>
        Approvals.Verify(TextFor(("cards.scale", BadFiles.CardsFile), ("points.scale", BadFiles.PointsFile)));

    [Fact]
    public void Check_json_for_a_file_with_many_mistakes() =>
        Approvals.Verify(CheckOutput("json"));

    [Fact]
    public void Check_sarif_for_a_file_with_many_mistakes() =>
        Approvals.Verify(CheckOutput("sarif"));

    private static string TextFor(params (string Path, string Text)[] files) =>
        DiagnosticReport.Text(Compilation.Compile(files.Select(f => new SourceText(f.Path, f.Text)).ToArray()).Diagnostics);

    /// <summary>
    /// Runs <c>check</c> on a real file in a temporary folder. The folder's path differs on
    /// every run, so the snapshot shows the file name only.
    /// </summary>
    private static string CheckOutput(string format)
    {
        using var folder = new TempFolder();
        var path = folder.Write("many-mistakes.scale", BadFiles.ManyMistakes);
        var result = TestInputs.RunCli("check", path, "--format", format);
        Assert.Equal(1, result.ExitCode);
        Assert.Equal("", result.Error);
        return folder.Anonymise(result.Out);
    }
}
