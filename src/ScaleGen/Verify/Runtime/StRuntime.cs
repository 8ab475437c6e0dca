namespace ScaleGen.Verify.Runtime;

// What the C# translated from Structured Text calls at run time. Public because the
// translated assembly is a separate, in-memory assembly; nothing else should use it.
// Member names of the translated blocks start with "v_" (variables), "f_" (struct
// fields), "m_" (enumeration values); the standard TON below follows the same scheme so
// that calls of it translate like calls of any other block.

/// <summary>
/// Simulated PLC time, shared by every timer of one translated program. The verifier
/// advances it by exactly one task cycle per scan, so timers see whole cycles and never
/// wall-clock time.
/// </summary>
public sealed class StClock
{
    /// <summary>Time since the start of the run, in microseconds (the resolution of TIME here).</summary>
    public long NowMicroseconds;
}

/// <summary>
/// The IEC 61131-3 standard on-delay timer. In the call in which IN turns TRUE, ET is 0
/// and the start time is taken from the clock; on every later call with IN still TRUE, ET
/// is the clock time since then, held at PT; Q = IN AND ET &gt;= PT (so PT = T#0s gives Q
/// in the same call). IN = FALSE resets ET and Q.
/// </summary>
public sealed class StTon
{
    private readonly StClock _clock;
    private bool _running;
    private long _start;

    public bool v_IN;
    public long v_PT;
    public bool v_Q;
    public long v_ET;

    public StTon(StClock clock)
    {
        _clock = clock;
    }

    public void __Init()
    {
        v_IN = false;
        v_PT = 0;
        v_Q = false;
        v_ET = 0;
        _running = false;
        _start = 0;
    }

    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)]
    public void Body()
    {
        if (!v_IN)
        {
            _running = false;
            v_Q = false;
            v_ET = 0;
            return;
        }
        if (!_running)
        {
            _running = true;
            _start = _clock.NowMicroseconds;
        }
        var elapsed = _clock.NowMicroseconds - _start;
        v_Q = elapsed >= v_PT;
        v_ET = v_Q ? Math.Max(v_PT, 0) : elapsed;
    }
}

/// <summary>
/// A run-time error of the translated code (integer overflow, a conversion out of range,
/// division by zero): the verifier reports it at <see cref="Location"/>, an index into the
/// translation's table of Structured Text positions (-1: no position).
/// </summary>
public sealed class StRuntimeException(int location, string message) : Exception(message)
{
    public int Location { get; } = location;
}

/// <summary>Arithmetic and conversions with the checks IEC 61131-3 leaves to the implementation; here every such case is an error.</summary>
public static class StRt
{
    /// <summary>An integer result that must fit its type.</summary>
    public static long Fit(Int128 value, long min, long max, int location, string type)
    {
        if (value < min || value > max)
            throw new StRuntimeException(location, $"the result {value} does not fit {type} ({min} .. {max})");
        return (long)value;
    }

    public static long Add(long a, long b, long min, long max, int location, string type) => Fit((Int128)a + b, min, max, location, type);

    public static long Sub(long a, long b, long min, long max, int location, string type) => Fit((Int128)a - b, min, max, location, type);

    public static long Mul(long a, long b, long min, long max, int location, string type) => Fit((Int128)a * b, min, max, location, type);

    public static long Neg(long a, long min, long max, int location, string type) => Fit(-(Int128)a, min, max, location, type);

    public static long Abs(long a, long min, long max, int location, string type) => Fit(Int128.Abs(a), min, max, location, type);

    /// <summary>Integer division truncates towards zero (IEC 61131-3); division by zero is an error.</summary>
    public static long Div(long a, long b, long min, long max, int location, string type)
    {
        if (b == 0) throw new StRuntimeException(location, "integer division by zero");
        return Fit((Int128)a / b, min, max, location, type);
    }

    /// <summary>
    /// REAL or LREAL to an integer type: rounded to the nearest integer, halves away from
    /// zero (docs/verify.md says why); NaN, infinity or a value outside the type is an error.
    /// </summary>
    public static long Round(double value, long min, long max, int location, string type)
    {
        if (double.IsNaN(value) || double.IsInfinity(value))
            throw new StRuntimeException(location, $"{value} cannot be converted to {type}");
        var rounded = Math.Round(value, MidpointRounding.AwayFromZero);
        if (rounded < min || rounded > max)
            throw new StRuntimeException(location, $"{rounded} does not fit {type} ({min} .. {max})");
        return (long)rounded;
    }

    /// <summary>LREAL to REAL: nearest REAL; a finite value beyond the REAL range is an error.</summary>
    public static float ToReal(double value, int location)
    {
        var single = (float)value;
        if (float.IsInfinity(single) && !double.IsInfinity(value))
            throw new StRuntimeException(location, $"{value} is beyond the REAL range");
        return single;
    }
}

/// <summary>What the verifier reads from one point block after a scan.</summary>
public struct StPointOutputs
{
    public double Value;
    /// <summary>The ordinal of the status enumeration value (declaration order).</summary>
    public int Status;
    public bool Fault;
    public bool AlarmHH;
    public bool AlarmH;
    public bool AlarmL;
    public bool AlarmLL;
}

/// <summary>
/// The glue the verifier generates around a translated program: it sets each point's raw
/// input, runs the program body once per scan, and reads each point's block. Points are
/// numbered in plant order.
/// </summary>
public interface IStPlantHarness
{
    /// <summary>Sets a point's raw input; a value its type cannot hold is an error.</summary>
    void SetRaw(int point, long raw);

    /// <summary>Gives a point a fresh block instance, as after a cold start.</summary>
    void ResetPoint(int point);

    /// <summary>Runs the program body once (one PLC cycle).</summary>
    void Scan();

    /// <summary>
    /// True when every top-level statement of the program touches the variables of one
    /// point only (its raw input, parameter record and instance): then running one point's
    /// statements alone gives that point exactly what a whole scan gives it.
    /// </summary>
    bool PerPoint { get; }

    /// <summary>Runs, in program order, the statements of one point (only where <see cref="PerPoint"/>).</summary>
    void ScanPoint(int point);

    void Read(int point, ref StPointOutputs outputs);
}
