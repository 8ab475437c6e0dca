using ScaleGen.Emit;
using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Review;

/// <summary>
/// What a change does, in loop current, raw counts, volts or scans. Every number comes from
/// the engine applied to the whole old and the whole new point, so a consequence is right
/// even when several fields of the point changed together.
/// </summary>
internal static class DiffConsequences
{
    private static string Ma(double ma) => DisplayNumbers.Fixed(ma, 2) + " mA";

    private static string Value(Point point, double value) => DisplayNumbers.Significant(value) + " " + point.Unit;

    /// <summary>Range, signal and square root: what the middle of the (new) signal span now reads.</summary>
    public static string? ValueAtMidSignal(DiffSide before, DiffSide after)
    {
        var probe = (after.Point.SignalLowMa + after.Point.SignalHighMa) / 2;
        var oldValue = SignalPath.MaToValue(before.Point, probe);
        var newValue = SignalPath.MaToValue(after.Point, probe);
        return $"{DisplayNumbers.Exact(probe)} mA reads {Value(after.Point, newValue)} instead of {Value(before.Point, oldValue)}";
    }

    /// <summary>Card line and shunt: which raw counts the (new) signal span arrives as.</summary>
    public static string? RawAtSignalEnds(DiffSide before, DiffSide after)
    {
        var low = after.Point.SignalLowMa;
        var high = after.Point.SignalHighMa;
        string Raws(Point p) => $"raw {SignalPath.NearestRaw(p, low)} .. {SignalPath.NearestRaw(p, high)}";
        return $"{DisplayNumbers.Exact(low)} .. {DisplayNumbers.Exact(high)} mA arrive as {Raws(after.Point)} instead of {Raws(before.Point)}";
    }

    /// <summary>Card limits: the loop currents the card can still report.</summary>
    public static string? CardLimits(DiffSide before, DiffSide after)
    {
        string Currents(Point p)
        {
            var a = SignalPath.RawToMa(p, p.Card.LimitLow);
            var b = SignalPath.RawToMa(p, p.Card.LimitHigh);
            return $"{DisplayNumbers.Fixed(Math.Min(a, b), 2)} .. {Ma(Math.Max(a, b))}";
        }
        return $"the card reports {Currents(after.Point)} instead of {Currents(before.Point)}; beyond that it is CARD_FAULT";
    }

    /// <summary>Card input resistance: the loop budget if there is one, else the volts across the input.</summary>
    public static string? InputResistance(DiffSide before, DiffSide after)
    {
        if (before.Point.Loop is not null && after.Point.Loop is not null) return Budget(before, after);
        var at = after.Point.SignalHighMa;
        return $"{DisplayNumbers.Fixed(SignalPath.MaToTerminalVolts(after.Point, at), 2)} V across the input at {Ma(at)} instead of {DisplayNumbers.Fixed(SignalPath.MaToTerminalVolts(before.Point, at), 2)} V";
    }

    /// <summary>Cutoff: the current below which a square-root point shows LRV.</summary>
    public static string? Cutoff(DiffSide before, DiffSide after)
    {
        string? Edge(Point p) => p.SquareRoot ? Ma(SignalPath.ValueToMa(p, p.Lrv)) : null;
        var newEdge = Edge(after.Point);
        var oldEdge = Edge(before.Point);
        if (newEdge is null) return oldEdge is null ? null : $"no cutoff any more (it was at {oldEdge})";
        return $"reads LRV ({Value(after.Point, after.Point.Lrv)}) below {newEdge}" + (oldEdge is null ? "" : $" instead of below {oldEdge}");
    }

    /// <summary>Fault bands: the raw counts that are now a fault.</summary>
    public static string? FaultBands(DiffSide before, DiffSide after) =>
        $"{FaultRaws(after.Point)} instead of {FaultRaws(before.Point)}";

    private static string FaultRaws(Point point)
    {
        var thresholds = StatusBands.RawThresholds(point);
        var parts = new List<string>();
        if (thresholds.FaultLow.Test != RawTest.Never) parts.Add($"FAULT_LOW at {thresholds.FaultLow}");
        if (thresholds.FaultHigh.Test != RawTest.Never) parts.Add($"FAULT_HIGH at {thresholds.FaultHigh}");
        return parts.Count == 0 ? "no fault band" : string.Join(", ", parts);
    }

    /// <summary>On-fault action: what a faulted point shows.</summary>
    public static string? FaultValue(DiffSide before, DiffSide after)
    {
        static string Shows(Point p) => p.OnFault.Kind == FaultActionKind.Hold
            ? "its last good value"
            : Value(p, FaultActions.Substitute(p, lastGood: null));
        return $"a faulted point shows {Shows(after.Point)} instead of {Shows(before.Point)}";
    }

    /// <summary>Tolerance: the check-sheet tolerance in engineering units.</summary>
    public static string? Tolerance(DiffSide before, DiffSide after) =>
        $"+/- {Value(after.Point, Deadbands.PercentOfSpanToEu(after.Point, after.Point.TolerancePercent))} instead of +/- {Value(before.Point, Deadbands.PercentOfSpanToEu(before.Point, before.Point.TolerancePercent))}";

    /// <summary>Setpoint: the trip current and raw count.</summary>
    public static string? Trip(DiffSide before, DiffSide after, AlarmKind kind)
    {
        var (oldPoint, newPoint) = (AlarmPointOf(before, kind), AlarmPointOf(after, kind));
        if (oldPoint is null || newPoint is null) return null;
        return $"trips at {Where(newPoint.TripMa, newPoint.TripRaw)} instead of {Where(oldPoint.TripMa, oldPoint.TripRaw)}";
    }

    /// <summary>Deadband: the reset current and raw count.</summary>
    public static string? Reset(DiffSide before, DiffSide after, AlarmKind kind)
    {
        var (oldPoint, newPoint) = (AlarmPointOf(before, kind), AlarmPointOf(after, kind));
        if (oldPoint is null || newPoint is null) return null;
        return $"resets at {Where(newPoint.ResetMa, newPoint.ResetRaw)} instead of {Where(oldPoint.ResetMa, oldPoint.ResetRaw)}";
    }

    /// <summary>On- and off-delays: whole task cycles, as the generated code counts them.</summary>
    public static string? Scans(DiffSide before, DiffSide after, AlarmKind kind, Func<Alarm, double> seconds)
    {
        var (oldAlarm, newAlarm) = (DiffFields.AlarmOf(before.Point, kind), DiffFields.AlarmOf(after.Point, kind));
        if (oldAlarm is null || newAlarm is null) return null;
        var cycle = after.Plant.CycleSeconds;
        return $"{ScanTiming.DelayScans(seconds(newAlarm), cycle)} scans of {DisplayNumbers.Exact(cycle)} s instead of {ScanTiming.DelayScans(seconds(oldAlarm), before.Plant.CycleSeconds)}";
    }

    /// <summary>An alarm added or removed: where it trips.</summary>
    public static string? AlarmPresence(DiffSide before, DiffSide after, AlarmKind kind)
    {
        if (AlarmPointOf(after, kind) is { } added)
            return $"trips at {Where(added.TripMa, added.TripRaw)}, resets at {Where(added.ResetMa, added.ResetRaw)}";
        if (AlarmPointOf(before, kind) is { } removed)
            return $"no longer trips at {Where(removed.TripMa, removed.TripRaw)}";
        return null;
    }

    /// <summary>Loop fields: the budget before and after.</summary>
    public static string? Budget(DiffSide before, DiffSide after)
    {
        var (oldBudget, newBudget) = (LoopBudget.Evaluate(before.Point), LoopBudget.Evaluate(after.Point));
        if (newBudget is null) return oldBudget is null ? null : "no loop budget is checked any more";
        var text = $"needs {DisplayNumbers.Fixed(newBudget.MinSupplyVolts, 2)} V of {DisplayNumbers.Exact(newBudget.SupplyVolts)} V at {DisplayNumbers.Exact(newBudget.CurrentMa)} mA {BudgetState(newBudget)}";
        return oldBudget is null ? text : $"{text} instead of {DisplayNumbers.Fixed(oldBudget.MinSupplyVolts, 2)} V of {DisplayNumbers.Exact(oldBudget.SupplyVolts)} V {BudgetState(oldBudget)}";
    }

    /// <summary>"(margin 2.21 V, HART window ok)", or "(margin -0.40 V: FAILS)".</summary>
    private static string BudgetState(LoopBudgetResult budget)
    {
        var words = $"(margin {DisplayNumbers.Fixed(budget.MarginVolts, 2)} V{(budget.Ok ? "" : ": FAILS")}";
        if (budget.HartOk is { } hart) words += hart ? ", HART window ok" : ", outside the HART window";
        return words + ")";
    }

    private static AlarmPoint? AlarmPointOf(DiffSide side, AlarmKind kind) =>
        DiffFields.AlarmOf(side.Point, kind) is { } alarm ? AlarmMath.AlarmPointOf(side.Point, alarm) : null;

    private static string Where(double ma, long? raw) => raw is { } r ? $"{Ma(ma)} (raw {r})" : Ma(ma);
}
