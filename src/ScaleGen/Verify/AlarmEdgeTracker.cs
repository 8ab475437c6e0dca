using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Verify;

/// <summary>How one scan's alarm bit compares with the reference.</summary>
internal enum AlarmVerdict
{
    /// <summary>The bit equals the reference's.</summary>
    Agrees,
    /// <summary>The bit differs from the reference's, but only because a limit decision was taken with the value within the REAL tolerance of the setpoint or reset value.</summary>
    Edge,
    Mismatch,
}

/// <summary>
/// Judges the alarm bit of a point whose alarms compare REAL values (a filtered point). It
/// follows every state the reference's <see cref="AlarmStateMachine"/> could be in had each
/// limit decision taken within tolerance of its edge gone either way: at such a scan each
/// state splits in two. States whose output differs from the bit the block showed are
/// dropped. The reference's own state is always among them, so a bit equal to the
/// reference's always agrees; a different bit is an edge case when some state shows it,
/// else a mismatch.
/// </summary>
internal sealed class AlarmEdgeTracker
{
    /// <summary>Most states followed at once; beyond it the reference's state and the first others are kept.</summary>
    private const int MaxStates = 1024;

    private readonly Alarm _alarm;
    private readonly double _cycleSeconds;

    /// <summary>While only the reference's state is possible: a copy of it, stepped alongside (no allocation per scan).</summary>
    private AlarmStateMachine _shadow;
    private List<AlarmStateMachine>? _states;

    public AlarmEdgeTracker(Alarm alarm, double cycleSeconds)
    {
        _alarm = alarm;
        _cycleSeconds = cycleSeconds;
        _shadow = new AlarmStateMachine(alarm, cycleSeconds);
    }

    public void Reset()
    {
        _shadow.Reset();
        _states = null;
    }

    /// <param name="value">The reference's shown value.</param>
    /// <param name="tolerance">The bound on how far the block's REAL value may lie from it.</param>
    /// <param name="faulted">The reference's fault state this scan.</param>
    /// <param name="expected">The reference's alarm bit.</param>
    /// <param name="observed">The block's alarm bit.</param>
    /// <param name="reference">The reference's machine, already stepped this scan.</param>
    public AlarmVerdict Step(double value, double tolerance, bool faulted, bool expected, bool observed, AlarmStateMachine reference)
    {
        if (_states is null)
        {
            if (faulted || !NearEdge(_shadow, value, tolerance))
            {
                _shadow.Step(value, faulted);
                return observed == expected ? AlarmVerdict.Agrees : AlarmVerdict.Mismatch;
            }
            _states = [_shadow];
        }

        var next = new List<AlarmStateMachine>(_states.Count * 2 + 1) { reference.Clone() };
        foreach (var state in _states)
        {
            if (!faulted && NearEdge(state, value, tolerance))
            {
                var other = state.Clone();
                other.Step(LimitHolds, faulted: false);
                next.Add(other);
                state.Step(LimitGone, faulted: false);
                next.Add(state);
            }
            else
            {
                state.Step(value, faulted);
                next.Add(state);
            }
        }

        var matching = next.DistinctBy(Key).Where(s => s.Active == observed).Take(MaxStates).ToList();
        var verdict = observed == expected ? AlarmVerdict.Agrees : matching.Count > 0 ? AlarmVerdict.Edge : AlarmVerdict.Mismatch;
        if (verdict == AlarmVerdict.Mismatch || (matching.Count == 1 && Key(matching[0]) == Key(reference)))
        {
            // Back to following the reference alone.
            _shadow = reference.Clone();
            _states = null;
        }
        else _states = matching;
        return verdict;
    }

    private static (bool, bool, bool, int, int) Key(AlarmStateMachine s) => (s.Condition, s.Delayed, s.Active, s.OnCount, s.OffCount);

    /// <summary>
    /// The one limit decision of a scan is against the setpoint while the limit is off and
    /// against the reset value while it is on; the block compares with REAL constants, so
    /// their rounding widens the band.
    /// </summary>
    private bool NearEdge(AlarmStateMachine state, double value, double tolerance)
    {
        var edge = state.Condition ? _alarm.ResetValue : _alarm.Setpoint;
        return Math.Abs(value - edge) <= tolerance + ValueTolerance.U * Math.Abs(edge);
    }

    /// <summary>A value that makes the limit hold whatever the state: the setpoint itself (at or beyond it, and not beyond the reset value).</summary>
    private double LimitHolds => _alarm.Setpoint;

    /// <summary>A value clearly on the normal side of the reset value (so neither at the setpoint nor short of clearing).</summary>
    private double LimitGone => _alarm.IsHigh
        ? _alarm.ResetValue - (1 + Math.Abs(_alarm.ResetValue))
        : _alarm.ResetValue + (1 + Math.Abs(_alarm.ResetValue));
}
