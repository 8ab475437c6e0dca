using CsCheck;
using ScaleGen.Syntax;
using ScaleGen.Text;
using static ScaleGen.Tests.Import.ImportCases;

namespace ScaleGen.Tests.Import;

public class ImportProperties
{
    // Cells made of the characters that break CSV and number reading, plus a few the language refuses.
    private static readonly Gen<string> Cell = Gen.OneOf(
        Gen.String[Gen.Char["0123456789.,-+eE\"\n\r ;aZ_%\t\u00A0\uFFFD"], 0, 8],
        Gen.Int[-5, 25].Select(i => i.ToString(System.Globalization.CultureInfo.InvariantCulture)),
        Gen.Const(""));

    private static Gen<string> Row(string tag) => Gen.Select(Cell, Cell, Cell, Cell, Cell,
        (address, lrv, urv, h, unit) => string.Join(",", tag, "d", "ai_4_20", Quoted(address), "4", "20", Quoted(lrv), Quoted(urv), Quoted(unit), "", "", "ne43", "", Quoted(h), "", ""));

    // Half the cells are written raw (and may break the row), half quoted as a spreadsheet would.
    private static string Quoted(string cell) => cell.Length % 2 == 0 ? cell : "\"" + cell.Replace("\"", "\"\"") + "\"";

    private static int _imported;

    [Fact]
    public void Any_rows_give_text_that_checks_or_problems_and_no_text_but_never_an_exception()
    {
        Gen.Select(Row("PT-901"), Row("PT-902")).Sample((first, second) =>
        {
            var result = ImportCsv(Lines(Header, first, second));

            if (result.HasErrors)
            {
                Assert.Null(result.Text);
                return;
            }
            Assert.NotNull(result.Text);
            Interlocked.Increment(ref _imported);
            var compilation = Compilation.Compile(Cards, new SourceText("t.scale", result.Text!));
            Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics));
            Assert.Equal(result.Text, Formatter.Format(compilation.Units[1]));
        }, iter: 3000);
        Assert.True(_imported > 0, "no generated list was good enough to import: the generator tests only the error paths");
    }
}
