using System.Globalization;
using ScaleGen.Emit;
using ScaleGen.Model;

namespace ScaleGen.Review;

/// <summary>
/// One comparable field of a point: its stable name (a contract: docs/diff.md), how to
/// read it from the bound model, its unit, and what a change of it does.
/// </summary>
/// <param name="Name">Stable name, e.g. <c>range.lrv</c>.</param>
/// <param name="Label">Words for the summary, e.g. "range low (LRV)".</param>
/// <param name="Read">The field's value on one version of the point.</param>
/// <param name="Unit">The unit its numbers are in on that version (null for none).</param>
/// <param name="Explain">The consequence of a change, from the engine; null when there is nothing to compute.</param>
/// <param name="Summarize">Replaces the usual "LABEL changed from OLD to NEW" (alarms and loops added or removed).</param>
public sealed record DiffField(
    string Name,
    string Label,
    Func<Point, DiffValue> Read,
    Func<Point, string?> Unit,
    Func<DiffSide, DiffSide, string?>? Explain = null,
    Func<Point, Point, string>? Summarize = null,
    string Verb = "changed")
{
    public string Describe(Point oldPoint, DiffValue before, Point newPoint, DiffValue after)
    {
        if (Summarize is not null) return Summarize(oldPoint, newPoint);
        var oldUnit = Unit(oldPoint);
        var newUnit = Unit(newPoint);
        // "from 430 to 440 m3/h": the unit once at the end, unless the two sides differ.
        var beforeText = before.Display() + (oldUnit is not null && !before.IsNone && (oldUnit != newUnit || after.IsNone) ? " " + oldUnit : "");
        var afterText = after.Display() + (newUnit is not null && !after.IsNone ? " " + newUnit : "");
        return $"{Label} {Verb} from {beforeText} to {afterText}";
    }
}

/// <summary>
/// Every field `diff` compares, in the order it reports them. The names are a contract:
/// scripts read them from <c>diff --json</c>. Extend the list; never rename an entry.
/// </summary>
public static class DiffFields
{
    private static readonly Func<Point, string?> NoUnit = _ => null;
    private static Func<Point, string?> Fixed(string unit) => _ => unit;
    private static readonly Func<Point, string?> Engineering = p => p.Unit;

    /// <summary>Fields every point has, in report order (card fields are as the point sees its card).</summary>
    public static IReadOnlyList<DiffField> PointFields { get; } = new DiffField[]
    {
        new("desc", "description", p => DiffValue.Of(p.Description), NoUnit),
        new("card", "card", p => DiffValue.Word(p.Card.Name), NoUnit, DiffConsequences.RawAtSignalEnds),
        new("address", "channel address", p => DiffValue.Of(p.Address), NoUnit),
        new("card.counts.raw_low", "card counts, low raw", p => DiffValue.Of(p.Card.RawLow), NoUnit, DiffConsequences.RawAtSignalEnds),
        new("card.counts.raw_high", "card counts, high raw", p => DiffValue.Of(p.Card.RawHigh), NoUnit, DiffConsequences.RawAtSignalEnds),
        new("card.counts.signal_low", "card counts, low signal", p => DiffValue.Of(p.Card.ElectricalLow), CardUnit, DiffConsequences.RawAtSignalEnds),
        new("card.counts.signal_high", "card counts, high signal", p => DiffValue.Of(p.Card.ElectricalHigh), CardUnit, DiffConsequences.RawAtSignalEnds),
        new("card.counts.unit", "card signal unit", p => DiffValue.Word(CardUnit(p)), NoUnit, DiffConsequences.RawAtSignalEnds),
        new("card.limits.low", "card limits, low raw", p => DiffValue.Of(p.Card.LimitLow), NoUnit, DiffConsequences.CardLimits),
        new("card.limits.high", "card limits, high raw", p => DiffValue.Of(p.Card.LimitHigh), NoUnit, DiffConsequences.CardLimits),
        new("card.fault_codes", "card fault codes", p => DiffValue.Word(FaultCodes(p.Card)), NoUnit),
        new("card.type", "card raw type", p => DiffValue.Word(p.Card.RawType.ToString()), NoUnit),
        new("card.input_ohm", "card input resistance", p => DiffValue.Of(p.Card.InputOhms), Fixed("ohm"), DiffConsequences.InputResistance),
        new("signal.low_ma", "signal low", p => DiffValue.Of(p.SignalLowMa), Fixed("mA"), DiffConsequences.ValueAtMidSignal),
        new("signal.high_ma", "signal high", p => DiffValue.Of(p.SignalHighMa), Fixed("mA"), DiffConsequences.ValueAtMidSignal),
        new("shunt_ohm", "shunt", p => DiffValue.Of(p.ShuntOhms), Fixed("ohm"), DiffConsequences.RawAtSignalEnds),
        new("range.lrv", "range low (LRV)", p => DiffValue.Of(p.Lrv), Engineering, DiffConsequences.ValueAtMidSignal),
        new("range.urv", "range high (URV)", p => DiffValue.Of(p.Urv), Engineering, DiffConsequences.ValueAtMidSignal),
        new("range.unit", "engineering unit", p => DiffValue.Word(p.Unit), NoUnit),
        new("sqrt", "square-root extraction", p => DiffValue.Of(p.SquareRoot), NoUnit, DiffConsequences.ValueAtMidSignal),
        new("sqrt.cutoff_pct", "low-flow cutoff", p => p.SquareRoot ? DiffValue.Of(p.CutoffPercent) : DiffValue.None, Fixed("%"), DiffConsequences.Cutoff),
        new("health", "fault bands", p => DiffValue.Word(SettingWords.Health(p.Health)), NoUnit, DiffConsequences.FaultBands),
        new("on_fault", "value on fault", p => DiffValue.Word(SettingWords.OnFault(p.OnFault)), NoUnit, DiffConsequences.FaultValue),
        new("filter_s", "filter time constant", p => DiffValue.Of(p.FilterSeconds), Fixed("s")),
        new("measure", "measure kind", p => DiffValue.Word(SettingWords.Measure(p.Measure)), NoUnit),
        new("tolerance_pct", "calibration tolerance", p => DiffValue.Of(p.TolerancePercent), Fixed("%"), DiffConsequences.Tolerance),
    };

    /// <summary>The fields of one alarm kind, compared when both versions have that alarm.</summary>
    public static IReadOnlyList<DiffField> AlarmFields(AlarmKind kind)
    {
        var k = kind.ToString();
        Func<Point, DiffValue> Of(Func<Alarm, DiffValue> read) => p => AlarmOf(p, kind) is { } a ? read(a) : DiffValue.None;
        return new DiffField[]
        {
            new($"alarm.{k}.setpoint", $"{k} setpoint", Of(a => DiffValue.Of(a.Setpoint)), Engineering, (o, n) => DiffConsequences.Trip(o, n, kind), Verb: "moved"),
            new($"alarm.{k}.deadband", $"{k} deadband", Of(a => DiffValue.Of(a.Deadband)), Engineering, (o, n) => DiffConsequences.Reset(o, n, kind)),
            new($"alarm.{k}.delay_s", $"{k} on-delay", Of(a => DiffValue.Of(a.OnDelaySeconds)), Fixed("s"), (o, n) => DiffConsequences.Scans(o, n, kind, a => a.OnDelaySeconds)),
            new($"alarm.{k}.clear_s", $"{k} off-delay (clear)", Of(a => DiffValue.Of(a.OffDelaySeconds)), Fixed("s"), (o, n) => DiffConsequences.Scans(o, n, kind, a => a.OffDelaySeconds)),
            new($"alarm.{k}.priority", $"{k} priority", Of(a => DiffValue.Of(a.Priority)), NoUnit),
            new($"alarm.{k}.text", $"{k} text", Of(a => DiffValue.Of(a.Message)), NoUnit),
        };
    }

    /// <summary>An alarm kind that only one version has: new value is the setpoint, or none.</summary>
    public static DiffField AlarmPresence(AlarmKind kind) => new(
        $"alarm.{kind}",
        $"{kind} alarm",
        p => AlarmOf(p, kind) is { } a ? DiffValue.Of(a.Setpoint) : DiffValue.None,
        Engineering,
        (o, n) => DiffConsequences.AlarmPresence(o, n, kind),
        (o, n) => AlarmOf(n, kind) is { } added
            ? $"{kind} alarm added at {DisplayNumbers.Exact(added.Setpoint)} {n.Unit} ({AlarmSettings(added, n.Unit)})"
            : $"{kind} alarm removed (was at {DisplayNumbers.Exact(AlarmOf(o, kind)!.Setpoint)} {o.Unit})");

    /// <summary>The fields of the loop block, compared when both versions have one.</summary>
    public static IReadOnlyList<DiffField> LoopFields { get; } = new DiffField[]
    {
        new("loop.supply_v", "loop supply", p => DiffValue.Of(p.Loop?.SupplyVolts), Fixed("V"), DiffConsequences.Budget),
        new("loop.device_v", "transmitter minimum voltage", p => DiffValue.Of(p.Loop?.DeviceVolts), Fixed("V"), DiffConsequences.Budget),
        new("loop.cable_m", "cable length", p => DiffValue.Of(p.Loop?.CableLengthMetres), Fixed("m"), DiffConsequences.Budget),
        new("loop.conductor", "conductor size", p => DiffValue.Word(p.Loop?.Conductor?.ToString()), NoUnit, DiffConsequences.Budget),
        new("loop.barrier_ohm", "barrier resistance", p => DiffValue.Of(p.Loop?.BarrierOhms), Fixed("ohm"), DiffConsequences.Budget),
        new("loop.extra_ohm", "extra resistance", p => DiffValue.Of(p.Loop?.ExtraOhms), Fixed("ohm"), DiffConsequences.Budget),
        new("loop.hart", "HART", p => p.Loop is { } l ? DiffValue.Of(l.Hart) : DiffValue.None, NoUnit, DiffConsequences.Budget),
        new("loop.current_ma", "budget current", p => DiffValue.Of(p.Loop?.CurrentMa), Fixed("mA"), DiffConsequences.Budget),
    };

    /// <summary>A loop block that only one version has: the value is the loop in words, or none.</summary>
    public static DiffField LoopPresence { get; } = new(
        "loop",
        "loop",
        p => DiffValue.Word(p.Loop is { } l ? LoopWords(l) : null),
        NoUnit,
        DiffConsequences.Budget,
        (o, n) => n.Loop is { } l ? $"loop added ({LoopWords(l)})" : $"loop removed (was {LoopWords(o.Loop!)})");

    /// <summary>Every field name <c>diff</c> can report, with the alarm kind written as its four kinds.</summary>
    public static IEnumerable<string> AllNames =>
        new[] { "title", "cycle_s" }
            .Concat(PointFields.Select(f => f.Name))
            .Concat(Enum.GetValues<AlarmKind>().SelectMany(k => AlarmFields(k).Select(f => f.Name).Prepend(AlarmPresence(k).Name)))
            .Concat(LoopFields.Select(f => f.Name).Prepend(LoopPresence.Name));

    /// <summary>The fields to compare for two versions of one point, in report order.</summary>
    public static IEnumerable<DiffField> For(Point oldPoint, Point newPoint)
    {
        foreach (var field in PointFields) yield return field;
        foreach (var kind in Enum.GetValues<AlarmKind>())
        {
            var before = AlarmOf(oldPoint, kind) is not null;
            var after = AlarmOf(newPoint, kind) is not null;
            if (before && after)
                foreach (var field in AlarmFields(kind)) yield return field;
            else if (before != after)
                yield return AlarmPresence(kind);
        }
        if (oldPoint.Loop is not null && newPoint.Loop is not null)
            foreach (var field in LoopFields) yield return field;
        else if ((oldPoint.Loop is null) != (newPoint.Loop is null))
            yield return LoopPresence;
    }

    public static Alarm? AlarmOf(Point point, AlarmKind kind) => point.Alarms.FirstOrDefault(a => a.Kind == kind);

    private static string? CardUnit(Point point) => point.Card.IsVoltage ? "V" : "mA";

    private static string FaultCodes(Card card) =>
        card.FaultCodes.IsDefaultOrEmpty ? "none" : string.Join(", ", card.FaultCodes.Select(c => c.ToString(CultureInfo.InvariantCulture)));

    private static string AlarmSettings(Alarm alarm, string unit) =>
        $"deadband {DisplayNumbers.Exact(alarm.Deadband)} {unit}, delay {DisplayNumbers.Exact(alarm.OnDelaySeconds)} s, clear {DisplayNumbers.Exact(alarm.OffDelaySeconds)} s, priority {alarm.Priority}";

    /// <summary>A loop block in words, in the order the language writes it.</summary>
    public static string LoopWords(LoopSpec loop)
    {
        var parts = new List<string> { $"supply {DisplayNumbers.Exact(loop.SupplyVolts)} V", $"device {DisplayNumbers.Exact(loop.DeviceVolts)} V" };
        if (loop.CableLengthMetres is { } length) parts.Add($"cable {DisplayNumbers.Exact(length)} m {loop.Conductor}");
        if (loop.BarrierOhms != 0) parts.Add($"barrier {DisplayNumbers.Exact(loop.BarrierOhms)} ohm");
        if (loop.ExtraOhms != 0) parts.Add($"extra {DisplayNumbers.Exact(loop.ExtraOhms)} ohm");
        if (loop.Hart) parts.Add("hart");
        parts.Add($"current {DisplayNumbers.Exact(loop.CurrentMa)} mA");
        return string.Join(", ", parts);
    }
}
