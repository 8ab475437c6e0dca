using System.Collections.Immutable;
using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>Whether one alarm's condition holds for one sample.</summary>
public readonly record struct AlarmFlag(AlarmKind Kind, bool Active);

/// <summary>
/// What a point reads for one raw count, with no history: the basis of <c>eval</c>.
/// </summary>
/// <param name="Raw">The count the card delivers.</param>
/// <param name="Ma">The loop current that count stands for.</param>
/// <param name="Percent">Position in the signal span, 0..100 at signal low..high, before square-root extraction.</param>
/// <param name="Value">The value the PLC shows: after extraction, cutoff and the fault action.</param>
/// <param name="Status">The status band.</param>
/// <param name="Alarms">Per alarm, in the point's order: value at or beyond the setpoint (false while faulted).</param>
public sealed record Reading(
    long Raw,
    double Ma,
    double Percent,
    double Value,
    PointStatus Status,
    ImmutableArray<AlarmFlag> Alarms)
{
    public bool IsFault => StatusBands.IsFault(Status);
}

/// <summary>One-sample evaluation of a point (no delays, deadband, filter or history).</summary>
public static class Evaluator
{
    public static Reading Evaluate(Point point, long raw)
    {
        var ma = SignalPath.RawToMa(point, raw);
        var status = StatusBands.StatusOf(point, raw);
        var faulted = StatusBands.IsFault(status);
        // One sample has no last good value, so Hold shows LRV.
        var value = faulted ? FaultActions.Substitute(point, lastGood: null) : SignalPath.MaToValue(point, ma);
        var alarms = point.Alarms
            .Select(a => new AlarmFlag(a.Kind, !faulted && AlarmMath.IsAtOrBeyond(a, value)))
            .ToImmutableArray();
        return new Reading(raw, ma, SignalPath.Fraction(point, ma) * 100.0, value, status, alarms);
    }

    /// <summary>Evaluates the raw count the card delivers for a loop current (nearest count).</summary>
    public static Reading EvaluateMa(Point point, double ma) =>
        Evaluate(point, SignalPath.NearestRaw(point, ma));

    /// <summary>
    /// Evaluates the count for a voltage measured across the card input or shunt; null when
    /// the point has no terminal resistance (a mA card with input 0 ohm).
    /// </summary>
    public static Reading? EvaluateVolts(Point point, double volts) =>
        SignalPath.VoltsToMa(point, volts) is { } ma ? EvaluateMa(point, ma) : null;
}

/// <summary>The value a faulted point shows.</summary>
public static class FaultActions
{
    /// <summary>
    /// Hold: the last good value, or LRV before there has been one. Low: the smaller of
    /// LRV/URV. High: the larger. Value: the configured constant.
    /// </summary>
    public static double Substitute(Point point, double? lastGood) => point.OnFault.Kind switch
    {
        FaultActionKind.Low => point.ValueMin,
        FaultActionKind.High => point.ValueMax,
        FaultActionKind.Value => point.OnFault.Value,
        _ => lastGood ?? point.Lrv,
    };
}
