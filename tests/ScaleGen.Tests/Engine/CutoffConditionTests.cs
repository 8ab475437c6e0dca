using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Tests.Engine.TestPoints;

namespace ScaleGen.Tests.Engine;

public class CutoffConditionTests
{
    [Fact]
    public void Cutoff_condition_agrees_with_the_value_for_every_raw_count()
    {
        foreach (var card in AllCards)
        foreach (var (lrv, urv) in new[] { (0.0, 100.0), (50.0, -10.0) })
        {
            var point = Flow(cutoffPercent: 3, lrv, urv, card);
            var condition = SignalPath.CutoffCondition(point);
            Assert.True(condition.Test is RawTest.AtMost or RawTest.AtLeast, $"{card.Name}: {condition}");
            for (var raw = card.LimitLow; raw <= card.LimitHigh; raw++)
            {
                var fraction = SignalPath.Fraction(point, SignalPath.RawToMa(point, raw));
                Assert.Equal(SignalPath.IsBelowCutoff(point, fraction), condition.IsMet(raw));
                if (condition.IsMet(raw)) Assert.Equal(point.Lrv, SignalPath.RawToValue(point, raw));
            }
        }
    }

    [Fact]
    public void Cutoff_at_3_percent_of_flow_is_0_09_percent_of_DP()
    {
        // ISO 5167-1: flow ~ sqrt(DP), so 3 % of flow is 0.09 % of the DP span:
        // 0.0009 * 27648 = 24.88 counts, so counts up to 24 read LRV.
        var condition = SignalPath.CutoffCondition(Flow(cutoffPercent: 3));
        Assert.Equal(new RawCondition(RawTest.AtMost, 24), condition);
    }

    [Fact]
    public void No_cutoff_or_a_linear_point_never_cuts_off()
    {
        Assert.Equal(RawCondition.Never, SignalPath.CutoffCondition(Flow(cutoffPercent: 0)));
        Assert.Equal(RawCondition.Never, SignalPath.CutoffCondition(Linear()));
    }
}
