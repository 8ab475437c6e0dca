using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Tests.Engine.TestPoints;

namespace ScaleGen.Tests.Engine;

public class SignalPathTests
{
    [Fact]
    public void Twelve_mA_is_half_of_span()
    {
        var point = Linear(0, 100);
        Assert.Equal(0.5, SignalPath.Fraction(point, 12), 12); // IEC 60381-1; common practice
        Assert.Equal(50.0, SignalPath.MaToValue(point, 12), 12); // IEC 60381-1; common practice
        Assert.Equal(0.0, SignalPath.MaToValue(point, 4), 12); // IEC 60381-1; common practice
        Assert.Equal(100.0, SignalPath.MaToValue(point, 20), 12); // IEC 60381-1; common practice
    }

    [Fact]
    public void Card_line_maps_counts_to_mA_both_ways()
    {
        var point = Linear();
        Assert.Equal(4.0, SignalPath.RawToMa(point, 0), 12);
        Assert.Equal(20.0, SignalPath.RawToMa(point, 27648), 12);
        Assert.Equal(12.0, SignalPath.RawToMa(point, 13824), 12); // IEC 60381-1; common practice (mid-scale)
        Assert.Equal(13824.0, SignalPath.MaToRaw(point, 12), 9);
        Assert.Equal(21.0, SignalPath.RawToMa(point, 29376)); // exact: multiply before divide
    }

    [Theory]
    [InlineData(4.0, 0.0)]
    [InlineData(8.0, 50.000)]
    [InlineData(12.0, 70.711)]
    [InlineData(16.0, 86.603)]
    [InlineData(20.0, 100.000)]
    public void Dp_flow_is_square_root_of_signal(double ma, double flowPercent)
    {
        var point = Flow(cutoffPercent: 0);
        Assert.Equal(flowPercent, SignalPath.MaToValue(point, ma), 3); // ISO 5167-1
    }

    [Fact]
    public void Below_cutoff_the_flow_is_lrv()
    {
        var point = Flow(cutoffPercent: 5, lrv: 10, urv: 460);
        // 5 % of flow is 0.25 % of DP: 4 + 16 * 0.0025 = 4.04 mA.
        Assert.Equal(10.0, SignalPath.MaToValue(point, 4.03)); // common practice (low-flow cutoff)
        Assert.Equal(10.0, SignalPath.MaToValue(point, 3.0)); // below signal low: sqrt(max(f, 0)) = 0
        Assert.True(SignalPath.MaToValue(point, 4.05) > 10.0 + 0.05 * 450 - 1e-9);
    }

    [Fact]
    public void Voltage_card_with_250_ohm_shunt()
    {
        var point = Linear(card: Card0To10V);
        Assert.Equal(4.0, SignalPath.VoltsToMa(point, 1.0)!.Value, 12); // common practice (Ohm's law, 250 ohm)
        Assert.Equal(20.0, SignalPath.VoltsToMa(point, 5.0)!.Value, 12); // common practice (Ohm's law, 250 ohm)
        Assert.Equal(3.0, SignalPath.MaToTerminalVolts(point, 12), 12); // common practice (Ohm's law, 250 ohm)
        // 3 V on 0..10 V over 0..32000 counts is 9600 counts.
        Assert.Equal(9600.0, SignalPath.MaToRaw(point, 12), 9);
        Assert.Equal(12.0, SignalPath.RawToMa(point, 9600), 12);
        Assert.Equal(50.0, SignalPath.RawToValue(point, 9600), 9); // IEC 60381-1; common practice
    }

    [Fact]
    public void Terminal_volts_on_a_mA_card_are_across_its_input()
    {
        var point = Linear();
        Assert.Equal(5.0, SignalPath.MaToTerminalVolts(point, 20), 12); // common practice (Ohm's law, 250 ohm)
        Assert.Equal(12.0, SignalPath.VoltsToMa(point, 3.0)!.Value, 12);
        var noInput = Linear(card: Card4To20 with { InputOhms = 0 });
        Assert.Null(SignalPath.VoltsToMa(noInput, 3.0));
    }

    [Fact]
    public void Reverse_acting_point()
    {
        var point = Linear(lrv: 100, urv: 0);
        Assert.Equal(100.0, SignalPath.MaToValue(point, 4), 12); // IEC 60381-1; common practice
        Assert.Equal(50.0, SignalPath.MaToValue(point, 12), 12); // IEC 60381-1; common practice
        Assert.Equal(0.0, SignalPath.MaToValue(point, 20), 12);
        Assert.Equal(8.0, SignalPath.ValueToMa(point, 75), 12);
        Assert.False(SignalPath.ValueRisesWithRaw(point));
    }

    [Fact]
    public void Zero_to_20_card_reading_a_4_to_20_transmitter()
    {
        var point = Linear(card: Card0To20);
        // 4 mA on a 0..20 mA card over 27648 counts: 27648 / 5 = 5529.6 counts.
        Assert.Equal(5529.6, SignalPath.MaToRaw(point, 4), 9);
        Assert.Equal(5530, SignalPath.NearestRaw(point, 4));
        Assert.Equal(50.0, SignalPath.MaToValue(point, 12), 12); // IEC 60381-1; common practice
        // A broken wire (0 mA) lies a quarter span below the live zero.
        Assert.Equal(-25.0, SignalPath.RawToValue(point, 0), 9); // common practice arithmetic
    }

    [Fact]
    public void Zero_to_20_signal_reads_zero_percent_on_a_broken_wire()
    {
        var point = Linear(card: Card0To20) with { SignalLowMa = 0 };
        Assert.Equal(0.0, SignalPath.RawToValue(point, 0), 12); // common practice (no live zero)
    }

    [Fact]
    public void Nearest_raw_rounds_half_away_from_zero_and_stays_in_the_type()
    {
        // 1024 counts over 16 mA: 1/64 mA per count, exact in binary.
        var card = new Card("BIN", 0, 1024, 0, 16, ElectricalUnit.MilliAmp, -1024, 2048, [], RawType.INT, 250, Here);
        var point = Linear(card: card) with { SignalLowMa = 0, SignalHighMa = 16 };
        Assert.Equal(13, SignalPath.NearestRaw(point, 12.5 / 64));
        Assert.Equal(-13, SignalPath.NearestRaw(point, -12.5 / 64));
        Assert.Equal(12, SignalPath.NearestRaw(point, 12.4 / 64));
        Assert.Equal(short.MaxValue, SignalPath.NearestRaw(Linear(), 1000));
        Assert.Equal(short.MinValue, SignalPath.NearestRaw(Linear(), double.NegativeInfinity));
    }

    [Fact]
    public void Descending_card()
    {
        var point = Linear(card: CardDescending);
        Assert.Equal(4.0, SignalPath.RawToMa(point, 30000), 12);
        Assert.Equal(20.0, SignalPath.RawToMa(point, 2000), 12);
        Assert.Equal(16000.0, SignalPath.MaToRaw(point, 12), 9);
        Assert.False(SignalPath.MaRisesWithRaw(point));
        Assert.False(SignalPath.ValueRisesWithRaw(point));
        Assert.True(SignalPath.ValueRisesWithRaw(Linear(100, 0, CardDescending)));
    }

    [Fact]
    public void Square_root_inverse_maps_the_cutoff_zone_to_its_edge()
    {
        var point = Flow(cutoffPercent: 10);
        // Edge: 10 % flow = 1 % DP = 4.16 mA.
        Assert.Equal(4.16, SignalPath.ValueToMa(point, 10), 12);
        Assert.Equal(4.16, SignalPath.ValueToMa(point, 5), 12);
        Assert.Equal(4.16, SignalPath.ValueToMa(point, 0), 12);
        Assert.Equal(4.16, SignalPath.ValueToMa(point, -5), 12);
        Assert.Equal(12.0, SignalPath.ValueToMa(point, 100 * Math.Sqrt(0.5)), 9); // ISO 5167-1
        Assert.Equal(4.0, SignalPath.ValueToMa(Flow(cutoffPercent: 0), 0), 12);
    }

    [Fact]
    public void Coefficients_give_the_same_numbers_as_the_path()
    {
        foreach (var card in AllCards)
        {
            var linear = Linear(-50, 250, card);
            var flow = Flow(2, 0, 450, card);
            var linearAffine = SignalPath.LinearCoefficients(linear);
            var flowAffine = SignalPath.LinearCoefficients(flow);
            var maAffine = SignalPath.RawToMaCoefficients(linear);
            foreach (var raw in new long[] { card.LimitLow, 0, 1234, 13824, 27648, card.LimitHigh })
            {
                Assert.Equal(SignalPath.RawToValue(linear, raw), linearAffine.Apply(raw), 9);
                Assert.Equal(SignalPath.RawToMa(linear, raw), maAffine.Apply(raw), 12);
                Assert.Equal(SignalPath.Fraction(flow, SignalPath.RawToMa(flow, raw)), flowAffine.Apply(raw), 12);
                var flowFromAffine = SignalPath.ExtractedToValue(flow, SignalPath.ExtractedFraction(flow, flowAffine.Apply(raw)));
                Assert.Equal(SignalPath.RawToValue(flow, raw), flowFromAffine, 9);
            }
        }
    }
}
