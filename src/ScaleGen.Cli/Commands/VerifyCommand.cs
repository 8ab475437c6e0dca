using System.CommandLine;
using ScaleGen.Emit;
using ScaleGen.Text;
using ScaleGen.Verify;

namespace ScaleGen.Cli.Commands;

/// <summary>
/// `verify FILES [--st FILE...] [--json]`: runs the Structured Text (generated on the fly,
/// or the files given with --st) against the reference model; exit 1 on any mismatch or
/// on Structured Text it cannot read.
/// </summary>
internal static class VerifyCommand
{
    public static Command Create(ConsoleIo io)
    {
        var files = Inputs.FilesArgument();
        var st = new Option<string[]>("--st")
        {
            Description = "Structured Text files to verify (library.st and plant.st as build writes them), or the PLCopen XML export (plant.xml); without it, verify generates them",
            AllowMultipleArgumentsPerToken = true,
        };
        var json = new Option<bool>("--json") { Description = "print { \"points\": [...], \"ok\": bool } instead of the table" };
        var command = new Command("verify",
            "Execute the generated Structured Text against the reference model: every point over a sweep of raw counts, "
            + "fault codes, band edges, alarm trips and resets, delays and filter steps, comparing value, status and alarm bits "
            + "scan by scan. Exit 1 on any mismatch or on Structured Text it cannot read.")
        {
            files, st, json,
        };
        command.SetAction(result =>
        {
            var given = result.GetValue(st) ?? [];
            // Read the --st files before compiling, so a wrong path is a usage error whatever the plant says.
            var read = given.Select(Inputs.ReadOne).ToList();
            var compilation = Inputs.CompileOrReport(io, result.GetValue(files)!);
            if (compilation is null) return ExitCodes.Failed;

            // A PLCopen XML file given with --st is verified as the Structured Text it carries.
            var texts = new List<SourceText>();
            foreach (var file in read)
            {
                var (text, problem) = StructuredTextSources.From(file);
                if (problem is not null)
                {
                    io.Error.WriteLine(problem.ToString());
                    return ExitCodes.Failed;
                }
                texts.Add(text!);
            }
            if (texts.Count == 0) texts.AddRange(PlantVerifier.GenerateStructuredText(compilation));

            var progress = ProgressLine.When(io, compilation.Plant.Points.Length >= ProgressLine.LargeVerifyPoints);
            VerifyResult verification;
            try
            {
                verification = PlantVerifier.Verify(compilation.Plant, texts, progress.Show);
            }
            finally
            {
                progress.Clear();
            }
            if (result.GetValue(json))
            {
                io.Out.Write(JsonOutput.Write(VerifyReport.Json(verification)));
                if (verification.Problem is { } problem) io.Error.WriteLine(problem.ToString());
            }
            else io.Out.Write(VerifyReport.Text(verification));
            return verification.Ok ? ExitCodes.Ok : ExitCodes.Failed;
        });
        return command;
    }
}
