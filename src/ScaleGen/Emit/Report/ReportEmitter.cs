namespace ScaleGen.Emit.Report;

/// <summary>
/// `build --only report`: report.html, one self-contained page for people who review and
/// sign off the configuration: plant summary, diagnostics, alarm priority spread, loop
/// budgets, and every point's transfer curve with its bands and alarms.
/// </summary>
public sealed class ReportEmitter : IOutputEmitter
{
    public const string FileName = "report.html";

    public string Kind => "report";

    public IEnumerable<GeneratedFile> Emit(EmitContext context)
    {
        var data = ReportBuilder.Build(context);
        var header = GeneratedHeader.Lines(context, $"Review report for {data.Title}");
        // Streamed: with tens of thousands of points the page is hundreds of MB.
        yield return new GeneratedFile(FileName, output => ReportHtml.Write(output, data, header));
    }
}
