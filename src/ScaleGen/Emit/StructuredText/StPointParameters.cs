using System.Collections.Immutable;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Emit.StructuredText;

/// <summary>
/// A set of raw counts as the generated code tests it: <c>Min &lt;= raw AND raw &lt;= Max</c>,
/// empty when Min &gt; Max. The same shape serves rising and falling cards.
/// </summary>
public readonly record struct StRawRange(long Min, long Max)
{
    public static readonly StRawRange Empty = new(1, 0);

    public bool IsEmpty => Min > Max;

    public bool Contains(long raw) => Min <= raw && raw <= Max;

    /// <summary>An engine raw condition as a range; exact for every raw count inside the card limits.</summary>
    public static StRawRange Of(RawCondition condition, long limitLow, long limitHigh) => condition.Test switch
    {
        RawTest.Always => new(limitLow, limitHigh),
        RawTest.AtMost => new(limitLow, condition.Threshold),
        RawTest.AtLeast => new(condition.Threshold, limitHigh),
        _ => Empty,
    };
}

/// <summary>One alarm kind's entry in the parameter record; <see cref="Alarm"/> is null when the point has no alarm of that kind.</summary>
public sealed record StAlarmParameters(
    AlarmKind Kind,
    AlarmPoint? Alarm,
    StRawRange Trip,
    StRawRange Clear,
    int OnDelayScans,
    int OffDelayScans)
{
    public bool Enabled => Alarm is not null;
}

/// <summary>
/// Every per-point constant of the generated parameter record, each taken from the engine
/// (nothing here re-derives scaling math). The generated block evaluates these in the
/// order <see cref="PointSimulator"/> documents.
/// </summary>
public sealed record StPointParameters(
    Point Point,
    long LimitLow,
    long LimitHigh,
    ImmutableArray<long> FaultCodesInsideLimits,
    StRawRange FaultLow,
    StRawRange FaultHigh,
    StRawRange Under,
    StRawRange Over,
    Affine Coefficients,
    StRawRange Cutoff,
    bool HoldLastGood,
    double FaultValue,
    bool FilterOn,
    double Alpha,
    ImmutableArray<StAlarmParameters> Alarms)
{
    /// <summary>The alarms are judged on raw ranges (exact) where there is no filter between the raw count and the alarm.</summary>
    public bool AlarmsOnRaw => !FilterOn;

    public StAlarmParameters AlarmOf(AlarmKind kind) => Alarms.First(a => a.Kind == kind);

    /// <summary>
    /// The card's fault codes that lie inside its limits, in order, each once: the generated
    /// code tests these one by one (codes outside the limits are card faults through the
    /// limits already).
    /// </summary>
    /// <remarks>Worked out once per card: points share their card, and a plant has tens of thousands of points.</remarks>
    public static ImmutableArray<long> FaultCodesInside(Card card) =>
        card.FaultCodes.IsDefaultOrEmpty
            ? ImmutableArray<long>.Empty
            : ImmutableCollectionsMarshal.AsImmutableArray(CodesInside.GetValue(card,
                c => c.FaultCodes.Where(code => code >= c.LimitLow && code <= c.LimitHigh).Distinct().Order().ToArray()));

    private static readonly ConditionalWeakTable<Card, long[]> CodesInside = new();

    // A kind the point has no alarm of: the same entry for every point.
    private static readonly StAlarmParameters[] Disabled = Enum.GetValues<AlarmKind>()
        .Select(kind => new StAlarmParameters(kind, null, StRawRange.Empty, StRawRange.Empty, 0, 0)).ToArray();

    public static StPointParameters Of(Point point, double cycleSeconds)
    {
        var bands = StatusBands.RawThresholds(point);
        var (low, high) = (bands.LimitLow, bands.LimitHigh);
        StRawRange Range(RawCondition condition) => StRawRange.Of(condition, low, high);

        // Plain loops rather than LINQ: this runs once per point for plant.st and plant.xml.
        var points = AlarmMath.AlarmPoints(point);
        var alarms = ImmutableArray.CreateBuilder<StAlarmParameters>(StNames.AlarmKinds.Length);
        foreach (var kind in StNames.AlarmKinds)
        {
            AlarmPoint? alarmPoint = null;
            foreach (var candidate in points)
            {
                if (candidate.Alarm.Kind != kind) continue;
                alarmPoint = candidate;
                break;
            }
            alarms.Add(alarmPoint is null
                ? Disabled[(int)kind]
                : new StAlarmParameters(kind, alarmPoint, Range(alarmPoint.TripCondition), Range(alarmPoint.ClearCondition),
                    // The delays in cycles as the engine's alarm state machine counts them.
                    ScanTiming.DelayScans(alarmPoint.Alarm.OnDelaySeconds, cycleSeconds),
                    ScanTiming.DelayScans(alarmPoint.Alarm.OffDelaySeconds, cycleSeconds)));
        }

        return new StPointParameters(
            point,
            low,
            high,
            FaultCodesInside(point.Card),
            Range(bands.FaultLow),
            Range(bands.FaultHigh),
            Range(bands.Under),
            Range(bands.Over),
            SignalPath.LinearCoefficients(point),
            Range(SignalPath.CutoffCondition(point)),
            HoldLastGood: point.OnFault.Kind == FaultActionKind.Hold,
            // Hold shows this too until there is a good value.
            FaultValue: FaultActions.Substitute(point, lastGood: null),
            FilterOn: point.FilterSeconds > 0,
            Alpha: LagFilter.AlphaFor(point.FilterSeconds, cycleSeconds),
            alarms.MoveToImmutable());
    }
}
