using ScaleGen.Engine;
using ScaleGen.Model;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Field;

/// <summary>The numbers on the check sheets, against published values.</summary>
public class CheckSheetTests
{
    private static PointSheet SheetOf(string points, string tag) =>
        CheckSheets.For(FieldPlants.Compile(points).Plant.FindPoint(tag)!);

    [Fact]
    public void Five_steps_of_a_linear_point()
    {
        var sheet = SheetOf("""
            point PT-1 {
              card AI16 at "A.1"
              range 0 .. 10 bar
              tolerance 0.5 %
            }
            """, "PT-1");
        Assert.Equal([0.0, 25, 50, 75, 100], sheet.Steps.Select(s => s.Percent));
        Assert.Equal([4.0, 8, 12, 16, 20], sheet.Steps.Select(s => s.Ma)); // IEC 60381-1; common practice
        Assert.Equal([0.0, 2.5, 5, 7.5, 10], sheet.Steps.Select(s => s.Value));
        Assert.Equal([0L, 6912, 13824, 20736, 27648], sheet.Steps.Select(s => s.Raw));
        Assert.All(sheet.Steps, s => Assert.Equal(0.05, s.Tolerance, 12)); // 0.5 % of a 10 bar span
    }

    [Fact]
    public void Twelve_milliamps_across_250_ohm_is_3_volts()
    {
        var sheet = SheetOf("""
            point PT-1 {
              card AI16 at "A.1"
              range 0 .. 10 bar
            }
            """, "PT-1");
        Assert.Equal(3.0, sheet.Steps[2].Volts!.Value, 12); // common practice: 12 mA x 250 ohm
        Assert.Equal(1.0, sheet.Steps[0].Volts!.Value, 12); // common practice: 4 mA -> 1 V
        Assert.Equal(5.0, sheet.Steps[4].Volts!.Value, 12); // common practice: 20 mA -> 5 V
    }

    [Fact]
    public void Volts_are_across_the_shunt_on_a_voltage_card()
    {
        var sheet = SheetOf("""
            card AV15 {
              counts 0 .. 4000 at 1 .. 5 V
              limits -500 .. 4500
            }
            point LT-1 {
              card AV15 at "A.1"
              shunt 250 ohm
              range 0 .. 2 m
            }
            """, "LT-1");
        Assert.Equal([1.0, 2, 3, 4, 5], sheet.Steps.Select(s => Math.Round(s.Volts!.Value, 12))); // common practice: 250 ohm, 4-20 mA -> 1-5 V
        Assert.Equal([0L, 1000, 2000, 3000, 4000], sheet.Steps.Select(s => s.Raw));
    }

    [Fact]
    public void A_dp_flow_point_reads_the_square_root_at_its_five_steps()
    {
        var sheet = SheetOf("""
            point FT-1 {
              card AI16 at "A.1"
              range 0 .. 100 %
              sqrt cutoff 1 %
            }
            """, "FT-1");
        // Steps are % of the DP signal; the value is the extracted flow.
        Assert.Equal([4.0, 8, 12, 16, 20], sheet.Steps.Select(s => s.Ma));
        double[] flow = [0, 50, 70.711, 86.603, 100]; // ISO 5167-1: Q/Qmax = sqrt(dP/dPmax)
        for (var i = 0; i < 5; i++) Assert.Equal(flow[i], sheet.Steps[i].Value, 3);
    }

    [Fact]
    public void An_h_alarm_at_4_8_m_on_a_5_5_m_level_trips_at_17_964_mA()
    {
        var sheet = SheetOf("""
            point LT-1 {
              card AI16 at "A.1"
              range 0 .. 5.5 m
              alarm H 4.8 deadband 0.1 m
            }
            """, "LT-1");
        var trip = Assert.Single(sheet.Trips);
        Assert.Equal(AlarmKind.H, trip.Alarm.Kind);
        Assert.Equal(17.964, trip.TripMa, 3); // common practice: 4 + 16 x 4.8 / 5.5
        Assert.Equal(4.7, trip.ResetValue, 12);
        Assert.Equal(4 + 16 * 4.7 / 5.5, trip.ResetMa, 9);
        Assert.True(trip.CurrentRisesToTrip);
        // The trip raw count is the first count that shows the alarm.
        var point = sheet.Point;
        Assert.True(Evaluator.Evaluate(point, trip.TripRaw!.Value).Alarms[0].Active);
        Assert.False(Evaluator.Evaluate(point, trip.TripRaw.Value - 1).Alarms[0].Active);
    }

    [Fact]
    public void On_a_reverse_acting_point_a_high_alarm_trips_on_a_falling_current()
    {
        var sheet = SheetOf("""
            point LT-1 {
              card AI16 at "A.1"
              range 5.5 .. 0.5 m
              alarm H 4.5 deadband 0.3 m
            }
            """, "LT-1");
        var trip = Assert.Single(sheet.Trips);
        Assert.False(trip.CurrentRisesToTrip);
        Assert.Equal(7.2, trip.TripMa, 9); // 4 + 16 x (5.5 - 4.5) / 5
        Assert.True(trip.ResetMa > trip.TripMa);
    }

    [Fact]
    public void Ne43_band_tests_sit_inside_their_bands()
    {
        var sheet = SheetOf("""
            point PT-1 {
              card AI16 at "A.1"
              range 0 .. 10 bar
              health ne43
              on-fault value -1
            }
            """, "PT-1");
        Assert.Equal([PointStatus.FAULT_LOW, PointStatus.UNDER, PointStatus.OVER, PointStatus.FAULT_HIGH],
            sheet.FaultTests.Select(t => t.Status));
        Assert.Empty(sheet.Untestable);
        var byStatus = sheet.FaultTests.ToDictionary(t => t.Status);
        Assert.InRange(byStatus[PointStatus.FAULT_LOW].Ma, 1.19, 3.6); // NAMUR NE 43: failure at or below 3.6 mA
        Assert.InRange(byStatus[PointStatus.UNDER].Ma, 3.6001, 3.9999); // NAMUR NE 43: between failure and 4 mA
        Assert.InRange(byStatus[PointStatus.OVER].Ma, 20.0001, 20.9999); // NAMUR NE 43
        Assert.InRange(byStatus[PointStatus.FAULT_HIGH].Ma, 21.0, 22.8); // NAMUR NE 43: failure at or above 21 mA
        Assert.Equal(3.8, byStatus[PointStatus.UNDER].Ma, 12); // halfway across the band
        Assert.Equal(20.5, byStatus[PointStatus.OVER].Ma, 12);
        // Each current reads as its band through the card's nearest count.
        foreach (var test in sheet.FaultTests)
            Assert.Equal(test.Status, Evaluator.Evaluate(sheet.Point, test.Raw).Status);
        Assert.Equal(-1.0, byStatus[PointStatus.FAULT_HIGH].Value);
        Assert.False(byStatus[PointStatus.FAULT_HIGH].HoldsLastGood);
        Assert.Equal(-0.125, byStatus[PointStatus.UNDER].Value!.Value, 9); // the line continues below the range
    }

    [Fact]
    public void A_band_the_card_cannot_reach_is_named_untestable()
    {
        var sheet = SheetOf("""
            card AI020 {
              counts 0 .. 27648 at 0 .. 20 mA
              limits 0 .. 32511
            }
            point AT-1 {
              card AI020 at "A.1"
              signal 0 .. 20 mA
              range 0 .. 1000 NTU
              health none
            }
            """, "AT-1");
        Assert.Equal([PointStatus.OVER], sheet.FaultTests.Select(t => t.Status));
        var under = Assert.Single(sheet.Untestable);
        Assert.Equal(PointStatus.UNDER, under.Status); // common practice: 0-20 mA has no live zero
        Assert.Contains("below 0 mA", under.Reason);
    }

    [Fact]
    public void Hold_shows_no_value_while_faulted()
    {
        var sheet = SheetOf("""
            point PT-1 {
              card AI16 at "A.1"
              range 0 .. 10 bar
              health ne43
            }
            """, "PT-1");
        var low = sheet.FaultTests.Single(t => t.Status == PointStatus.FAULT_LOW);
        Assert.True(low.HoldsLastGood);
        Assert.Null(low.Value);
    }

    [Fact]
    public void Every_example_band_test_and_trip_reads_as_the_sheet_says()
    {
        var plant = TestInputs.CompileExample().Plant;
        foreach (var sheet in CheckSheets.For(plant))
        {
            Assert.Equal(5, sheet.Steps.Length);
            foreach (var test in sheet.FaultTests)
            {
                Assert.Equal(test.Status, Evaluator.Evaluate(sheet.Point, test.Raw).Status);
                Assert.Equal(SignalPath.NearestRaw(sheet.Point, test.Ma), test.Raw);
            }
            foreach (var step in sheet.Steps)
                Assert.Equal(PointStatus.OK, Evaluator.Evaluate(sheet.Point, step.Raw).Status);
            foreach (var (trip, index) in sheet.Trips.Select((t, i) => (t, i)))
                if (trip.TripRaw is { } raw)
                    Assert.True(Evaluator.Evaluate(sheet.Point, raw).Alarms[index].Active || Evaluator.Evaluate(sheet.Point, raw).IsFault);
            Assert.Equal(sheet.Point.Alarms.Length, sheet.Trips.Length);
        }
    }
}
