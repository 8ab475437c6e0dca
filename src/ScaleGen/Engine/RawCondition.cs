namespace ScaleGen.Engine;

/// <summary>How a condition on an integer raw count is tested in generated code.</summary>
public enum RawTest
{
    /// <summary>No raw count inside the card limits satisfies the condition.</summary>
    Never,
    /// <summary>Every raw count inside the card limits satisfies the condition.</summary>
    Always,
    /// <summary>raw &lt;= Threshold.</summary>
    AtMost,
    /// <summary>raw &gt;= Threshold.</summary>
    AtLeast,
}

/// <summary>
/// A condition on a raw count, equivalent, for every raw count inside the card limits, to
/// a condition on a value computed from it in double precision. Generated code compares
/// integers and so agrees with the reference exactly, with no rounding question.
/// </summary>
public readonly record struct RawCondition(RawTest Test, long Threshold)
{
    public static readonly RawCondition Never = new(RawTest.Never, 0);
    public static readonly RawCondition Always = new(RawTest.Always, 0);

    public bool IsMet(long raw) => Test switch
    {
        RawTest.Always => true,
        RawTest.AtMost => raw <= Threshold,
        RawTest.AtLeast => raw >= Threshold,
        _ => false,
    };

    public override string ToString() => Test switch
    {
        RawTest.AtMost => $"raw <= {Threshold}",
        RawTest.AtLeast => $"raw >= {Threshold}",
        _ => Test.ToString(),
    };
}

/// <summary>Exact boundary search over integer raw counts for a predicate that is monotone in raw.</summary>
internal static class RawSearch
{
    /// <summary>
    /// Turns a predicate that holds on a prefix (<paramref name="holdsOnLowRaws"/>) or on a
    /// suffix of [low, high] into a <see cref="RawCondition"/>, by bisection on the actual
    /// predicate, so the result agrees with it on every count of the interval.
    /// </summary>
    public static RawCondition Boundary(long low, long high, bool holdsOnLowRaws, Func<long, bool> predicate)
    {
        if (low > high) return RawCondition.Never;
        if (holdsOnLowRaws)
        {
            if (!predicate(low)) return RawCondition.Never;
            if (predicate(high)) return RawCondition.Always;
            // predicate(lo) true, predicate(hi) false: find the last true.
            long lo = low, hi = high;
            while (hi - lo > 1)
            {
                var mid = lo + (hi - lo) / 2;
                if (predicate(mid)) lo = mid; else hi = mid;
            }
            return new RawCondition(RawTest.AtMost, lo);
        }
        else
        {
            if (!predicate(high)) return RawCondition.Never;
            if (predicate(low)) return RawCondition.Always;
            // predicate(lo) false, predicate(hi) true: find the first true.
            long lo = low, hi = high;
            while (hi - lo > 1)
            {
                var mid = lo + (hi - lo) / 2;
                if (predicate(mid)) hi = mid; else lo = mid;
            }
            return new RawCondition(RawTest.AtLeast, hi);
        }
    }
}
