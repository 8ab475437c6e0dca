using ScaleGen.Engine;
using ScaleGen.Model;
using static ScaleGen.Tests.Engine.TestPoints;

namespace ScaleGen.Tests.Engine;

public class LoopBudgetTests
{
    [Fact]
    public void Largest_loop_resistance()
    {
        Assert.Equal(750.0, LoopBudget.MaxLoopOhms(24, 9, 20), 9); // common practice
        Assert.Equal(300.0, LoopBudget.MaxLoopOhms(15, 9, 20), 9); // common practice
        Assert.Equal(14.0, LoopBudget.MinSupplyVolts(9, 20, 250), 9); // common practice
    }

    [Fact]
    public void Budget_of_a_point()
    {
        var point = Linear() with { Loop = Loop(supply: 24, device: 9) };
        var budget = LoopBudget.Evaluate(point)!;
        Assert.Equal(250.0, budget.TotalOhms, 9);
        Assert.Equal(750.0, budget.MaxOhms, 9); // common practice
        Assert.Equal(14.0, budget.MinSupplyVolts, 9); // common practice
        Assert.Equal(10.0, budget.MarginVolts, 9);
        Assert.True(budget.Ok);
        Assert.Null(budget.HartOk);
        Assert.Null(budget.UpscaleFaultOk);
        Assert.Null(LoopBudget.Evaluate(Linear()));
    }

    [Fact]
    public void Budget_fails_below_the_needed_supply()
    {
        var budget = LoopBudget.Evaluate(Linear() with { Loop = Loop(supply: 13.9, device: 9) })!;
        Assert.False(budget.Ok); // common practice: a 250 ohm loop needs 14 V
        Assert.True(budget.MarginVolts < 0);
    }

    [Fact]
    public void Cable_adds_both_conductors()
    {
        var mm2 = new Conductor(1.0, null);
        Assert.Equal(18.1, ConductorResistance.LoopOhms(mm2, 500)!.Value, 9); // IEC 60228 (from memory)
        var point = Linear() with { Loop = Loop(cableMetres: 500, conductor: mm2, barrier: 280, extra: 10) };
        var budget = LoopBudget.Evaluate(point)!;
        Assert.Equal(18.1, budget.CableOhms, 9); // IEC 60228 (from memory)
        Assert.Equal(250 + 280 + 18.1 + 10, budget.TotalOhms, 9);
        Assert.True(budget.CableKnown);
    }

    [Theory]
    [InlineData(0.5, 36.0)] // IEC 60228 (from memory)
    [InlineData(0.75, 24.5)] // IEC 60228 (from memory)
    [InlineData(1.0, 18.1)] // IEC 60228 (from memory)
    [InlineData(1.5, 12.1)] // IEC 60228 (from memory)
    [InlineData(2.5, 7.41)] // IEC 60228 (from memory)
    public void Metric_conductor_table(double mm2, double ohmPerKm)
    {
        Assert.Equal(ohmPerKm, ConductorResistance.OhmPerKm(new Conductor(mm2, null)));
    }

    [Fact]
    public void Unknown_size_is_null()
    {
        Assert.Null(ConductorResistance.OhmPerKm(new Conductor(0.6, null)));
        Assert.Null(ConductorResistance.OhmPerKm(new Conductor(null, 99)));
        Assert.Null(ConductorResistance.OhmPerKm(new Conductor(null, null)));
        var budget = LoopBudget.Evaluate(Linear() with { Loop = Loop(cableMetres: 100, conductor: new Conductor(0.6, null)) })!;
        Assert.False(budget.CableKnown);
        Assert.Equal(0.0, budget.CableOhms);
    }

    [Theory]
    [InlineData(22, 52.96)] // ASTM B258
    [InlineData(20, 33.31)] // ASTM B258
    [InlineData(18, 20.95)] // ASTM B258
    [InlineData(16, 13.17)] // ASTM B258
    [InlineData(14, 8.286)] // ASTM B258
    public void Awg_conductors(int awg, double ohmPerKm)
    {
        Assert.Equal(ohmPerKm, ConductorResistance.OhmPerKm(new Conductor(null, awg))!.Value, 2);
    }

    [Fact]
    public void One_km_of_18_awg_one_way()
    {
        Assert.Equal(41.9, ConductorResistance.LoopOhms(new Conductor(null, 18), 1000)!.Value, 1); // ASTM B258
    }

    [Fact]
    public void Hart_window_on_total_resistance()
    {
        var low = Linear(card: Card4To20 with { InputOhms = 200 }) with { Loop = Loop(hart: true) };
        Assert.False(LoopBudget.Evaluate(low)!.HartOk); // HART (from memory): 230 ohm minimum
        var usual = Linear() with { Loop = Loop(hart: true) };
        Assert.True(LoopBudget.Evaluate(usual)!.HartOk); // HART (from memory): 250 ohm is the usual choice
        var high = Linear() with { Loop = Loop(hart: true, barrier: 900) };
        Assert.False(LoopBudget.Evaluate(high)!.HartOk); // HART (from memory): 1100 ohm maximum
    }

    [Fact]
    public void Voltage_card_loop_counts_the_shunt()
    {
        var point = Linear(card: Card0To10V with { InputOhms = 100000 }) with { Loop = Loop() };
        var budget = LoopBudget.Evaluate(point)!;
        Assert.Equal(250.0, budget.TotalOhms, 9);
        Assert.Equal(250.0, budget.ShuntOhms);
        Assert.Equal(0.0, budget.CardOhms);
    }

    [Fact]
    public void Upscale_failure_current_needs_more_voltage()
    {
        var point = Linear() with { Health = Health.Ne43, Loop = Loop(supply: 14.1, device: 9) };
        var budget = LoopBudget.Evaluate(point)!;
        Assert.True(budget.Ok); // common practice: 14 V needed at 20 mA
        Assert.Equal(21.0, budget.UpscaleFaultMa); // NAMUR NE 43
        Assert.False(budget.UpscaleFaultOk); // 9 + 0.021 * 250 = 14.25 V > 14.1 V
    }
}
