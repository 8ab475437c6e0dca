using System.CommandLine;
using ScaleGen.Emit;

namespace ScaleGen.Cli.Commands;

/// <summary>`loop FILES [--json]`: the loop power budget of every point with a loop block; exit 1 when one fails.</summary>
internal static class LoopCommand
{
    public static Command Create(ConsoleIo io)
    {
        var files = Inputs.FilesArgument();
        var json = new Option<bool>("--json") { Description = "print { \"loops\": [...], \"ok\": bool } instead of the table" };
        var command = new Command("loop",
            "Loop power budget of every point with a loop block: series resistances, largest loop resistance, "
            + "minimum supply, margin, HART window, upscale failure current. Exit 1 when a loop fails.")
        {
            files, json,
        };
        command.SetAction(result =>
        {
            var compilation = Inputs.CompileOrReport(io, result.GetValue(files)!);
            if (compilation is null) return ExitCodes.Failed;
            var rows = LoopReport.Rows(compilation.Plant);
            io.Out.Write(result.GetValue(json) ? JsonOutput.Write(LoopReport.Json(rows)) : LoopReport.Table(rows));
            return LoopReport.AllOk(rows) ? ExitCodes.Ok : ExitCodes.Failed;
        });
        return command;
    }
}
