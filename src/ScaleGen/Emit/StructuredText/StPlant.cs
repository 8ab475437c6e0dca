using System.Text;
using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Emit.StructuredText.StLiterals;
using static ScaleGen.Emit.StructuredText.StNames;

namespace ScaleGen.Emit.StructuredText;

/// <summary>
/// plant.st: one PROGRAM with, per point, a raw input, a parameter record constant and a
/// block instance, then the calls in point order.
/// </summary>
/// <remarks>
/// Diff locality: each point's declarations sit together in their own VAR sections and its
/// call is one line; nothing is aligned to other points, so changing one point's setting
/// changes only that point's lines (and the header's source hash).
/// </remarks>
public static class StPlant
{
    private const string Indent = "    ";
    private const string Banner = "(* ======================================================================== *)";

    /// <summary>Longest Tag and Description the parameter record holds (STRING[40], STRING[80]).</summary>
    public const int TagLength = 40;
    public const int DescriptionLength = 80;

    public static string Text(EmitContext context) => TextChunks.Render(output => Write(output, context));

    /// <summary>The same program, streamed a few points at a time.</summary>
    public static void Write(TextWriter output, EmitContext context)
    {
        var plant = context.Plant;
        var text = new StringBuilder();
        text.Append(StFile.HeaderComment(GeneratedHeader.Lines(context, "ScaleGen Structured Text plant program: one point block per analog input point.")));
        text.Append('\n');
        text.Append(StFile.HeaderComment(
        [
            "Plant: " + (plant.Title ?? "(no title)"),
            $"Run {Program} in a cyclic task every {CycleText(plant.CycleSeconds)}: the filter constants assume that cycle.",
            "Map each point's _Raw input to the card channel named beside it; read Value, Status,",
            "Fault and the alarm bits from the instance named after the point. Needs library.st.",
        ]));
        text.Append("PROGRAM ").Append(Program).Append('\n');

        var points = ForPlant(plant).Select(n => (Names: n, Parameters: StPointParameters.Of(n.Point, plant.CycleSeconds))).ToList();
        foreach (var (names, parameters) in points)
        {
            AppendDeclarations(text, names, parameters, plant.CycleSeconds);
            TextChunks.Spill(text, output);
        }

        text.Append('\n').Append(Banner).Append('\n');
        text.Append(StFile.Comment("Calls, in point order, once per cycle")).Append('\n');
        foreach (var (names, parameters) in points)
        {
            text.Append(Call(names, parameters)).Append('\n');
            TextChunks.Spill(text, output);
        }
        text.Append('\n').Append("END_PROGRAM").Append('\n');
        TextChunks.Spill(text, output, all: true);
    }

    private static void AppendDeclarations(StringBuilder text, StPointNames name, StPointParameters p, double cycle)
    {
        var point = name.Point;
        void Line(int depth, string line) => text.Append(' ', Indent.Length * depth).Append(line).Append('\n');
        void Field(int depth, string field, string value, bool last = false) =>
            text.Append(' ', Indent.Length * depth).Append(field).Append(" := ").Append(value).Append(last ? "\n" : ",\n");
        void Note(int depth, string comment) => Line(depth, StFile.Comment(comment));
        void RangeFields(string prefix, StRawRange range)
        {
            Field(2, prefix + "Min", Integer(range.Min));
            Field(2, prefix + "Max", Integer(range.Max));
        }

        text.Append('\n').Append(Banner).Append('\n');
        Note(0, $"{point.Tag}: {point.Description}");
        Note(0, Summary(point));

        Line(0, "VAR_INPUT");
        Line(1, $"{name.RawInput} : {point.Card.RawType}; {StFile.Comment($"channel {point.Address}, card {point.Card.Name}")}");
        Line(0, "END_VAR");

        Line(0, "VAR CONSTANT");
        Line(1, $"{name.Parameters} : {PointParamsType} := (");
        Field(2, "Tag", StSanitizer.StringLiteral(point.Tag, TagLength));
        Field(2, "Description", StSanitizer.StringLiteral(point.Description, DescriptionLength));

        Note(2, "status bands as raw ranges, first match wins; a range with Min > Max is empty");
        Field(2, "LimitLow", Integer(p.LimitLow));
        Field(2, "LimitHigh", Integer(p.LimitHigh));
        if (!p.FaultCodesInsideLimits.IsEmpty)
            Note(2, "fault codes inside the limits come in as CodeFault: " + string.Join(", ", p.FaultCodesInsideLimits.Select(Integer)));
        if (point.Health.FaultLowMa is { } faultLow) Note(2, $"FAULT_LOW: I <= {Readable(faultLow)} mA");
        RangeFields("FaultLow", p.FaultLow);
        if (point.Health.FaultHighMa is { } faultHigh) Note(2, $"FAULT_HIGH: I >= {Readable(faultHigh)} mA");
        RangeFields("FaultHigh", p.FaultHigh);
        Note(2, $"UNDER: I < {Readable(point.SignalLowMa)} mA");
        RangeFields("Under", p.Under);
        Note(2, $"OVER: I > {Readable(point.SignalHighMa)} mA");
        RangeFields("Over", p.Over);

        Note(2, point.SquareRoot
            ? "fraction = raw * Gain + Offset; Value = SQRT(fraction) * Span + Lrv, or Lrv in the cutoff range"
            : "Value = raw * Gain + Offset");
        Field(2, "SquareRoot", Bool(point.SquareRoot));
        Field(2, "Gain", Real(p.Coefficients.Gain));
        Field(2, "Offset", Real(p.Coefficients.Offset));
        RangeFields("CutoffRaw", p.Cutoff);
        Field(2, "Lrv", Real(point.Lrv));
        Field(2, "Span", Real(point.Span));

        Note(2, "on-fault " + FaultActionText(point));
        Field(2, "HoldLastGood", Bool(p.HoldLastGood));
        Field(2, "FaultValue", Real(p.FaultValue));

        Note(2, p.FilterOn ? $"filter {Readable(point.FilterSeconds)} s at a {CycleText(cycle)} cycle" : "no filter: alarms judged on raw ranges");
        Field(2, "FilterOn", Bool(p.FilterOn));
        Field(2, "Alpha", Real(p.Alpha));

        foreach (var alarm in p.Alarms)
        {
            var field = AlarmParamsField(alarm.Kind);
            var last = alarm.Kind == AlarmKinds[^1];
            if (alarm.Alarm is not { } trip)
            {
                Field(2, field, "(Enabled := FALSE)", last);
                continue;
            }
            Note(2, AlarmSummary(point, trip));
            if (!string.IsNullOrEmpty(trip.Alarm.Message)) Note(2, "text: " + trip.Alarm.Message);
            Line(2, $"{field} := (");
            Field(3, "Enabled", Bool(true));
            Field(3, "Setpoint", Real(trip.TripValue));
            Field(3, "ResetValue", Real(trip.ResetValue));
            Field(3, "TripRawMin", Integer(alarm.Trip.Min));
            Field(3, "TripRawMax", Integer(alarm.Trip.Max));
            Field(3, "ClearRawMin", Integer(alarm.Clear.Min));
            Field(3, "ClearRawMax", Integer(alarm.Clear.Max));
            Field(3, "OnDelay", TimeOfScans(alarm.OnDelayScans, cycle) + DelayNote(trip.Alarm.OnDelaySeconds, alarm.OnDelayScans, cycle));
            Field(3, "OffDelay", TimeOfScans(alarm.OffDelayScans, cycle) + DelayNote(trip.Alarm.OffDelaySeconds, alarm.OffDelayScans, cycle), last: true);
            Line(2, last ? ")" : "),");
        }
        Line(1, ");");
        Line(0, "END_VAR");

        Line(0, "VAR");
        Line(1, $"{name.Instance} : {PointBlock};");
        Line(0, "END_VAR");
    }

    /// <summary>The call of one point's instance; the raw input converted to DINT, fault codes inside the limits as CodeFault.</summary>
    public static string Call(StPointNames name, StPointParameters p)
    {
        var raw = name.Point.Card.RawType switch
        {
            RawType.INT => $"INT_TO_DINT({name.RawInput})",
            RawType.UINT => $"UINT_TO_DINT({name.RawInput})",
            _ => name.RawInput,
        };
        var codeFault = p.FaultCodesInsideLimits.IsEmpty
            ? ""
            : $", {CodeFaultInput} := " + string.Join(" OR ", p.FaultCodesInsideLimits.Select(c => $"({name.RawInput} = {Integer(c)})"));
        return $"{name.Instance}({RawInput} := {raw}{codeFault}, {ParamsInput} := {name.Parameters});";
    }

    private static string Summary(Point point)
    {
        var parts = new List<string>
        {
            $"signal {Readable(point.SignalLowMa)} .. {Readable(point.SignalHighMa)} mA" +
                (point.ShuntOhms is { } shunt && point.Card.IsVoltage ? $" through a {Readable(shunt)} ohm shunt" : ""),
            $"range {Readable(point.Lrv, 6)} .. {Readable(point.Urv, 6)} {point.Unit}" + (point.IsReverse ? " (reverse acting)" : ""),
            point.SquareRoot ? $"square root, cutoff {Readable(point.CutoffPercent)} %" : "linear",
            point.Health.Kind switch
            {
                HealthKind.Ne43 => "health ne43",
                HealthKind.Custom => "health" + (point.Health.FaultLowMa is { } l ? $" below {Readable(l)} mA" : "") +
                    (point.Health.FaultHighMa is { } h ? $" above {Readable(h)} mA" : ""),
                _ => "health none",
            },
        };
        return string.Join("; ", parts);
    }

    private static string FaultActionText(Point point) => point.OnFault.Kind switch
    {
        FaultActionKind.Low => $"low ({Readable(point.ValueMin, 6)} {point.Unit})",
        FaultActionKind.High => $"high ({Readable(point.ValueMax, 6)} {point.Unit})",
        FaultActionKind.Value => $"value {Readable(point.OnFault.Value, 6)} {point.Unit}",
        _ => $"hold (last good value; {Readable(point.Lrv, 6)} {point.Unit} until there is one)",
    };

    private static string AlarmSummary(Point point, AlarmPoint trip)
    {
        var alarm = trip.Alarm;
        var unit = point.Unit;
        var tripRaw = trip.TripRaw is { } t ? $", raw {Integer(t)}" : "";
        var resetRaw = trip.ResetRaw is { } r ? $", raw {Integer(r)}" : "";
        var beyond = alarm.IsHigh ? "below" : "above";
        return $"{alarm.Kind} {Readable(alarm.Setpoint, 6)} {unit}, deadband {Readable(alarm.Deadband, 6)} {unit}: " +
            $"on at {Readable(trip.TripMa)} mA{tripRaw}; off {beyond} {Readable(trip.ResetValue, 6)} {unit} " +
            $"({Readable(trip.ResetMa)} mA{resetRaw}); delay {Readable(alarm.OnDelaySeconds)} s, clear {Readable(alarm.OffDelaySeconds)} s; priority {alarm.Priority}";
    }

    /// <summary>A comment after a TIME literal when the declared delay is not a whole number of cycles.</summary>
    private static string DelayNote(double declaredSeconds, int scans, double cycle)
    {
        var written = scans * cycle;
        var declared = Math.Max(declaredSeconds, 0);
        return Math.Abs(written - declared) <= 1e-9 * Math.Max(1.0, declared)
            ? ""
            : " " + StFile.Comment($"declared {Readable(declared, 6)} s, rounded up to {scans} whole cycles");
    }

    private static string CycleText(double cycleSeconds) =>
        cycleSeconds < 1 ? $"{Readable(cycleSeconds * 1000, 3)} ms" : $"{Readable(cycleSeconds, 6)} s";
}
