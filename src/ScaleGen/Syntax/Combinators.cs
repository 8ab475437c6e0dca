using System.Collections.Immutable;
using Sprache;

namespace ScaleGen.Syntax;

/// <summary>
/// Sequencing, options and repetition for the grammar, as Sprache parsers that allocate
/// nothing per call beyond their results. Sprache's own combinators (and its LINQ query
/// syntax) build closures on every call, which on a plant of tens of thousands of points
/// cost more than the parsing itself. They behave as Sprache's do: a sequence fails where
/// its failing part failed, with that part's message; an option that fails consumes nothing.
/// </summary>
internal static class Combinators
{
    private static IResult<T> Failed<T, TFrom>(IResult<TFrom> failure) =>
        Result.Failure<T>(failure.Remainder, failure.Message, failure.Expectations);

    /// <summary>The parser's value, converted.</summary>
    public static Parser<TResult> Map<T, TResult>(this Parser<T> parser, Func<T, TResult> convert) => input =>
    {
        var result = parser(input);
        return result.WasSuccessful ? Result.Success(convert(result.Value), result.Remainder) : Failed<TResult, T>(result);
    };

    /// <summary>Two parsers one after the other.</summary>
    public static Parser<TResult> Then<T1, T2, TResult>(this Parser<T1> first, Parser<T2> second, Func<T1, T2, TResult> combine) => input =>
    {
        var a = first(input);
        if (!a.WasSuccessful) return Failed<TResult, T1>(a);
        var b = second(a.Remainder);
        return b.WasSuccessful ? Result.Success(combine(a.Value, b.Value), b.Remainder) : Failed<TResult, T2>(b);
    };

    /// <summary>Two parsers one after the other; the first one's value chooses the second (from parsers built beforehand).</summary>
    public static Parser<TResult> Then<T1, T2, TResult>(this Parser<T1> first, Func<T1, Parser<T2>> choose, Func<T1, T2, TResult> combine) => input =>
    {
        var a = first(input);
        if (!a.WasSuccessful) return Failed<TResult, T1>(a);
        var b = choose(a.Value)(a.Remainder);
        return b.WasSuccessful ? Result.Success(combine(a.Value, b.Value), b.Remainder) : Failed<TResult, T2>(b);
    };

    /// <summary>Three parsers one after the other.</summary>
    public static Parser<TResult> Then<T1, T2, T3, TResult>(this Parser<T1> first, Parser<T2> second, Parser<T3> third, Func<T1, T2, T3, TResult> combine) => input =>
    {
        var a = first(input);
        if (!a.WasSuccessful) return Failed<TResult, T1>(a);
        var b = second(a.Remainder);
        if (!b.WasSuccessful) return Failed<TResult, T2>(b);
        var c = third(b.Remainder);
        return c.WasSuccessful ? Result.Success(combine(a.Value, b.Value, c.Value), c.Remainder) : Failed<TResult, T3>(c);
    };

    /// <summary>Four parsers one after the other.</summary>
    public static Parser<TResult> Then<T1, T2, T3, T4, TResult>(this Parser<T1> first, Parser<T2> second, Parser<T3> third, Parser<T4> fourth,
        Func<T1, T2, T3, T4, TResult> combine) => input =>
    {
        var a = first(input);
        if (!a.WasSuccessful) return Failed<TResult, T1>(a);
        var b = second(a.Remainder);
        if (!b.WasSuccessful) return Failed<TResult, T2>(b);
        var c = third(b.Remainder);
        if (!c.WasSuccessful) return Failed<TResult, T3>(c);
        var d = fourth(c.Remainder);
        return d.WasSuccessful ? Result.Success(combine(a.Value, b.Value, c.Value, d.Value), d.Remainder) : Failed<TResult, T4>(d);
    };

    /// <summary>The parser's value, or null where it fails; a failure consumes nothing.</summary>
    public static Parser<T?> Maybe<T>(this Parser<T> parser) where T : class => input =>
    {
        var result = parser(input);
        return result.WasSuccessful ? result : Result.Success<T?>(null, input);
    };

    /// <summary>The parser as many times as it succeeds and moves on (none is fine).</summary>
    public static Parser<ImmutableArray<T>> Repeated<T>(this Parser<T> parser) => input =>
    {
        ImmutableArray<T>.Builder? items = null;
        var remainder = input;
        var result = parser(input);
        while (result.WasSuccessful && !remainder.Equals(result.Remainder))
        {
            (items ??= ImmutableArray.CreateBuilder<T>()).Add(result.Value);
            remainder = result.Remainder;
            result = parser(remainder);
        }
        return Result.Success(items is null ? ImmutableArray<T>.Empty : items.ToImmutable(), remainder);
    };
}
