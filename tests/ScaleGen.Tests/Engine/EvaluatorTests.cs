using System.Globalization;
using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Tests.Engine.TestPoints;

namespace ScaleGen.Tests.Engine;

public class EvaluatorTests
{
    [Fact]
    public void Reading_of_mid_scale()
    {
        var point = Linear(0, 450).WithAlarms(Alarm(AlarmKind.H, 225), Alarm(AlarmKind.L, 100));
        var reading = Evaluator.EvaluateMa(point, 12);
        Assert.Equal(13824, reading.Raw);
        Assert.Equal(12.0, reading.Ma, 12);
        Assert.Equal(50.0, reading.Percent, 12); // IEC 60381-1; common practice
        Assert.Equal(225.0, reading.Value, 9); // IEC 60381-1; common practice
        Assert.Equal(PointStatus.OK, reading.Status);
        Assert.Equal([new AlarmFlag(AlarmKind.H, true), new AlarmFlag(AlarmKind.L, false)], reading.Alarms.ToArray());
    }

    [Fact]
    public void Percent_is_before_square_root_extraction()
    {
        var reading = Evaluator.EvaluateMa(Flow(), 12);
        Assert.Equal(50.0, reading.Percent, 9);
        Assert.Equal(70.711, reading.Value, 3); // ISO 5167-1
    }

    [Theory]
    [InlineData(FaultActionKind.Hold, 0.0, 100.0)] // no history: LRV
    [InlineData(FaultActionKind.Low, 0.0, 0.0)] // smaller of LRV/URV (URV here)
    [InlineData(FaultActionKind.High, 0.0, 100.0)]
    [InlineData(FaultActionKind.Value, 42.5, 42.5)]
    public void Fault_action_for_one_sample(FaultActionKind kind, double constant, double expected)
    {
        // Reverse acting so that Low/High differ from LRV/URV.
        var point = Linear(lrv: 100, urv: 0) with { Health = Health.Ne43, OnFault = new FaultAction(kind, constant) };
        var reading = Evaluator.EvaluateMa(point, 3.5); // NAMUR NE 43 (downscale failure)
        Assert.Equal(PointStatus.FAULT_LOW, reading.Status);
        Assert.Equal(expected, reading.Value);
        Assert.True(reading.IsFault);
    }

    [Fact]
    public void Alarms_are_off_while_faulted()
    {
        var point = (Linear() with { Health = Health.Ne43 }).WithAlarms(Alarm(AlarmKind.LL, 5), Alarm(AlarmKind.HH, 95));
        Assert.All(Evaluator.EvaluateMa(point, 3.5).Alarms, a => Assert.False(a.Active)); // NAMUR NE 43
        Assert.All(Evaluator.EvaluateMa(point, 21.5).Alarms, a => Assert.False(a.Active)); // NAMUR NE 43
        Assert.All(Evaluator.Evaluate(point, 32767).Alarms, a => Assert.False(a.Active));
        // UNDER and OVER are not faults: the alarms are evaluated.
        Assert.True(Evaluator.EvaluateMa(point, 3.7).Alarms[0].Active); // NAMUR NE 43 (3.7 mA is under-range, not failure)
        Assert.True(Evaluator.EvaluateMa(point, 20.7).Alarms[1].Active); // NAMUR NE 43
    }

    [Fact]
    public void Alarm_is_active_at_the_setpoint_itself()
    {
        var point = Linear().WithAlarms(Alarm(AlarmKind.H, 50), Alarm(AlarmKind.L, 50));
        var reading = Evaluator.EvaluateMa(point, 12);
        Assert.Equal(50.0, reading.Value);
        Assert.True(reading.Alarms[0].Active);
        Assert.True(reading.Alarms[1].Active);
    }

    [Fact]
    public void Evaluate_volts_on_a_shunted_point()
    {
        var reading = Evaluator.EvaluateVolts(Linear(card: Card0To10V), 3.0)!;
        Assert.Equal(9600, reading.Raw);
        Assert.Equal(12.0, reading.Ma, 12); // common practice (Ohm's law, 250 ohm)
        Assert.Equal(50.0, reading.Value, 9);
    }

    [Fact]
    public void Results_do_not_depend_on_the_culture()
    {
        var point = Flow(1, 0, 450).WithAlarms(Alarm(AlarmKind.H, 400));
        var invariant = Evaluator.EvaluateMa(point, 17.3);
        var saved = CultureInfo.CurrentCulture;
        try
        {
            CultureInfo.CurrentCulture = CultureInfo.GetCultureInfo("de-DE");
            var german = Evaluator.EvaluateMa(point, 17.3);
            Assert.Equal(invariant.Value, german.Value);
            Assert.Equal(invariant.Alarms.ToArray(), german.Alarms.ToArray());
            Assert.Equal("raw >= 29376", StatusBands.RawThresholds(Linear() with { Health = Health.Ne43 }).FaultHigh.ToString());
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
    }
}

public class AlarmMathTests
{
    [Fact]
    public void Level_high_alarm_trip_current()
    {
        var point = Linear(0, 5.5, Card4To20).WithAlarms(Alarm(AlarmKind.H, 4.8, deadband: 0.275));
        var trip = AlarmMath.AlarmPoints(point).Single();
        Assert.Equal(17.964, trip.TripMa, 3); // common practice arithmetic: 4 + 16 * 4.8 / 5.5
        Assert.Equal(4.525, trip.ResetValue, 12);
        Assert.Equal(4 + 16 * 4.525 / 5.5, trip.ResetMa, 9); // common practice arithmetic
        // The exact first count at or above the setpoint, and the first below the reset value.
        var tripRaw = trip.TripRaw!.Value;
        Assert.True(SignalPath.RawToValue(point, tripRaw) >= 4.8);
        Assert.True(SignalPath.RawToValue(point, tripRaw - 1) < 4.8);
        Assert.Equal(Math.Ceiling(SignalPath.ValueToRaw(point, 4.8)), tripRaw, 0);
        var resetRaw = trip.ResetRaw!.Value;
        Assert.True(SignalPath.RawToValue(point, resetRaw) < 4.525);
        Assert.True(SignalPath.RawToValue(point, resetRaw + 1) >= 4.525);
        Assert.Equal(RawTest.AtLeast, trip.TripCondition.Test);
        Assert.Equal(RawTest.AtMost, trip.ClearCondition.Test);
    }

    [Fact]
    public void Low_alarm_on_a_reverse_point_on_a_descending_card()
    {
        // Value falls as current rises, current falls as counts rise: value rises with counts.
        var point = Linear(100, 0, CardDescending).WithAlarms(Alarm(AlarmKind.L, 25, deadband: 5));
        var trip = AlarmMath.AlarmPoints(point).Single();
        Assert.Equal(16.0, trip.TripMa, 12); // IEC 60381-1 arithmetic: 25 % of a reversed span
        Assert.Equal(15.2, trip.ResetMa, 12);
        Assert.Equal(new RawCondition(RawTest.AtMost, 9000), trip.TripCondition);
        Assert.Equal(RawTest.AtLeast, trip.ClearCondition.Test);
        Assert.True(SignalPath.RawToValue(point, trip.ResetRaw!.Value) > 30);
        Assert.False(SignalPath.RawToValue(point, trip.ResetRaw!.Value - 1) > 30);
    }

    [Fact]
    public void Flow_alarm_trip_uses_the_square()
    {
        var point = Flow(1, 0, 450).WithAlarms(Alarm(AlarmKind.H, 400));
        var trip = AlarmMath.AlarmPoints(point).Single();
        Assert.Equal(4 + 16 * Math.Pow(400.0 / 450, 2), trip.TripMa, 9); // ISO 5167-1
    }

    [Fact]
    public void Setpoint_beyond_the_card_never_trips()
    {
        var point = Linear().WithAlarms(Alarm(AlarmKind.HH, 1000));
        var trip = AlarmMath.AlarmPoints(point).Single();
        Assert.Equal(RawCondition.Never, trip.TripCondition);
        Assert.Null(trip.TripRaw);
    }

    [Fact]
    public void Deadband_helpers()
    {
        var point = Linear(0, 450);
        Assert.Equal(22.5, Deadbands.PercentOfSpanToEu(point, 5), 12); // ISA-18.2 (from memory): usual flow deadband 5 %
        Assert.Equal(5.0, Deadbands.EuToPercentOfSpan(point, 22.5), 12);
        Assert.Equal(450.0 / 27648, Deadbands.OneCountInEu(point, 200), 12);
        Assert.Equal(100.0 / 27648, Deadbands.ResolutionPercentOfSpan(point), 12);
        Assert.Equal(27648.0, Deadbands.CountsAcrossSignalSpan(point), 6);
        Assert.Equal(450.0 / 27648, Deadbands.OneCountInEu(Linear(450, 0), 200), 12);
        // Square root: a count is worth more near zero flow than near full flow.
        var flow = Flow(1, 0, 450);
        Assert.True(Deadbands.OneCountInEu(flow, 20) > 5 * Deadbands.OneCountInEu(flow, 400));
        // Near full flow: d(value)/d(count) = span / (2 sqrt f) * (1 / counts across span).
        Assert.Equal(450.0 / 2 / 27648, Deadbands.OneCountInEu(flow, 450), 6);
    }
}
