using CsCheck;
using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Tests.Engine.TestPoints;

namespace ScaleGen.Tests.Engine;

public class StatusBandsTests
{
    private static Point Ne43Point(Card? card = null) => Linear(card: card) with { Health = Health.Ne43 };

    [Theory]
    [InlineData(3.5, PointStatus.FAULT_LOW)] // NAMUR NE 43
    [InlineData(3.6, PointStatus.FAULT_LOW)] // NAMUR NE 43 (I <= 3.6 mA)
    [InlineData(3.7, PointStatus.UNDER)] // NAMUR NE 43
    [InlineData(3.8, PointStatus.UNDER)] // NAMUR NE 43 (measurement information from 3.8 mA, still below 4 mA)
    [InlineData(12.0, PointStatus.OK)] // NAMUR NE 43
    [InlineData(20.5, PointStatus.OVER)] // NAMUR NE 43 (saturation 20.5 mA, above 20 mA)
    [InlineData(20.7, PointStatus.OVER)] // NAMUR NE 43
    [InlineData(21.0, PointStatus.FAULT_HIGH)] // NAMUR NE 43 (I >= 21.0 mA)
    [InlineData(21.5, PointStatus.FAULT_HIGH)] // NAMUR NE 43
    public void Ne43_bands_on_the_loop_current(double ma, PointStatus expected)
    {
        Assert.Equal(expected, StatusBands.StatusOfMa(Ne43Point(), ma));
    }

    [Theory]
    [InlineData(3.5, PointStatus.FAULT_LOW)] // NAMUR NE 43
    [InlineData(3.7, PointStatus.UNDER)] // NAMUR NE 43
    [InlineData(20.7, PointStatus.OVER)] // NAMUR NE 43
    [InlineData(21.5, PointStatus.FAULT_HIGH)] // NAMUR NE 43
    public void Ne43_bands_through_the_card(double ma, PointStatus expected)
    {
        // Through the card the current is that of the nearest count; these are clear of the edges.
        foreach (var card in AllCards)
            Assert.Equal(expected, Evaluator.EvaluateMa(Ne43Point(card), ma).Status);
    }

    [Fact]
    public void Health_none_has_no_fault_bands()
    {
        var point = Linear();
        Assert.Equal(PointStatus.UNDER, StatusBands.StatusOfMa(point, 0.5));
        Assert.Equal(PointStatus.OVER, StatusBands.StatusOfMa(point, 22));
    }

    [Fact]
    public void Fault_code_and_limits_give_card_fault()
    {
        var point = Ne43Point();
        Assert.Equal(PointStatus.CARD_FAULT, StatusBands.StatusOf(point, 32767));
        Assert.Equal(PointStatus.CARD_FAULT, StatusBands.StatusOf(point, 32512));
        Assert.Equal(PointStatus.CARD_FAULT, StatusBands.StatusOf(point, -4865));
        Assert.Equal(PointStatus.FAULT_HIGH, StatusBands.StatusOf(point, 32511));
        Assert.Equal(PointStatus.FAULT_LOW, StatusBands.StatusOf(point, -4864));
        Assert.Equal(PointStatus.CARD_FAULT, Evaluator.Evaluate(point, 32767).Status);
    }

    [Fact]
    public void Raw_thresholds_on_the_usual_card()
    {
        var t = StatusBands.RawThresholds(Ne43Point());
        // 3.6 mA is -691.2 counts; 21 mA exactly 29376; 4 mA 0; 20 mA 27648.
        Assert.Equal(new RawCondition(RawTest.AtMost, -692), t.FaultLow);
        Assert.Equal(new RawCondition(RawTest.AtLeast, 29376), t.FaultHigh);
        Assert.Equal(new RawCondition(RawTest.AtMost, -1), t.Under);
        Assert.Equal(new RawCondition(RawTest.AtLeast, 27649), t.Over);
    }

    [Fact]
    public void Raw_thresholds_on_a_descending_card_flip_direction()
    {
        var t = StatusBands.RawThresholds(Ne43Point(CardDescending));
        Assert.Equal(RawTest.AtLeast, t.FaultLow.Test);
        Assert.Equal(RawTest.AtMost, t.FaultHigh.Test);
        Assert.Equal(new RawCondition(RawTest.AtLeast, 30001), t.Under);
        Assert.Equal(new RawCondition(RawTest.AtMost, 1999), t.Over);
    }

    [Fact]
    public void Raw_threshold_beyond_the_limits_is_never()
    {
        // The 0..20 mA card's limits start at raw 0 = 0 mA: a fault-low threshold below 0 mA is never reached.
        var point = Linear(card: Card0To20) with { Health = new Health(HealthKind.Custom, -1, null) };
        var t = StatusBands.RawThresholds(point);
        Assert.Equal(RawCondition.Never, t.FaultLow);
        Assert.Equal(RawCondition.Never, t.FaultHigh);
    }

    public static TheoryData<string> CardNames => new(AllCards.Select(c => c.Name));

    private static readonly Health[] Healths =
    [
        Health.None,
        Health.Ne43,
        new(HealthKind.Custom, 3.8, 20.5),
        new(HealthKind.Custom, 3.123456789, null),
        new(HealthKind.Custom, null, 20.987654321),
    ];

    [Theory]
    [MemberData(nameof(CardNames))]
    public void Raw_thresholds_agree_with_the_reference_for_every_raw(string cardName)
    {
        var card = AllCards.Single(c => c.Name == cardName);
        var (typeMin, typeMax) = Card.RangeOf(card.RawType);
        var from = Math.Max(typeMin, card.LimitLow - 100);
        var to = Math.Min(typeMax, card.LimitHigh + 100);
        foreach (var health in Healths)
        foreach (var (low, high) in new[] { (4.0, 20.0), (0.0, 20.0), (4.4, 19.6) })
        {
            if (health.FaultLowMa is { } f && f >= low) continue; // a fault threshold inside the signal span is rejected by the binder
            var point = Linear(card: card) with { Health = health, SignalLowMa = low, SignalHighMa = high };
            var thresholds = StatusBands.RawThresholds(point);
            for (var raw = from; raw <= to; raw++)
            {
                var expected = StatusBands.StatusOf(point, raw);
                var actual = thresholds.StatusOf(raw);
                if (expected != actual)
                    Assert.Fail($"{card.Name} {health} {low}..{high} mA raw {raw}: reference {expected}, thresholds {actual}");
            }
        }
    }

    [Fact]
    public void Raw_thresholds_agree_with_the_reference_on_random_cards()
    {
        var gen =
            from rawLow in Gen.Long[-20000, 20000]
            from rawWidth in Gen.Long[-40000, 40000]
            from eLow in Gen.Double[-5, 10]
            from eWidth in Gen.Double[0.5, 30]
            from volts in Gen.Bool
            from faultLow in Gen.Double[-2, 5]
            from faultHigh in Gen.Double[15, 30]
            from probe in Gen.Long[-32768, 32767]
            where Math.Abs(rawWidth) >= 10
            select (rawLow, rawWidth, eLow, eWidth, volts, faultLow, faultHigh, probe);

        gen.Sample(s =>
        {
            var card = new Card("RND", s.rawLow, s.rawLow + s.rawWidth, s.eLow, s.eLow + s.eWidth,
                s.volts ? ElectricalUnit.Volt : ElectricalUnit.MilliAmp, -32768, 32767, [], RawType.INT, 250, Here);
            var point = Linear(card: card) with
            {
                ShuntOhms = s.volts ? 250 : null,
                Health = new Health(HealthKind.Custom, s.faultLow, s.faultHigh),
            };
            var thresholds = StatusBands.RawThresholds(point);
            // Check the probe and every count around each threshold.
            var raws = new List<long> { s.probe };
            foreach (var c in new[] { thresholds.FaultLow, thresholds.FaultHigh, thresholds.Under, thresholds.Over })
                for (var d = -2; d <= 2; d++) raws.Add(c.Threshold + d);
            foreach (var raw in raws.Where(r => r is >= -32768 and <= 32767))
                Assert.Equal(StatusBands.StatusOf(point, raw), thresholds.StatusOf(raw));
        }, iter: 2000);
    }
}
