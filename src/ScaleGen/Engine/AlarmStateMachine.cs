using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>
/// The scan-by-scan reference of one alarm, which generated code must reproduce exactly.
/// </summary>
/// <remarks>
/// Each scan, given the point's (filtered) value and whether the point is faulted:
/// <list type="number">
/// <item>Faulted: the condition, both delay counters and the output reset to FALSE/0; stop.</item>
/// <item>Condition with deadband: while FALSE it becomes TRUE at value &gt;= setpoint (HH/H) or
/// value &lt;= setpoint (L/LL); while TRUE it stays until value &lt; setpoint - deadband (HH/H)
/// or value &gt; setpoint + deadband (L/LL).</item>
/// <item>On-delay (IEC TON on the condition, time in cycles): <c>OnCount</c> = condition ?
/// min(OnCount + 1, OnDelayScans + 1) : 0; <c>Delayed</c> = OnCount &gt; OnDelayScans. With no
/// delay the output follows the condition in the same scan; with 5 s at 0.1 s it turns TRUE
/// 50 scans after the scan in which the condition first held.</item>
/// <item>Off-delay (IEC TOF on Delayed): if Delayed, output TRUE and <c>OffCount</c> = 0; else if
/// the output is TRUE, OffCount += 1 and the output drops once OffCount &gt; OffDelayScans
/// (then OffCount = 0). With no off-delay it drops in the scan the condition clears.</item>
/// </list>
/// Delays in cycles come from <see cref="ScanTiming.DelayScans"/>.
/// </remarks>
public sealed class AlarmStateMachine
{
    public AlarmStateMachine(Alarm alarm, double cycleSeconds)
    {
        Alarm = alarm;
        OnDelayScans = ScanTiming.DelayScans(alarm.OnDelaySeconds, cycleSeconds);
        OffDelayScans = ScanTiming.DelayScans(alarm.OffDelaySeconds, cycleSeconds);
    }

    public Alarm Alarm { get; }

    public int OnDelayScans { get; }

    public int OffDelayScans { get; }

    /// <summary>The condition with deadband, before delays.</summary>
    public bool Condition { get; private set; }

    /// <summary>The condition after the on-delay.</summary>
    public bool Delayed { get; private set; }

    /// <summary>The alarm output.</summary>
    public bool Active { get; private set; }

    public int OnCount { get; private set; }

    public int OffCount { get; private set; }

    public bool Step(double value, bool faulted)
    {
        if (faulted)
        {
            Reset();
            return false;
        }

        Condition = Condition ? !AlarmMath.IsClear(Alarm, value) : AlarmMath.IsAtOrBeyond(Alarm, value);

        OnCount = Condition ? Math.Min(OnCount + 1, OnDelayScans + 1) : 0;
        Delayed = OnCount > OnDelayScans;

        if (Delayed)
        {
            Active = true;
            OffCount = 0;
        }
        else if (Active)
        {
            OffCount++;
            if (OffCount > OffDelayScans)
            {
                Active = false;
                OffCount = 0;
            }
        }
        return Active;
    }

    /// <summary>A copy in the same state (the verifier follows both outcomes of a limit decision taken within REAL precision of an edge).</summary>
    public AlarmStateMachine Clone() => (AlarmStateMachine)MemberwiseClone();

    public void Reset()
    {
        Condition = false;
        Delayed = false;
        Active = false;
        OnCount = 0;
        OffCount = 0;
    }
}
