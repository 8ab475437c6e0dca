using CsCheck;
using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Tests.Engine.TestPoints;

namespace ScaleGen.Tests.Engine;

public class SignalPathProperties
{
    private static readonly Gen<Card> Cards = Gen.OneOfConst(AllCards.ToArray());

    private static void Close(double expected, double actual, double relative = 1e-9)
    {
        var tolerance = relative * Math.Max(1.0, Math.Abs(expected));
        Assert.True(Math.Abs(expected - actual) <= tolerance, $"expected {expected:R}, got {actual:R}");
    }

    [Fact]
    public void Raw_to_mA_round_trips()
    {
        Gen.Select(Cards, Gen.Double[-40000, 70000]).Sample((card, raw) =>
        {
            var point = Linear(card: card);
            Close(raw, SignalPath.MaToRaw(point, SignalPath.RawToMa(point, raw)));
        }, iter: 5000);
    }

    [Fact]
    public void Linear_value_to_mA_round_trips()
    {
        Gen.Select(Cards, Gen.Double[-1000, 1000], Gen.Double[-1000, 1000], Gen.Double[0, 24]).Sample((card, lrv, urv, ma) =>
        {
            if (Math.Abs(urv - lrv) < 1e-3) return;
            var point = Linear(lrv, urv, card);
            Close(ma, SignalPath.ValueToMa(point, SignalPath.MaToValue(point, ma)), 1e-7);
        }, iter: 5000);
    }

    [Fact]
    public void Square_root_value_to_mA_round_trips_above_the_cutoff()
    {
        Gen.Select(Gen.Double[0, 10], Gen.Double[-500, 500], Gen.Double[1, 1000], Gen.Double[0, 1.1]).Sample((cutoff, lrv, span, f) =>
        {
            var point = Flow(cutoff, lrv, lrv + span);
            var edge = cutoff / 100 * (cutoff / 100);
            if (f <= edge * 1.000001) return;
            var ma = SignalPath.FractionToMa(point, f);
            Close(ma, SignalPath.ValueToMa(point, SignalPath.MaToValue(point, ma)), 1e-9);
        }, iter: 5000);
    }

    [Fact]
    public void Value_is_monotone_in_raw()
    {
        Gen.Select(Cards, Gen.Bool, Gen.Bool, Gen.Long[-4000, 60000]).Sample((card, sqrt, reverse, raw) =>
        {
            var point = sqrt ? Flow(3, reverse ? 100 : 0, reverse ? 0 : 100, card) : Linear(reverse ? 100 : 0, reverse ? 0 : 100, card);
            var step = SignalPath.RawToValue(point, raw + 1) - SignalPath.RawToValue(point, raw);
            Assert.True(SignalPath.ValueRisesWithRaw(point) ? step >= 0 : step <= 0);
        }, iter: 5000);
    }

    [Fact]
    public void Linear_coefficients_match_the_path()
    {
        Gen.Select(Cards, Gen.Double[-1000, 1000], Gen.Double[1, 2000], Gen.Long[-4000, 60000]).Sample((card, lrv, span, raw) =>
        {
            var point = Linear(lrv, lrv + span, card);
            Close(SignalPath.RawToValue(point, raw), SignalPath.LinearCoefficients(point).Apply(raw), 1e-9);
        }, iter: 3000);
    }
}
