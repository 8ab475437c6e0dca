using ApprovalTests;
using ApprovalTests.Reporters;
using ScaleGen.Emit;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit.StructuredText;

[UseReporter(typeof(QuietReporter))]
public class StSnapshotTests
{
    internal static IReadOnlyList<GeneratedFile> EmitExample()
    {
        var compilation = TestInputs.CompileExample();
        Assert.False(compilation.HasErrors);
        return new StructuredTextEmitter().Emit(EmitContext.From(compilation)).ToArray();
    }

    internal static string FileText(IReadOnlyList<GeneratedFile> files, string name) =>
        files.Single(f => f.RelativePath == name).Content;

    [Fact]
    public void Library_of_the_example_plant() =>
        Approvals.Verify(FileText(EmitExample(), StNames.LibraryFile));

    [Fact]
    public void Plant_program_of_the_example_plant() =>
        Approvals.Verify(FileText(EmitExample(), StNames.PlantFile));

    [Fact]
    public void Emitter_is_registered_as_st_and_writes_two_files()
    {
        Assert.IsType<StructuredTextEmitter>(OutputCatalog.Find("st"));
        Assert.Equal([StNames.LibraryFile, StNames.PlantFile], EmitExample().Select(f => f.RelativePath));
    }

    [Fact]
    public void Output_is_byte_identical_on_repeated_runs_and_under_de_DE()
    {
        var first = EmitExample();
        var second = EmitExample();
        var german = TestInputs.UnderCulture("de-DE", EmitExample);
        foreach (var file in first)
        {
            Assert.Equal(file.Content, FileText(second, file.RelativePath));
            Assert.Equal(file.Content, FileText(german, file.RelativePath));
        }
        // A culture slip would show as a decimal comma in a REAL literal.
        Assert.DoesNotMatch(@":= -?\d+,\d", FileText(german, StNames.PlantFile));
    }

    [Fact]
    public void Library_body_is_the_same_for_every_plant()
    {
        var other = TestInputs.Compile(TestInputs.StandardCard + """

            point PT-9 {
              card AI16 at "X"
              range 0 .. 10 bar
            }
            """);
        var otherLibrary = StLibrary.Text(EmitContext.From(other));
        var exampleLibrary = FileText(EmitExample(), StNames.LibraryFile);
        static string AfterHeader(string text) => text[(text.IndexOf("*)\n", StringComparison.Ordinal) + 3)..];
        Assert.Equal(AfterHeader(exampleLibrary), AfterHeader(otherLibrary));
        Assert.EndsWith(StLibrary.Body, otherLibrary);
    }
}
