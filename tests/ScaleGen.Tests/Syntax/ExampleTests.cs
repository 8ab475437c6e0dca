using ScaleGen.Syntax;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Syntax;

public class ExampleTests
{
    [Fact]
    public void Every_example_file_checks_clean()
    {
        var compilation = TestInputs.CompileExample();
        Assert.Empty(compilation.Diagnostics);
        Assert.InRange(compilation.Plant.Points.Length, 15, 30);
    }

    [Fact]
    public void Check_command_passes_on_the_examples()
    {
        var result = TestInputs.RunCli(new[] { "check" }.Concat(TestInputs.ExampleFiles).ToArray());
        Assert.Equal(0, result.ExitCode);
        Assert.Equal("", result.Out);
    }

    [Fact]
    public void Every_example_file_is_in_canonical_layout()
    {
        foreach (var path in TestInputs.ExampleFiles)
        {
            var source = SourceText.FromFile(path);
            var unit = SyntaxParser.Parse(source, new DiagnosticBag());
            Assert.Equal(source.Text, Formatter.Format(unit));
        }
    }
}
