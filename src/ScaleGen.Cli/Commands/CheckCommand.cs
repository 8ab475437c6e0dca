using System.CommandLine;
using ScaleGen.Emit;

namespace ScaleGen.Cli.Commands;

/// <summary>`check FILES [--format text|json|sarif]`: parse and validate, print diagnostics.</summary>
internal static class CheckCommand
{
    public static Command Create(ConsoleIo io)
    {
        var files = Inputs.FilesArgument();
        var format = new Option<string>("--format")
        {
            Description = "text (compiler style), json, or sarif (SARIF 2.1.0)",
            DefaultValueFactory = _ => "text",
        };
        format.AcceptOnlyFromAmong("text", "json", "sarif");
        var command = new Command("check", "Parse and validate; print every error and warning.") { files, format };
        command.SetAction(result =>
        {
            var compilation = Compilation.Compile(Inputs.Load(result.GetValue(files)!));
            var diagnostics = compilation.Diagnostics;
            switch (result.GetValue(format))
            {
                case "json":
                    io.Out.Write(DiagnosticReport.Json(diagnostics));
                    break;
                case "sarif":
                    io.Out.Write(DiagnosticReport.Sarif(diagnostics.ToList(), ScaleGenCli.Version));
                    break;
                default:
                    io.Out.Write(DiagnosticReport.Text(diagnostics));
                    var count = compilation.Plant.Points.Length;
                    io.Error.WriteLine($"{count} point{(count == 1 ? "" : "s")} checked: {DiagnosticReport.Summary(diagnostics.ToList())}");
                    break;
            }
            return compilation.HasErrors ? ExitCodes.Failed : ExitCodes.Ok;
        });
        return command;
    }
}
