using System.Globalization;
using System.Text.RegularExpressions;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Engine;
using ScaleGen.Model;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit.StructuredText;

/// <summary>
/// A line-by-line C# port of the library blocks, in 32-bit REAL arithmetic, with the
/// constants read back from the literals the generator writes and the TON model that
/// <see cref="StNames"/> documents. It checks the design (parameters, order of operations,
/// timer use) against <see cref="PointSimulator"/>; the verify command checks the text itself.
/// </summary>
public class StMirrorTests
{
    private sealed class MirrorTon(long ptMicroseconds, long cycleMicroseconds)
    {
        private long _elapsed;
        public bool Q { get; private set; }
        private bool _lastIn;

        public void Call(bool input)
        {
            if (!input) _elapsed = 0;
            else if (_lastIn) _elapsed = Math.Min(_elapsed + cycleMicroseconds, ptMicroseconds);
            else _elapsed = 0; // the call in which IN rises: ET = 0
            _lastIn = input;
            Q = input && _elapsed >= ptMicroseconds;
        }
    }

    private sealed class MirrorAlarm(StAlarmParameters par, bool high, long cycleUs)
    {
        private readonly float _setpoint = Real(par.Alarm?.TripValue ?? 0);
        private readonly float _reset = Real(par.Alarm?.ResetValue ?? 0);
        private readonly MirrorTon _on = new(Time(StLiterals.TimeOfScans(par.OnDelayScans, cycleUs / 1e6)), cycleUs);
        private readonly MirrorTon _off = new(Time(StLiterals.TimeOfScans(par.OffDelayScans, cycleUs / 1e6)), cycleUs);
        private bool _condition;
        public bool Active { get; private set; }

        public void Call(long raw, float value, bool compareRaw, bool faulted)
        {
            if (faulted || !par.Enabled)
            {
                _condition = false;
                Active = false;
                _on.Call(false);
                _off.Call(false);
                return;
            }
            if (_condition)
                _condition = compareRaw ? !par.Clear.Contains(raw) : high ? value >= _reset : value <= _reset;
            else
                _condition = compareRaw ? par.Trip.Contains(raw) : high ? value >= _setpoint : value <= _setpoint;
            _on.Call(_condition);
            _off.Call(Active && !_on.Q);
            if (_on.Q) Active = true;
            else if (_off.Q) Active = false;
        }
    }

    private sealed class MirrorPoint
    {
        private readonly StPointParameters _p;
        private readonly float _gain, _offset, _lrv, _span, _faultValue, _alpha;
        private readonly MirrorAlarm[] _alarms;
        private float _lastGood;
        private bool _haveGood, _filterReady;

        public MirrorPoint(StPointParameters p, double cycleSeconds)
        {
            _p = p;
            (_gain, _offset) = (Real(p.Coefficients.Gain), Real(p.Coefficients.Offset));
            (_lrv, _span) = (Real(p.Point.Lrv), Real(p.Point.Span));
            (_faultValue, _alpha) = (Real(p.FaultValue), Real(p.Alpha));
            var cycleUs = (long)Math.Round(cycleSeconds * 1e6);
            _alarms = p.Alarms.Select(a => new MirrorAlarm(a, a.Kind is AlarmKind.HH or AlarmKind.H, cycleUs)).ToArray();
        }

        public float Value { get; private set; }
        public PointStatus Status { get; private set; }
        public bool Fault { get; private set; }
        public bool[] AlarmBits => _alarms.Select(a => a.Active).ToArray();

        public void Call(long raw)
        {
            var p = _p;
            var codeFault = p.FaultCodesInsideLimits.Contains(raw);
            Status = raw < p.LimitLow || raw > p.LimitHigh || codeFault ? PointStatus.CARD_FAULT
                : p.FaultLow.Contains(raw) ? PointStatus.FAULT_LOW
                : p.FaultHigh.Contains(raw) ? PointStatus.FAULT_HIGH
                : p.Under.Contains(raw) ? PointStatus.UNDER
                : p.Over.Contains(raw) ? PointStatus.OVER
                : PointStatus.OK;
            Fault = Status is PointStatus.FAULT_LOW or PointStatus.FAULT_HIGH or PointStatus.CARD_FAULT;

            float reading;
            if (!p.Point.SquareRoot) reading = (float)raw * _gain + _offset;
            else if (p.Cutoff.Contains(raw)) reading = _lrv;
            else reading = MathF.Sqrt(MathF.Max((float)raw * _gain + _offset, 0f)) * _span + _lrv;

            if (Fault) reading = p.HoldLastGood && _haveGood ? _lastGood : _faultValue;
            else { _lastGood = reading; _haveGood = true; }

            if (!p.FilterOn) Value = reading;
            else if (!_filterReady) { Value = reading; _filterReady = !Fault; }
            else Value = Value + (reading - Value) * _alpha;

            foreach (var alarm in _alarms) alarm.Call(raw, Value, !p.FilterOn, Fault);
        }
    }

    private static float Real(double value) => float.Parse(StLiterals.Real(value), CultureInfo.InvariantCulture);

    private static long Time(string literal)
    {
        Assert.StartsWith("T#", literal);
        long total = 0;
        foreach (Match part in Regex.Matches(literal[2..], @"(\d+)(us|ms|d|h|m|s)"))
        {
            var n = long.Parse(part.Groups[1].Value, CultureInfo.InvariantCulture);
            total += n * part.Groups[2].Value switch
            {
                "us" => 1L, "ms" => 1_000L, "s" => 1_000_000L, "m" => 60_000_000L, "h" => 3_600_000_000L, _ => 86_400_000_000L,
            };
        }
        return total;
    }

    /// <summary>Runs both side by side; status, fault and alarm bits must agree exactly, the value to REAL precision.</summary>
    private static void Compare(Point point, double cycle, IEnumerable<long> raws)
    {
        var reference = new PointSimulator(point, cycle);
        var parameters = StPointParameters.Of(point, cycle);
        var mirror = new MirrorPoint(parameters, cycle);
        var tolerance = 2e-5 * Math.Max(Math.Abs(point.Span), Math.Max(Math.Abs(point.Lrv), Math.Abs(point.Urv)));
        var scan = 0;
        foreach (var raw in raws)
        {
            var expected = reference.Step(raw);
            mirror.Call(raw);
            var where = $"{point.Tag} scan {scan} raw {raw}";
            Assert.True(expected.Status == mirror.Status, $"{where}: status {mirror.Status}, expected {expected.Status}");
            Assert.Equal(expected.IsFault, mirror.Fault);
            Assert.True(Math.Abs(expected.Value - mirror.Value) <= tolerance, $"{where}: value {mirror.Value}, expected {expected.Value}");
            var expectedBits = StNames.AlarmKinds.Select(k => expected.Alarms.Any(a => a.Kind == k && a.Active)).ToArray();
            Assert.True(expectedBits.SequenceEqual(mirror.AlarmBits), $"{where}: alarms {string.Join(",", mirror.AlarmBits)}, expected {string.Join(",", expectedBits)}");
            scan++;
        }
    }

    /// <summary>Every raw count from below the limits to above them and back (deadband both ways), plus the fault codes.</summary>
    private static IEnumerable<long> Sweep(Point point)
    {
        var (low, high) = (point.Card.LimitLow - 3, point.Card.LimitHigh + 3);
        var step = Math.Max(1, (high - low) / 20000);
        for (var raw = low; raw <= high; raw += step) yield return raw;
        for (var raw = high; raw >= low; raw -= step) yield return raw;
        foreach (var code in point.Card.FaultCodes) yield return code;
    }

    /// <summary>A seeded random walk with jumps and holds, to exercise delays, filter, hold and fault recovery.</summary>
    private static IEnumerable<long> Walk(Point point, int seed, int scans = 6000)
    {
        var random = new Random(seed);
        var (low, high) = (point.Card.LimitLow, point.Card.LimitHigh);
        var raw = (low + high) / 2;
        for (var i = 0; i < scans;)
        {
            var hold = random.Next(1, 120);
            switch (random.Next(8))
            {
                case 0: raw = low + (long)(random.NextDouble() * (high - low)); break;
                case 1 when point.Card.FaultCodes.Length > 0: raw = point.Card.FaultCodes[random.Next(point.Card.FaultCodes.Length)]; break;
                case 2: raw = random.Next(2) == 0 ? low - 1 : high + 1; break;
                default: raw = Math.Clamp(raw + random.Next(-400, 401), low, high); break;
            }
            for (var k = 0; k < hold && i < scans; k++, i++) yield return raw;
        }
    }

    [Fact]
    public void Example_points_match_the_reference_scan_by_scan()
    {
        var plant = TestInputs.CompileExample().Plant;
        foreach (var point in plant.Points)
        {
            Compare(point, plant.CycleSeconds, Walk(point, seed: point.Tag.Length * 7919));
            // Unfiltered points: every raw count, rising and falling, exactly.
            if (point.FilterSeconds <= 0) Compare(point, plant.CycleSeconds, Sweep(point));
        }
    }

    [Fact]
    public void Unusual_points_match_the_reference_scan_by_scan()
    {
        var compilation = TestInputs.Compile(TestInputs.StandardCard + """

            cycle 50 ms
            card DOWN {
              counts 30000 .. 2000 at 4 .. 20 mA
              limits -4000 .. 32000
              fault-code 31000, 15000
            }
            card AV {
              counts 0 .. 4000 at 1 .. 5 V
              limits 0 .. 4500
              fault-code 100
              type UINT
            }
            card WIDE {
              counts -2000000 .. 2000000 at 0 .. 20 mA
              type DINT
            }
            point DN-1 {
              card DOWN at "1"
              range 0 .. 250 kPa
              health below 3.8 mA above 20.5 mA
              on-fault value 12.5
              alarm HH 240 deadband 1 % delay 0.12 s clear 0.26 s
              alarm H 200 deadband 5 kPa delay 1 s
              alarm L 50 deadband 2 % clear 2 s
              alarm LL 20
            }
            point DN-2 {
              card DOWN at "2"
              range 100 .. 0 %
              sqrt cutoff 5 %
              health ne43
              on-fault high
              alarm H 90 deadband 2 % delay 0.5 s
              alarm L 10 deadband 2 % clear 0.5 s
            }
            point AV-1 {
              card AV at "3"
              shunt 250 ohm
              range -50 .. 150 degC
              health ne43
              filter 0.7 s
              alarm H 120 deadband 1 % delay 1 s clear 1 s
              alarm LL -40 deadband 1 %
            }
            point WD-1 {
              card WIDE at "4"
              signal 4 .. 20 mA
              range 0 .. 1000 m3/h
              sqrt cutoff 1 %
              health ne43
              on-fault low
              filter 0.2 s
              alarm HH 950 delay 0.3 s
              alarm LL 30 deadband 10 m3/h clear 0.3 s
            }
            point ZZ-0 {
              card AI16 at "5"
              range 0 .. 100 %
              sqrt
            }
            """);
        Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics));
        var plant = compilation.Plant;
        Assert.Equal(0.05, plant.CycleSeconds, 12);
        foreach (var point in plant.Points)
        {
            Compare(point, plant.CycleSeconds, Walk(point, seed: 17));
            if (point.FilterSeconds <= 0) Compare(point, plant.CycleSeconds, Sweep(point));
        }
    }

    [Fact]
    public void Generated_constants_reproduce_published_check_values()
    {
        var plant = TestInputs.CompileExample().Plant;
        var level = plant.FindPoint("LT-101")!; // 0 .. 15 m on 0..27648 = 4..20 mA
        var p = StPointParameters.Of(level, plant.CycleSeconds);
        // NAMUR NE 43: failure at I <= 3.6 mA and I >= 21.0 mA. 3.6 mA is raw -691.2, 21 mA raw 29376.
        Assert.Equal(new StRawRange(-4864, -692), p.FaultLow);
        Assert.Equal(new StRawRange(29376, 32511), p.FaultHigh);
        // IEC 60381-1: 12 mA is 50 % of span (raw 13824 on this card).
        var mirror = new MirrorPoint(p, plant.CycleSeconds);
        mirror.Call(13824);
        Assert.Equal(7.5f, mirror.Value, 4);
        Assert.Equal(PointStatus.OK, mirror.Status);

        // ISO 5167-1: at 8, 12, 16 mA (25, 50, 75 % of DP) flow is 50, 70.711, 86.603 % of span.
        var flow = plant.FindPoint("FIT-201")!; // 0 .. 300 m3/h, square root
        foreach (var (raw, percent) in new[] { (6912L, 50.0), (13824L, 70.711), (20736L, 86.603) })
        {
            var fresh = new MirrorPoint(StPointParameters.Of(flow, plant.CycleSeconds), plant.CycleSeconds);
            fresh.Call(raw); // the first good sample initialises the filter
            Assert.Equal(percent, fresh.Value / 300.0 * 100.0, 2);
        }
    }
}
