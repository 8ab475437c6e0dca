using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Emit.StructuredText.StLiterals;
using static ScaleGen.Emit.StructuredText.StNames;

namespace ScaleGen.Emit.StructuredText;

/// <summary>
/// plant.st: one PROGRAM with, per point, a raw input, a parameter record constant and a
/// block instance, then the calls in point order. The declarations are data
/// (<see cref="Program"/>) so that the PLCopen export writes the same ones.
/// </summary>
/// <remarks>
/// Diff locality: each point's declarations sit together in their own VAR sections and its
/// call is one line; nothing is aligned to other points, so changing one point's setting
/// changes only that point's lines (and the header's source hash).
/// </remarks>
public static class StPlant
{
    /// <summary>Longest Tag and Description the parameter record holds (STRING[40], STRING[80]).</summary>
    public const int TagLength = 40;
    public const int DescriptionLength = 80;

    public static string Text(EmitContext context) => TextChunks.Render(output => Write(output, context));

    /// <summary>The same program, streamed section by section (a 50,000-point plant.st is hundreds of MB).</summary>
    public static void Write(TextWriter output, EmitContext context)
    {
        output.Write(StFile.HeaderComment(GeneratedHeader.Lines(context, "ScaleGen Structured Text plant program: one point block per analog input point.")));
        output.Write('\n');
        StWriter.WritePou(output, Program(context.Plant), StLayout.Plant);
    }

    /// <summary>The program: per point a raw input, a parameter record constant and an instance, each in its own section; the calls as the body.</summary>
    /// <remarks>
    /// The sections are made as they are read (a <see cref="GroupedList{T}"/>), a point at a
    /// time: 50,000 points' declarations held as records would take most of a gigabyte, and
    /// keeping them alive costs the garbage collector more than making them.
    /// </remarks>
    public static StPou Program(Plant plant)
    {
        var names = ForPlant(plant);
        var body = new StringBuilder();
        body.Append(StWriter.Banner).Append('\n');
        body.Append(StFile.Comment("Calls, in point order, once per cycle")).Append('\n');
        // A call needs only the card's fault codes, not all of the point's parameters.
        foreach (var name in names)
            body.Append(Call(name, StPointParameters.FaultCodesInside(name.Point.Card))).Append('\n');
        return new StPou(StPouKind.Program, StNames.Program,
            new GroupedList<StVarSection>(names.Length, SectionsPerPoint,
                i => Sections(names[i], StPointParameters.Of(names[i].Point, plant.CycleSeconds), plant.CycleSeconds)),
            body.ToString(),
            [
                "Plant: " + (plant.Title ?? "(no title)"),
                $"Run {StNames.Program} in a cyclic task every {CycleText(plant.CycleSeconds)}: the filter constants assume that cycle.",
                "Map each point's _Raw input to the card channel named beside it; read Value, Status,",
                "Fault and the alarm bits from the instance named after the point. Needs library.st.",
            ]);
    }

    private const int SectionsPerPoint = 3;

    // What every point's declarations share, made once: the records are immutable, and a
    // large plant would otherwise make the same objects tens of thousands of times.
    private static readonly StDerivedType PointParamsTypeRef = new(PointParamsType);
    private static readonly StDerivedType PointBlockTypeRef = new(PointBlock);
    private static readonly StElementaryType[] RawInputTypes =
        Enum.GetValues<RawType>().Select(type => new StElementaryType(type.ToString())).ToArray();
    private static readonly StMemberValue[] DisabledAlarms = Enum.GetValues<AlarmKind>()
        .Select(kind => new StMemberValue(AlarmParamsField(kind), new StStructValue([new StMemberValue("Enabled", new StSimpleValue(Bool(false)))])))
        .ToArray();
    private static readonly StSimpleValue TrueValue = new(Bool(true)), FalseValue = new(Bool(false)), NoDelay = new(Time(0)), RealZero = new(Real(0));

    /// <summary>A literal as a value; the ones most points share are one object each.</summary>
    private static StSimpleValue SimpleValue(string literal) => literal switch
    {
        "TRUE" => TrueValue,
        "FALSE" => FalseValue,
        "T#0s" => NoDelay,
        "0.0" => RealZero,
        _ => new StSimpleValue(literal),
    };

    /// <summary>The members of a point's parameter record, alarms included (its list is made this large at once).</summary>
    private const int MembersPerPoint = 27;

    /// <summary>One point's declarations: its raw input, its parameter record constant, its instance.</summary>
    private static StVarSection[] Sections(StPointNames name, StPointParameters p, double cycle)
    {
        var point = name.Point;
        var members = new List<StMemberValue>(MembersPerPoint);
        var notes = new List<string>();
        void Note(string note) => notes.Add(note);
        void Field(string member, string literal, string? after = null)
        {
            members.Add(new StMemberValue(member, SimpleValue(literal), notes.ToArray(), after));
            notes.Clear();
        }
        void RangeFields(string minMember, string maxMember, StRawRange range)
        {
            Field(minMember, Integer(range.Min));
            Field(maxMember, Integer(range.Max));
        }

        Field("Tag", StSanitizer.StringLiteral(point.Tag, TagLength));
        Field("Description", StSanitizer.StringLiteral(point.Description, DescriptionLength));

        Note("status bands as raw ranges, first match wins; a range with Min > Max is empty");
        Field("LimitLow", Integer(p.LimitLow));
        Field("LimitHigh", Integer(p.LimitHigh));
        if (!p.FaultCodesInsideLimits.IsEmpty)
            Note("fault codes inside the limits come in as CodeFault: " + string.Join(", ", p.FaultCodesInsideLimits.Select(Integer)));
        if (point.Health.FaultLowMa is { } faultLow) Note(string.Create(Invariant, $"FAULT_LOW: I <= {NoteNumber(faultLow)} mA"));
        RangeFields("FaultLowMin", "FaultLowMax", p.FaultLow);
        if (point.Health.FaultHighMa is { } faultHigh) Note(string.Create(Invariant, $"FAULT_HIGH: I >= {NoteNumber(faultHigh)} mA"));
        RangeFields("FaultHighMin", "FaultHighMax", p.FaultHigh);
        Note(string.Create(Invariant, $"UNDER: I < {NoteNumber(point.SignalLowMa)} mA"));
        RangeFields("UnderMin", "UnderMax", p.Under);
        Note(string.Create(Invariant, $"OVER: I > {NoteNumber(point.SignalHighMa)} mA"));
        RangeFields("OverMin", "OverMax", p.Over);

        Note(point.SquareRoot
            ? "fraction = raw * Gain + Offset; Value = SQRT(fraction) * Span + Lrv, or Lrv in the cutoff range"
            : "Value = raw * Gain + Offset");
        Field("SquareRoot", Bool(point.SquareRoot));
        Field("Gain", Real(p.Coefficients.Gain));
        Field("Offset", Real(p.Coefficients.Offset));
        RangeFields("CutoffRawMin", "CutoffRawMax", p.Cutoff);
        Field("Lrv", Real(point.Lrv));
        Field("Span", Real(point.Span));

        Note("on-fault " + FaultActionText(point));
        Field("HoldLastGood", Bool(p.HoldLastGood));
        Field("FaultValue", Real(p.FaultValue));

        Note(p.FilterOn ? string.Create(Invariant, $"filter {NoteNumber(point.FilterSeconds)} s at a {CycleText(cycle)} cycle") : "no filter: alarms judged on raw ranges");
        Field("FilterOn", Bool(p.FilterOn));
        Field("Alpha", Real(p.Alpha));

        foreach (var alarm in p.Alarms)
        {
            var field = AlarmParamsField(alarm.Kind);
            if (alarm.Alarm is not { } trip)
            {
                members.Add(DisabledAlarms[(int)alarm.Kind]);
                continue;
            }
            StMemberValue Simple(string member, string literal, string? after = null) => new(member, SimpleValue(literal), [], after);
            StStructValue limit = new(
            [
                Simple("Enabled", Bool(true)),
                Simple("Setpoint", Real(trip.TripValue)),
                Simple("ResetValue", Real(trip.ResetValue)),
                Simple("TripRawMin", Integer(alarm.Trip.Min)),
                Simple("TripRawMax", Integer(alarm.Trip.Max)),
                Simple("ClearRawMin", Integer(alarm.Clear.Min)),
                Simple("ClearRawMax", Integer(alarm.Clear.Max)),
                Simple("OnDelay", TimeOfScans(alarm.OnDelayScans, cycle), DelayNote(trip.Alarm.OnDelaySeconds, alarm.OnDelayScans, cycle)),
                Simple("OffDelay", TimeOfScans(alarm.OffDelayScans, cycle), DelayNote(trip.Alarm.OffDelaySeconds, alarm.OffDelayScans, cycle)),
            ]);
            Note(AlarmSummary(point, trip));
            if (!string.IsNullOrEmpty(trip.Alarm.Message)) Note("text: " + trip.Alarm.Message);
            members.Add(new StMemberValue(field, limit, notes.ToArray()));
            notes.Clear();
        }

        return
        [
            new StVarSection(StVarKind.Input,
                [new StVariable(name.RawInput, RawInputTypes[(int)point.Card.RawType], Comment: $"channel {point.Address}, card {point.Card.Name}")])
            {
                Notes = [$"{point.Tag}: {point.Description}", Summary(point)],
            },
            new StVarSection(StVarKind.Constant,
                [new StVariable(name.Parameters, PointParamsTypeRef, new StStructValue(members))]),
            new StVarSection(StVarKind.Local, [new StVariable(name.Instance, PointBlockTypeRef)]),
        ];
    }

    /// <summary>The call of one point's instance; the raw input converted to DINT, fault codes inside the limits as CodeFault.</summary>
    public static string Call(StPointNames name, StPointParameters p) => Call(name, p.FaultCodesInsideLimits);

    private static string Call(StPointNames name, ImmutableArray<long> faultCodesInsideLimits)
    {
        var raw = name.Point.Card.RawType switch
        {
            RawType.INT => $"INT_TO_DINT({name.RawInput})",
            RawType.UINT => $"UINT_TO_DINT({name.RawInput})",
            _ => name.RawInput,
        };
        var codeFault = faultCodesInsideLimits.IsEmpty
            ? ""
            : $", {CodeFaultInput} := " + string.Join(" OR ", faultCodesInsideLimits.Select(c => $"({name.RawInput} = {Integer(c)})"));
        return $"{name.Instance}({RawInput} := {raw}{codeFault}, {ParamsInput} := {name.Parameters});";
    }

    // The comments below are interpolated with NoteNumber (formatted in place, invariant)
    // straight into their one string: plant.st has a dozen of them per point.

    /// <summary>
    /// A cleared builder for a comment made of several parts, one per thread (plant.st and
    /// plant.xml may be written at the same time); the comment is copied out before the next.
    /// </summary>
    private static StringBuilder NoteBuilder() => (t_note ??= new StringBuilder(256)).Clear();

    [ThreadStatic]
    private static StringBuilder? t_note;

    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    private static string Summary(Point point)
    {
        var text = NoteBuilder();
        text.Append(Invariant, $"signal {NoteNumber(point.SignalLowMa)} .. {NoteNumber(point.SignalHighMa)} mA");
        if (point.ShuntOhms is { } shunt && point.Card.IsVoltage) text.Append(Invariant, $" through a {NoteNumber(shunt)} ohm shunt");
        text.Append(Invariant, $"; range {NoteNumber(point.Lrv, 6)} .. {NoteNumber(point.Urv, 6)} {point.Unit}");
        if (point.IsReverse) text.Append(" (reverse acting)");
        if (point.SquareRoot) text.Append(Invariant, $"; square root, cutoff {NoteNumber(point.CutoffPercent)} %");
        else text.Append("; linear");
        switch (point.Health.Kind)
        {
            case HealthKind.Ne43:
                text.Append("; health ne43");
                break;
            case HealthKind.Custom:
                text.Append("; health");
                if (point.Health.FaultLowMa is { } low) text.Append(Invariant, $" below {NoteNumber(low)} mA");
                if (point.Health.FaultHighMa is { } high) text.Append(Invariant, $" above {NoteNumber(high)} mA");
                break;
            default:
                text.Append("; health none");
                break;
        }
        return text.ToString();
    }

    private static string FaultActionText(Point point) => point.OnFault.Kind switch
    {
        FaultActionKind.Low => string.Create(Invariant, $"low ({NoteNumber(point.ValueMin, 6)} {point.Unit})"),
        FaultActionKind.High => string.Create(Invariant, $"high ({NoteNumber(point.ValueMax, 6)} {point.Unit})"),
        FaultActionKind.Value => string.Create(Invariant, $"value {NoteNumber(point.OnFault.Value, 6)} {point.Unit}"),
        _ => string.Create(Invariant, $"hold (last good value; {NoteNumber(point.Lrv, 6)} {point.Unit} until there is one)"),
    };

    private static string AlarmSummary(Point point, AlarmPoint trip)
    {
        var alarm = trip.Alarm;
        var unit = point.Unit;
        var text = NoteBuilder();
        text.Append(Invariant, $"{AlarmParamsField(alarm.Kind)} {NoteNumber(alarm.Setpoint, 6)} {unit}, deadband {NoteNumber(alarm.Deadband, 6)} {unit}: ");
        text.Append(Invariant, $"on at {NoteNumber(trip.TripMa)} mA");
        if (trip.TripRaw is { } tripRaw) text.Append(Invariant, $", raw {tripRaw}");
        text.Append(Invariant, $"; off {(alarm.IsHigh ? "below" : "above")} {NoteNumber(trip.ResetValue, 6)} {unit} ({NoteNumber(trip.ResetMa)} mA");
        if (trip.ResetRaw is { } resetRaw) text.Append(Invariant, $", raw {resetRaw}");
        text.Append(Invariant, $"); delay {NoteNumber(alarm.OnDelaySeconds)} s, clear {NoteNumber(alarm.OffDelaySeconds)} s; priority {alarm.Priority}");
        return text.ToString();
    }

    /// <summary>A note after a TIME literal when the declared delay is not a whole number of cycles; else null.</summary>
    private static string? DelayNote(double declaredSeconds, int scans, double cycle)
    {
        var written = scans * cycle;
        var declared = Math.Max(declaredSeconds, 0);
        return Math.Abs(written - declared) <= 1e-9 * Math.Max(1.0, declared)
            ? null
            : string.Create(Invariant, $"declared {NoteNumber(declared, 6)} s, rounded up to {scans} whole cycles");
    }

    private static string CycleText(double cycleSeconds) =>
        cycleSeconds < 1
            ? string.Create(Invariant, $"{NoteNumber(cycleSeconds * 1000, 3)} ms")
            : string.Create(Invariant, $"{NoteNumber(cycleSeconds, 6)} s");
}
