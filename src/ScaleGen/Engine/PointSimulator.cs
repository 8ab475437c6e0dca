using System.Collections.Immutable;
using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>
/// Steps one point scan by scan at the plant cycle time: the reference behaviour that
/// generated PLC code must reproduce (value, status and alarm bits on every scan).
/// </summary>
/// <remarks>
/// Order of operations within one scan (the ST emitter mirrors it exactly):
/// <list type="number">
/// <item>Status from the raw count (<see cref="StatusBands.StatusOf"/>); faulted = FAULT_LOW,
/// FAULT_HIGH or CARD_FAULT.</item>
/// <item>Value from the raw count along the signal path (<see cref="SignalPath.RawToValue"/>;
/// extraction and cutoff included; UNDER/OVER follow the line, not clamped).</item>
/// <item>Fault action: if faulted the value is replaced by <see cref="FaultActions.Substitute"/>
/// (Hold = last good unfiltered value from step 2, LRV before any); if not faulted the value
/// is remembered as the last good value.</item>
/// <item>Filter (<see cref="LagFilter"/>) on the value from step 3; the first good sample
/// initialises it, and it is not reset by a fault.</item>
/// <item>Alarms (<see cref="AlarmStateMachine"/>) on the filtered value, reset while faulted.</item>
/// </list>
/// The reported value is the filter output.
/// </remarks>
public sealed class PointSimulator
{
    private readonly AlarmStateMachine[] _alarms;
    private readonly LagFilter _filter;
    private double? _lastGood;

    public PointSimulator(Point point, double cycleSeconds)
    {
        if (!(cycleSeconds > 0)) throw new ArgumentOutOfRangeException(nameof(cycleSeconds), "The cycle time must be positive.");
        Point = point;
        CycleSeconds = cycleSeconds;
        _filter = new LagFilter(point.FilterSeconds, cycleSeconds);
        _alarms = point.Alarms.Select(a => new AlarmStateMachine(a, cycleSeconds)).ToArray();
    }

    public Point Point { get; }

    public double CycleSeconds { get; }

    public IReadOnlyList<AlarmStateMachine> Alarms => _alarms;

    /// <summary>The last good (unfiltered) value, null before the first good scan.</summary>
    public double? LastGoodValue => _lastGood;

    /// <summary>Runs one scan. In the result, <c>Alarms</c> are the alarm outputs (deadband and delays applied).</summary>
    public Reading Step(long raw)
    {
        var ma = SignalPath.RawToMa(Point, raw);
        var status = StatusBands.StatusOf(Point, raw);
        var faulted = StatusBands.IsFault(status);

        var value = SignalPath.MaToValue(Point, ma);
        if (faulted) value = FaultActions.Substitute(Point, _lastGood);
        else _lastGood = value;

        var shown = _filter.Step(value, good: !faulted);

        var flags = ImmutableArray.CreateBuilder<AlarmFlag>(_alarms.Length);
        foreach (var alarm in _alarms)
            flags.Add(new AlarmFlag(alarm.Alarm.Kind, alarm.Step(shown, faulted)));

        return new Reading(raw, ma, SignalPath.Fraction(Point, ma) * 100.0, shown, status, flags.MoveToImmutable());
    }

    public IEnumerable<Reading> Run(IEnumerable<long> raws)
    {
        foreach (var raw in raws) yield return Step(raw);
    }

    public void Reset()
    {
        _lastGood = null;
        _filter.Reset();
        foreach (var alarm in _alarms) alarm.Reset();
    }
}
