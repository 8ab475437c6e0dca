using System.Collections.Immutable;
using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>
/// The status of a point for one raw count. Judged on the loop current, first match wins:
/// CARD_FAULT (raw equals a fault code or lies outside the card limits), FAULT_LOW
/// (I &lt;= fault-low threshold), FAULT_HIGH (I &gt;= fault-high threshold), UNDER
/// (I &lt; signal low), OVER (I &gt; signal high), else OK.
/// </summary>
public static class StatusBands
{
    /// <summary>FAULT_LOW, FAULT_HIGH and CARD_FAULT: the value follows the fault action and alarms are off.</summary>
    public static bool IsFault(PointStatus status) =>
        status is PointStatus.FAULT_LOW or PointStatus.FAULT_HIGH or PointStatus.CARD_FAULT;

    public static bool IsCardFault(Card card, long raw) =>
        raw < card.LimitLow || raw > card.LimitHigh || (!card.FaultCodes.IsDefault && card.FaultCodes.Contains(raw));

    public static PointStatus StatusOf(Point point, long raw) =>
        IsCardFault(point.Card, raw) ? PointStatus.CARD_FAULT : StatusOfMa(point, SignalPath.RawToMa(point, raw));

    /// <summary>The current bands alone (what a loop current means, without a card in between).</summary>
    public static PointStatus StatusOfMa(Point point, double ma)
    {
        if (IsFaultLow(point, ma)) return PointStatus.FAULT_LOW;
        if (IsFaultHigh(point, ma)) return PointStatus.FAULT_HIGH;
        if (IsUnder(point, ma)) return PointStatus.UNDER;
        if (IsOver(point, ma)) return PointStatus.OVER;
        return PointStatus.OK;
    }

    // One predicate per band, shared by StatusOfMa and the raw-threshold search so the two
    // cannot drift apart.
    private static bool IsFaultLow(Point point, double ma) => point.Health.FaultLowMa is { } t && ma <= t;
    private static bool IsFaultHigh(Point point, double ma) => point.Health.FaultHighMa is { } t && ma >= t;
    private static bool IsUnder(Point point, double ma) => ma < point.SignalLowMa;
    private static bool IsOver(Point point, double ma) => ma > point.SignalHighMa;

    /// <summary>
    /// The bands as integer raw-count conditions over the card limits, so generated code can
    /// compare raw counts and agree with <see cref="StatusOf"/> for every raw value. Found by
    /// bisection on the same double-precision predicates <see cref="StatusOf"/> uses (the
    /// current is monotone in raw, also in floating point), and correct for a card whose
    /// counts fall as the current rises.
    /// </summary>
    public static RawStatusThresholds RawThresholds(Point point)
    {
        var card = point.Card;
        var rising = SignalPath.MaRisesWithRaw(point);
        RawCondition Band(Func<Point, double, bool> test, bool holdsOnLowCurrents) =>
            RawSearch.Boundary(card.LimitLow, card.LimitHigh, holdsOnLowCurrents == rising,
                raw => test(point, SignalPath.RawToMa(point, raw)));

        return new RawStatusThresholds(
            card.LimitLow,
            card.LimitHigh,
            card.FaultCodes.IsDefault ? ImmutableArray<long>.Empty : card.FaultCodes,
            FaultLow: point.Health.FaultLowMa is null ? RawCondition.Never : Band(IsFaultLow, holdsOnLowCurrents: true),
            FaultHigh: point.Health.FaultHighMa is null ? RawCondition.Never : Band(IsFaultHigh, holdsOnLowCurrents: false),
            Under: Band(IsUnder, holdsOnLowCurrents: true),
            Over: Band(IsOver, holdsOnLowCurrents: false));
    }
}

/// <summary>
/// Status bands as integer comparisons on the raw count. Each band condition is exact for
/// every raw count inside [LimitLow, LimitHigh]; outside that the status is CARD_FAULT anyway.
/// </summary>
public sealed record RawStatusThresholds(
    long LimitLow,
    long LimitHigh,
    ImmutableArray<long> FaultCodes,
    RawCondition FaultLow,
    RawCondition FaultHigh,
    RawCondition Under,
    RawCondition Over)
{
    /// <summary>The same first-match order as <see cref="StatusBands.StatusOf"/>, on integers only.</summary>
    public PointStatus StatusOf(long raw)
    {
        if (raw < LimitLow || raw > LimitHigh || FaultCodes.Contains(raw)) return PointStatus.CARD_FAULT;
        if (FaultLow.IsMet(raw)) return PointStatus.FAULT_LOW;
        if (FaultHigh.IsMet(raw)) return PointStatus.FAULT_HIGH;
        if (Under.IsMet(raw)) return PointStatus.UNDER;
        if (Over.IsMet(raw)) return PointStatus.OVER;
        return PointStatus.OK;
    }
}
