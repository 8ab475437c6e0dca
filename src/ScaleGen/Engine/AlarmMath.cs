using System.Collections.Immutable;
using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>
/// Where one alarm trips and resets, in engineering units, loop current and raw counts.
/// </summary>
/// <param name="TripValue">The setpoint: HH/H active at value &gt;= it, L/LL at value &lt;= it.</param>
/// <param name="ResetValue">Setpoint - deadband (high) or + deadband (low): the alarm clears beyond it.</param>
/// <param name="TripMa">Loop current at which the shown value reaches the setpoint (inverse path).</param>
/// <param name="ResetMa">Loop current at which the shown value reaches the reset value.</param>
/// <param name="TripCondition">Exactly which raw counts inside the card limits put the value at or beyond the setpoint.</param>
/// <param name="ClearCondition">Exactly which raw counts inside the card limits put the value beyond the reset value (clear side).</param>
public sealed record AlarmPoint(
    Alarm Alarm,
    double TripValue,
    double ResetValue,
    double TripMa,
    double ResetMa,
    RawCondition TripCondition,
    RawCondition ClearCondition)
{
    /// <summary>The first raw count, coming from the normal side, at which the alarm trips; null if the card limits never reach it (or always do).</summary>
    public long? TripRaw => BoundaryOf(TripCondition);

    /// <summary>The first raw count, coming from the alarm side, at which an active alarm clears; null if never (or always) inside the limits.</summary>
    public long? ResetRaw => BoundaryOf(ClearCondition);

    private static long? BoundaryOf(RawCondition condition) =>
        condition.Test is RawTest.AtMost or RawTest.AtLeast ? condition.Threshold : null;
}

/// <summary>Alarm conditions and the trip / reset points of a point's alarms.</summary>
public static class AlarmMath
{
    /// <summary>HH/H: value &gt;= setpoint; L/LL: value &lt;= setpoint (no deadband, no delay).</summary>
    public static bool IsAtOrBeyond(Alarm alarm, double value) =>
        alarm.IsHigh ? value >= alarm.Setpoint : value <= alarm.Setpoint;

    /// <summary>The clear condition of an active alarm: HH/H value &lt; setpoint - deadband; L/LL value &gt; setpoint + deadband.</summary>
    public static bool IsClear(Alarm alarm, double value) =>
        alarm.IsHigh ? value < alarm.ResetValue : value > alarm.ResetValue;

    public static ImmutableArray<AlarmPoint> AlarmPoints(Point point) =>
        point.Alarms.Select(a => AlarmPointOf(point, a)).ToImmutableArray();

    public static AlarmPoint AlarmPointOf(Point point, Alarm alarm)
    {
        var card = point.Card;
        var valueRises = SignalPath.ValueRisesWithRaw(point);
        // The pure signal path (no fault action) is monotone in raw, so each condition holds
        // on one end of the raw range: a high alarm where the value is high, and so on.
        var trip = RawSearch.Boundary(card.LimitLow, card.LimitHigh, holdsOnLowRaws: alarm.IsHigh != valueRises,
            raw => IsAtOrBeyond(alarm, SignalPath.RawToValue(point, raw)));
        var clear = RawSearch.Boundary(card.LimitLow, card.LimitHigh, holdsOnLowRaws: alarm.IsHigh == valueRises,
            raw => IsClear(alarm, SignalPath.RawToValue(point, raw)));
        return new AlarmPoint(
            alarm,
            alarm.Setpoint,
            alarm.ResetValue,
            SignalPath.ValueToMa(point, alarm.Setpoint),
            SignalPath.ValueToMa(point, alarm.ResetValue),
            trip,
            clear);
    }
}

/// <summary>Deadband and resolution helpers (for the binder's conversions and warnings).</summary>
public static class Deadbands
{
    /// <summary>A deadband given in % of span, in engineering units (always positive).</summary>
    public static double PercentOfSpanToEu(Point point, double percent) =>
        Math.Abs(point.Span) * percent / 100.0;

    public static double EuToPercentOfSpan(Point point, double eu) =>
        eu / Math.Abs(point.Span) * 100.0;

    /// <summary>
    /// How much the shown value changes for one raw count near a value (always positive).
    /// On a square-root point this grows towards zero flow; the cutoff jump is ignored.
    /// A deadband smaller than this cannot be resolved by the card.
    /// </summary>
    public static double OneCountInEu(Point point, double value)
    {
        var raw = SignalPath.ValueToRaw(point, value);
        double At(double r) => SignalPath.ExtractedToValue(point,
            SignalPath.ExtractedIgnoringCutoff(point, SignalPath.Fraction(point, SignalPath.RawToMa(point, r))));
        return Math.Abs(At(raw + 0.5) - At(raw - 0.5));
    }

    /// <summary>One raw count as a percentage of the signal span (for a square-root point, of the differential-pressure span).</summary>
    public static double ResolutionPercentOfSpan(Point point) =>
        Math.Abs(SignalPath.RawToFractionCoefficients(point).Gain) * 100.0;

    /// <summary>How many raw counts the signal span covers on the card.</summary>
    public static double CountsAcrossSignalSpan(Point point) =>
        Math.Abs(SignalPath.MaToRaw(point, point.SignalHighMa) - SignalPath.MaToRaw(point, point.SignalLowMa));
}
