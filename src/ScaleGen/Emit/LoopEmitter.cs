namespace ScaleGen.Emit;

/// <summary>
/// `build` output "loop": the loop power budget as a table (loop-budget.txt) and as JSON
/// (loop-budget.json), built by <see cref="LoopReport"/> exactly as the `loop` command prints them.
/// </summary>
public sealed class LoopEmitter : IOutputEmitter
{
    public const string TextFile = "loop-budget.txt";
    public const string JsonFile = "loop-budget.json";
    private const string What = "Loop power budget";

    public string Kind => "loop";

    public IEnumerable<GeneratedFile> Emit(EmitContext context)
    {
        var rows = LoopReport.Rows(context.Plant);
        var header = string.Concat(GeneratedHeader.Lines(context, What).Select(line => "# " + line + "\n"));
        yield return new GeneratedFile(TextFile, output =>
        {
            output.Write(header);
            output.Write('\n');
            LoopReport.Table(output, rows);
        });
        yield return new GeneratedFile(JsonFile, output => LoopReport.Json(output, rows, GeneratedJson.Header(context, What)));
    }
}
