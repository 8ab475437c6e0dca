using ScaleGen.Engine;

namespace ScaleGen.Emit;

/// <summary>
/// `build` output "sheets": commissioning check sheets as CSV (check-sheets.csv), a
/// printable A4 page (check-sheets.html) and JSON (check-sheets.json). The `sheets -o DIR`
/// command writes exactly these files.
/// </summary>
public sealed class SheetsEmitter : IOutputEmitter
{
    public const string CsvFile = "check-sheets.csv";
    public const string HtmlFile = "check-sheets.html";
    public const string JsonFile = "check-sheets.json";
    private const string What = "Commissioning check sheets";

    public string Kind => "sheets";

    public IEnumerable<GeneratedFile> Emit(EmitContext context)
    {
        var sheets = CheckSheets.For(context.Plant);
        // Streamed: with tens of thousands of points each of these is hundreds of MB.
        yield return new GeneratedFile(CsvFile,
            output => SheetsReport.Csv(output, sheets, FieldText.HeaderLines(context, What, FieldText.SheetCaution)));
        yield return new GeneratedFile(HtmlFile, output => SheetsHtml.Page(output, context, sheets, What));
        yield return new GeneratedFile(JsonFile,
            output => SheetsReport.Json(output, sheets, GeneratedJson.Header(context, What)));
    }
}
