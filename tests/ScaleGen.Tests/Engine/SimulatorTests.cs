using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Tests.Engine.TestPoints;

namespace ScaleGen.Tests.Engine;

public class SimulatorTests
{
    private const double Cycle = 0.1;

    private static long RawAt(Point point, double value) => (long)Math.Round(SignalPath.ValueToRaw(point, value));

    [Fact]
    public void Lag_reaches_63_percent_at_one_time_constant()
    {
        var point = Linear(0, 100, CardUint) with { FilterSeconds = 2 };
        var sim = new PointSimulator(point, Cycle);
        var low = 4000L; // 0 %
        var high = 60000L; // 100 %
        Assert.Equal(0.0, sim.Step(low).Value, 12); // first good sample initialises the filter
        Reading last = null!;
        for (var i = 0; i < 20; i++) last = sim.Step(high); // 20 * 0.1 s = tau
        Assert.Equal(100 * (1 - Math.Exp(-1)), last.Value, 9); // textbook: 63.2 % at t = tau
        Assert.Equal(63.2, last.Value, 1); // textbook
    }

    [Fact]
    public void Filter_alpha_and_no_filter()
    {
        Assert.Equal(1 - Math.Exp(-0.05), LagFilter.AlphaFor(2, 0.1), 15);
        Assert.Equal(1.0, LagFilter.AlphaFor(0, 0.1));
        var sim = new PointSimulator(Linear(), Cycle);
        Assert.Equal(50.0, sim.Step(13824).Value, 9);
        Assert.Equal(100.0, sim.Step(27648).Value, 9);
    }

    [Fact]
    public void Delay_scans_round_up_but_not_through_binary_noise()
    {
        Assert.Equal(50, ScanTiming.DelayScans(5, 0.1));
        Assert.Equal(3, ScanTiming.DelayScans(0.3, 0.1)); // 0.3 / 0.1 = 2.9999999999999996
        Assert.Equal(3, ScanTiming.DelayScans(0.25, 0.1));
        Assert.Equal(0, ScanTiming.DelayScans(0, 0.1));
    }

    [Fact]
    public void On_delay_is_a_TON()
    {
        var point = Linear().WithAlarms(Alarm(AlarmKind.H, 80, onDelay: 5));
        var sim = new PointSimulator(point, Cycle);
        var above = RawAt(point, 90);
        var below = RawAt(point, 50);
        // IEC 61131-3 TON: Q goes TRUE once IN has stayed TRUE for PT; Q drops as soon as IN drops.
        for (var i = 0; i < 50; i++) Assert.False(sim.Step(above).Alarms[0].Active, $"scan {i}");
        Assert.True(sim.Step(above).Alarms[0].Active); // 50 scans = 5 s after the first scan above
        Assert.False(sim.Step(below).Alarms[0].Active);
        // A short excursion does not alarm.
        for (var i = 0; i < 30; i++) sim.Step(above);
        sim.Step(below);
        for (var i = 0; i < 50; i++) Assert.False(sim.Step(above).Alarms[0].Active);
        Assert.True(sim.Step(above).Alarms[0].Active);
    }

    [Fact]
    public void Off_delay_holds_the_alarm_until_the_clear_condition_has_lasted()
    {
        var point = Linear().WithAlarms(Alarm(AlarmKind.L, 20, offDelay: 10));
        var sim = new PointSimulator(point, Cycle);
        var low = RawAt(point, 10);
        var normal = RawAt(point, 50);
        Assert.True(sim.Step(low).Alarms[0].Active);
        for (var i = 0; i < 100; i++) Assert.True(sim.Step(normal).Alarms[0].Active, $"scan {i}");
        Assert.False(sim.Step(normal).Alarms[0].Active); // after 100 scans = 10 s clear
        // Back to the alarm side during the off-delay restarts it.
        Assert.True(sim.Step(low).Alarms[0].Active);
        for (var i = 0; i < 60; i++) sim.Step(normal);
        Assert.True(sim.Step(low).Alarms[0].Active);
        for (var i = 0; i < 100; i++) Assert.True(sim.Step(normal).Alarms[0].Active);
        Assert.False(sim.Step(normal).Alarms[0].Active);
    }

    [Fact]
    public void Deadband_holds_the_condition()
    {
        var point = Linear().WithAlarms(Alarm(AlarmKind.H, 80, deadband: 5), Alarm(AlarmKind.LL, 10, deadband: 2));
        var sim = new PointSimulator(point, Cycle);
        bool H(double v) => sim.Step(RawAt(point, v)).Alarms[0].Active;
        bool LL(double v) => sim.Step(RawAt(point, v)).Alarms[1].Active;
        Assert.False(H(79));
        Assert.True(H(80.01));
        Assert.True(H(76));
        Assert.True(H(75.05));
        Assert.False(H(74.9));
        Assert.False(H(79));
        Assert.True(LL(9.9));
        Assert.True(LL(11.9));
        Assert.False(LL(12.1));
    }

    [Fact]
    public void Fault_resets_alarms_and_hold_keeps_the_last_good_value()
    {
        var point = (Linear() with { Health = Health.Ne43 }).WithAlarms(Alarm(AlarmKind.H, 80, onDelay: 1));
        var sim = new PointSimulator(point, Cycle);
        var broken = SignalPath.NearestRaw(point, 3.5); // NAMUR NE 43 (downscale failure)
        // Before any good value Hold shows LRV.
        var first = sim.Step(broken);
        Assert.Equal(PointStatus.FAULT_LOW, first.Status);
        Assert.Equal(0.0, first.Value);
        var high = RawAt(point, 90);
        for (var i = 0; i < 11; i++) sim.Step(high);
        Assert.True(sim.Step(high).Alarms[0].Active);
        var faulted = sim.Step(broken);
        Assert.False(faulted.Alarms[0].Active);
        Assert.Equal(SignalPath.RawToValue(point, high), faulted.Value, 12);
        Assert.Equal(0, sim.Alarms[0].OnCount);
        // After the fault the on-delay starts again.
        for (var i = 0; i < 10; i++) Assert.False(sim.Step(high).Alarms[0].Active);
        Assert.True(sim.Step(high).Alarms[0].Active);
    }

    [Fact]
    public void Filter_runs_on_the_fault_value()
    {
        var point = Linear() with { Health = Health.Ne43, OnFault = new FaultAction(FaultActionKind.High), FilterSeconds = 1 };
        var sim = new PointSimulator(point, Cycle);
        // Faulted before any good sample: the output passes the substitute and the filter stays uninitialised.
        Assert.Equal(100.0, sim.Step(SignalPath.NearestRaw(point, 3.5)).Value); // NAMUR NE 43
        Assert.Equal(50.0, sim.Step(13824).Value, 9); // first good sample initialises
        var alpha = LagFilter.AlphaFor(1, Cycle);
        Assert.Equal(50.0 + 50.0 * alpha, sim.Step(32767).Value, 9); // CARD_FAULT: towards High = 100
    }

    [Fact]
    public void Simulator_first_scan_agrees_with_one_sample_evaluation_without_delays()
    {
        var point = (Flow(2, 0, 450) with { Health = Health.Ne43, OnFault = new FaultAction(FaultActionKind.Low) })
            .WithAlarms(Alarm(AlarmKind.HH, 430), Alarm(AlarmKind.H, 400, deadband: 10), Alarm(AlarmKind.L, 40), Alarm(AlarmKind.LL, 10));
        foreach (var raw in new long[] { -5000, -864, -300, 0, 100, 5000, 13824, 25000, 27648, 28000, 30240, 32767 })
        {
            var sim = new PointSimulator(point, Cycle);
            Assert.Equal(Evaluator.Evaluate(point, raw), sim.Step(raw), ReadingComparer.Instance);
        }
    }

    private sealed class ReadingComparer : IEqualityComparer<Reading>
    {
        public static readonly ReadingComparer Instance = new();
        public bool Equals(Reading? a, Reading? b) =>
            a!.Raw == b!.Raw && a.Ma == b.Ma && a.Value == b.Value && a.Status == b.Status && a.Alarms.SequenceEqual(b.Alarms);
        public int GetHashCode(Reading r) => r.Raw.GetHashCode();
    }
}
