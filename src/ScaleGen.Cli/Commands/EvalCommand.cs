using System.CommandLine;
using System.Globalization;
using Newtonsoft.Json.Linq;
using ScaleGen.Emit;
using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Cli.Commands;

/// <summary>`eval FILES --point TAG (--ma X | --raw N | --volts V) [--json]`: what one point reads for one input.</summary>
internal static class EvalCommand
{
    public static Command Create(ConsoleIo io)
    {
        var files = Inputs.FilesArgument();
        var pointOption = new Option<string>("--point") { Description = "the point's tag, e.g. FIT-101", Required = true };
        var ma = NumberOption.Create("--ma", "loop current in mA");
        var raw = new Option<long?>("--raw") { Description = "raw count as the card delivers it" };
        var volts = NumberOption.Create("--volts", "volts across the card input or the shunt");
        var json = new Option<bool>("--json") { Description = "print one JSON object" };
        var command = new Command("eval", "Show what a point reads for one input: raw count, loop current, percent, value, status, alarms.")
        {
            files, pointOption, ma, raw, volts, json,
        };
        command.SetAction(result =>
        {
            var given = new object?[] { result.GetValue(ma), result.GetValue(raw), result.GetValue(volts) }.Count(v => v is not null);
            if (given != 1) throw new UsageException("give exactly one of --ma, --raw or --volts");

            var compilation = Inputs.CompileOrReport(io, result.GetValue(files)!);
            if (compilation is null) return ExitCodes.Failed;
            var tag = result.GetValue(pointOption)!;
            var point = compilation.Plant.FindPoint(tag)
                ?? throw new UsageException($"no point '{tag}' in the plant{Suggestion(compilation.Plant, tag)}");

            Reading reading;
            if (result.GetValue(raw) is { } count)
            {
                var (min, max) = Card.RangeOf(point.Card.RawType);
                if (count < min || count > max)
                    throw new UsageException($"--raw {count} does not fit the card's type {point.Card.RawType} ({min} .. {max})");
                reading = Evaluator.Evaluate(point, count);
            }
            else if (result.GetValue(ma) is { } current)
                reading = Evaluator.EvaluateMa(point, current);
            else
                reading = Evaluator.EvaluateVolts(point, result.GetValue(volts)!.Value)
                    ?? throw new UsageException($"point '{point.Tag}' has no resistance across which to read volts: use --ma or --raw");

            io.Out.Write(result.GetValue(json) ? Json(point, reading) : Text(point, reading));
            return ExitCodes.Ok;
        });
        return command;
    }

    private static string Suggestion(Plant plant, string tag)
    {
        var near = Syntax.SyntaxParser.Suggest(tag, plant.Points.Select(p => p.Tag));
        return near is null ? "" : $": did you mean '{near}'?";
    }

    private static string Json(Point point, Reading reading)
    {
        var alarms = new JObject();
        foreach (var flag in reading.Alarms) alarms[flag.Kind.ToString()] = flag.Active;
        return JsonOutput.Write(new JObject
        {
            ["point"] = point.Tag,
            ["raw"] = reading.Raw,
            ["ma"] = JsonOutput.Number(reading.Ma),
            ["percent"] = JsonOutput.Number(reading.Percent),
            ["value"] = JsonOutput.Number(reading.Value),
            ["unit"] = point.Unit,
            ["status"] = reading.Status.ToString(),
            ["alarms"] = alarms,
        });
    }

    private static string Text(Point point, Reading reading)
    {
        static string N(double v) => v.ToString("0.###", CultureInfo.InvariantCulture);
        var lines = new List<string>
        {
            $"point    {point.Tag}{(point.Description.Length > 0 ? "  (" + point.Description + ")" : "")}",
            $"raw      {reading.Raw.ToString(CultureInfo.InvariantCulture)}",
            $"current  {N(reading.Ma)} mA",
            $"percent  {N(reading.Percent)} % of signal span",
            $"value    {N(reading.Value)} {point.Unit}",
            $"status   {reading.Status}",
        };
        if (reading.Alarms.Length > 0)
            lines.Add("alarms   " + string.Join("  ", reading.Alarms.Select(a => $"{a.Kind}={(a.Active ? "on" : "off")}")));
        return string.Join("\n", lines) + "\n";
    }
}
