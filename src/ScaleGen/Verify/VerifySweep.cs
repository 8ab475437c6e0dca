using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Verify;

/// <summary>One run of a point from a fresh block: the raw count of every scan.</summary>
public sealed record SweepCase(string Name, long[] Raws);

/// <summary>
/// The inputs verify runs each point through. Every case starts from a fresh block (and a
/// fresh reference simulator).
/// <list type="bullet">
/// <item>One-scan cases: a grid across the card limits (every count when there are at
/// most <see cref="EveryCountUpTo"/>, else <see cref="GridSteps"/> even steps), the limits
/// and the raw type's extremes, every fault code, each status band edge, the cutoff edge
/// and each alarm's trip and reset raw, each ±1, and the counts for notable loop currents.</item>
/// <item>Per alarm: a ramp through reset and trip and back (deadband), holds of exactly the
/// on- and off-delay and one scan longer, and a fault while the alarm is on.</item>
/// <item>A step from signal low to signal high and back (the filter), a fault entered and
/// left from every kind of fault raw (hold), and a seeded random walk.</item>
/// </list>
/// Raw counts the card's raw type cannot hold are left out: the card cannot deliver them.
/// </summary>
public static class VerifySweep
{
    public const int EveryCountUpTo = 4096;

    /// <summary>The name of every one-scan case (the failure report gives its raw count).</summary>
    public const string OneScan = "one scan from a fresh block";
    public const int GridSteps = 2000;

    /// <summary>Most scans a filter is given to settle (5 time constants, at most this).</summary>
    public const int MaxSettleScans = 300;

    public static IReadOnlyList<SweepCase> For(Point point, double cycleSeconds)
    {
        var card = point.Card;
        var (typeMin, typeMax) = Card.RangeOf(card.RawType);
        bool Fits(long raw) => raw >= typeMin && raw <= typeMax;
        var (low, high) = (card.LimitLow, card.LimitHigh);
        var bands = StatusBands.RawThresholds(point);
        var alarms = AlarmMath.AlarmPoints(point);

        // ---- one-scan cases
        var single = new List<long>(GridSteps + 64);
        void AddAround(long raw)
        {
            for (var d = -1; d <= 1; d++)
                if (Fits(raw + d)) single.Add(raw + d);
        }
        var count = high - low + 1;
        if (count <= EveryCountUpTo)
            for (var raw = low; raw <= high; raw++) single.Add(raw);
        else
            for (var i = 0; i <= GridSteps; i++) single.Add(low + (long)Math.Round((double)(high - low) * i / GridSteps));
        AddAround(low);
        AddAround(high);
        single.Add(typeMin);
        single.Add(typeMax);
        if (!card.FaultCodes.IsDefault) foreach (var code in card.FaultCodes) AddAround(code);
        foreach (var condition in new[] { bands.FaultLow, bands.FaultHigh, bands.Under, bands.Over, SignalPath.CutoffCondition(point) })
            if (condition.Test is RawTest.AtMost or RawTest.AtLeast) AddAround(condition.Threshold);
        foreach (var alarm in alarms)
        {
            if (alarm.TripRaw is { } trip) AddAround(trip);
            if (alarm.ResetRaw is { } reset) AddAround(reset);
        }
        foreach (var ma in new[] { 0.0, 3.6, 3.8, 4.0, 12.0, 20.0, 20.5, 21.0, 22.0 })
            AddAround(SignalPath.NearestRaw(point, ma));

        single.Sort();
        var distinct = 0;
        for (var i = 0; i < single.Count; i++)
            if (i == 0 || single[i] != single[distinct - 1]) single[distinct++] = single[i];
        single.RemoveRange(distinct, single.Count - distinct);
        var cases = new List<SweepCase>(single.Count + 32);
        foreach (var raw in single) cases.Add(new SweepCase(OneScan, [raw]));

        // ---- scan sequences
        bool IsGood(long raw) => !StatusBands.IsFault(StatusBands.StatusOf(point, raw));
        var good = single.Where(IsGood).ToList();
        if (good.Count == 0) return cases; // every count is a fault: the one-scan cases say all there is
        var (minGood, maxGood) = (good[0], good[^1]);
        long GoodNear(long raw)
        {
            if (IsGood(raw)) return raw;
            // The nearest good count of the one-scan set (sorted): one of the two around raw.
            var index = good.BinarySearch(raw);
            if (index >= 0) return good[index];
            index = ~index;
            if (index == 0) return good[0];
            if (index == good.Count) return good[^1];
            return raw - good[index - 1] <= good[index] - raw ? good[index - 1] : good[index];
        }
        var signalLow = GoodNear(SignalPath.NearestRaw(point, point.SignalLowMa));
        var signalHigh = GoodNear(SignalPath.NearestRaw(point, point.SignalHighMa));
        var middle = GoodNear(SignalPath.NearestRaw(point, (point.SignalLowMa + point.SignalHighMa) / 2));

        var settle = point.FilterSeconds > 0
            ? (int)Math.Min(MaxSettleScans, Math.Ceiling(5 * point.FilterSeconds / cycleSeconds))
            : 0;

        var faultRaws = new List<long>();
        void AddFault(long raw)
        {
            if (Fits(raw) && !IsGood(raw) && !faultRaws.Contains(raw)) faultRaws.Add(raw);
        }
        if (low > long.MinValue) AddFault(low - 1);
        if (high < long.MaxValue) AddFault(high + 1);
        if (!card.FaultCodes.IsDefault) foreach (var code in card.FaultCodes) AddFault(code);
        if (bands.FaultLow.Test is RawTest.AtMost or RawTest.AtLeast) AddFault(bands.FaultLow.Threshold);
        if (bands.FaultHigh.Test is RawTest.AtMost or RawTest.AtLeast) AddFault(bands.FaultHigh.Threshold);

        foreach (var alarm in alarms)
            cases.AddRange(AlarmCases(point, alarm, cycleSeconds, settle, minGood, maxGood, GoodNear, faultRaws));

        var stepHold = point.FilterSeconds > 0 ? settle + 2 : 3;
        cases.Add(new SweepCase("step signal low -> high -> low (filter)",
            [.. Hold(signalLow, 3), .. Hold(signalHigh, stepHold), .. Hold(signalLow, stepHold)]));

        var other = GoodNear(SignalPath.NearestRaw(point, point.SignalLowMa + 0.8 * (point.SignalHighMa - point.SignalLowMa)));
        foreach (var fault in faultRaws)
        {
            cases.Add(new SweepCase($"fault raw {fault} entered and left (fault action)",
                [.. Hold(fault, 2), .. Hold(middle, 3), .. Hold(fault, 3), .. Hold(other, 3), .. Hold(fault, 1), .. Hold(middle, 2)]));
        }

        cases.Add(new SweepCase("seeded random walk", RandomWalk(point, single, faultRaws, alarms, Fits, low, high)));
        return cases;
    }

    private static IEnumerable<long> Hold(long raw, int scans) => Enumerable.Repeat(raw, Math.Max(scans, 0));

    private static IEnumerable<SweepCase> AlarmCases(Point point, AlarmPoint alarm, double cycleSeconds, int settle,
        long minGood, long maxGood, Func<long, long> goodNear, List<long> faultRaws)
    {
        var kind = alarm.Alarm.Kind;
        var timing = new AlarmStateMachine(alarm.Alarm, cycleSeconds);
        var (on, off) = (timing.OnDelayScans, timing.OffDelayScans);

        // The alarm side is the end of the raw range where the trip condition holds.
        var towardsAlarm = alarm.TripCondition.Test switch
        {
            RawTest.AtLeast => 1,
            RawTest.AtMost => -1,
            _ => SignalPath.ValueRisesWithRaw(point) == alarm.Alarm.IsHigh ? 1 : -1,
        };
        var deep = towardsAlarm > 0 ? maxGood : minGood;
        var normal = towardsAlarm > 0 ? minGood : maxGood;
        var trip = alarm.TripRaw ?? deep;
        var reset = alarm.ResetRaw ?? normal;
        var between = goodNear(reset + (trip - reset) / 2);
        // Held for the delays: the trip count itself, or on a filtered point the far end, so
        // the filtered value gets well past the setpoint.
        var firm = point.FilterSeconds > 0 ? deep : goodNear(trip);

        // Deadband: ramp from the normal side through reset and trip to the alarm side and
        // back, one scan per count near the edges, then hold inside the deadband.
        var ramp = new SortedSet<long>();
        foreach (var edge in new[] { trip, reset })
            for (var d = -3; d <= 3; d++) ramp.Add(goodNear(edge + d));
        var (from, to) = (Math.Min(trip, reset), Math.Max(trip, reset));
        var width = to - from;
        if (width <= 300) for (var raw = from; raw <= to; raw++) ramp.Add(goodNear(raw));
        else for (var i = 0; i <= 100; i++) ramp.Add(goodNear(from + width * i / 100));
        var up = towardsAlarm > 0 ? ramp.ToList() : ramp.Reverse().ToList();
        var down = Enumerable.Reverse(up).ToList();
        yield return new SweepCase($"{kind} deadband: ramp through reset and trip and back",
            [.. Hold(normal, settle + 2), .. up, .. Hold(deep, on + 2 + settle), .. down.Where(r => r != normal),
             .. Hold(between, settle + 3), .. Hold(normal, off + 2 + settle)]);

        // Delays: the limit held exactly the on-delay (just short) and one scan more; the
        // normal side held exactly the off-delay (just short) and one scan more.
        yield return new SweepCase($"{kind} delays: held just short of and just past the on- and off-delay",
            [.. Hold(normal, settle + 2), .. Hold(firm, on), .. Hold(normal, settle + 2), .. Hold(firm, on + 1 + settle),
             .. Hold(normal, off), .. Hold(firm, 1), .. Hold(normal, off + 1), .. Hold(normal, off + 2 + settle)]);

        if (faultRaws.Count > 0)
        {
            yield return new SweepCase($"{kind} with a fault while active",
                [.. Hold(normal, settle + 2), .. Hold(deep, on + 2 + settle), .. Hold(faultRaws[0], 2), .. Hold(deep, on + 2),
                 .. Hold(faultRaws[^1], 1), .. Hold(normal, off + 2 + settle)]);
        }
    }

    /// <summary>Mostly small moves, some jumps to the one-scan raws, some faults and alarm edges; seeded by the tag, so the same plant gives the same walk.</summary>
    private static long[] RandomWalk(Point point, List<long> single, List<long> faults, IReadOnlyList<AlarmPoint> alarms,
        Func<long, bool> fits, long low, long high)
    {
        ulong state = 14695981039346656037UL;
        foreach (var c in point.Tag) state = (state ^ c) * 1099511628211UL;
        ulong Next()
        {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            return state;
        }
        var edges = alarms.SelectMany(a => new[] { a.TripRaw, a.ResetRaw }).OfType<long>().Where(fits).ToList();
        var raws = new long[400];
        var current = single[single.Count / 2];
        for (var i = 0; i < raws.Length; i++)
        {
            var pick = Next() % 100;
            if (pick < 60)
            {
                var step = (long)(Next() % 101) - 50;
                var next = Math.Clamp(current + step, low, high);
                current = fits(next) ? next : current;
            }
            else if (pick < 85) current = single[(int)(Next() % (ulong)single.Count)];
            else if (pick < 93 && faults.Count > 0) current = faults[(int)(Next() % (ulong)faults.Count)];
            else if (edges.Count > 0) current = edges[(int)(Next() % (ulong)edges.Count)];
            raws[i] = current;
        }
        return raws;
    }
}
