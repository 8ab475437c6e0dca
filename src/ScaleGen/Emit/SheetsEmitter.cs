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
        yield return new GeneratedFile(CsvFile,
            SheetsReport.Csv(sheets, FieldText.HeaderLines(context, What, FieldText.SheetCaution)));
        yield return new GeneratedFile(HtmlFile, SheetsHtml.Page(context, sheets, What));
        yield return new GeneratedFile(JsonFile,
            JsonOutput.Write(SheetsReport.Json(sheets, GeneratedJson.Header(context, What))));
    }
}
