using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>
/// The power budget of one two-wire loop (common practice: the transmitter needs its
/// minimum terminal voltage at the highest loop current). Resistances in ohm, voltages in V,
/// currents in mA as everywhere in the model.
/// </summary>
/// <param name="CardOhms">Card input resistance (mA card); 0 on a voltage card.</param>
/// <param name="ShuntOhms">Shunt resistance (voltage card); 0 on a mA card.</param>
/// <param name="CableOhms">Both conductors; 0 when no cable is given or its size is unknown (see <paramref name="CableKnown"/>).</param>
/// <param name="CableKnown">False when a cable is given with a conductor size the table does not know.</param>
/// <param name="TotalOhms">Every series resistance: card input, shunt, barrier, cable, extra.</param>
/// <param name="MaxOhms">(supply - device) / current.</param>
/// <param name="MinSupplyVolts">device + current * total.</param>
/// <param name="MarginVolts">supply - min supply.</param>
/// <param name="Ok">Margin &gt;= 0.</param>
/// <param name="HartOk">Total within the HART window; null when the loop does not use HART.</param>
/// <param name="UpscaleFaultMa">The upscale failure current of the point's health (e.g. 21 mA for NE 43); null if none.</param>
/// <param name="UpscaleFaultOk">Whether the loop can still drive that current with the device voltage; null if none.</param>
public sealed record LoopBudgetResult(
    double SupplyVolts,
    double DeviceVolts,
    double CurrentMa,
    double CardOhms,
    double ShuntOhms,
    double BarrierOhms,
    double CableOhms,
    bool CableKnown,
    double ExtraOhms,
    double TotalOhms,
    double MaxOhms,
    double MinSupplyVolts,
    double MarginVolts,
    bool Ok,
    bool? HartOk,
    double? UpscaleFaultMa,
    bool? UpscaleFaultOk);

public static class LoopBudget
{
    /// <summary>HART physical layer loop resistance window (HCF, from memory).</summary>
    public const double HartMinOhms = 230.0, HartMaxOhms = 1100.0;

    /// <summary>Null when the point has no loop block.</summary>
    public static LoopBudgetResult? Evaluate(Point point)
    {
        if (point.Loop is not { } loop) return null;

        var cardOhms = point.Card.IsVoltage ? 0.0 : point.Card.InputOhms;
        var shuntOhms = point.Card.IsVoltage ? point.ShuntOhms ?? 0.0 : 0.0;
        double cableOhms = 0;
        var cableKnown = true;
        if (loop.CableLengthMetres is { } length && loop.Conductor is { } conductor)
        {
            var ohms = ConductorResistance.LoopOhms(conductor, length);
            cableKnown = ohms is not null;
            cableOhms = ohms ?? 0.0;
        }
        var total = cardOhms + shuntOhms + loop.BarrierOhms + cableOhms + loop.ExtraOhms;

        var maxOhms = MaxLoopOhms(loop.SupplyVolts, loop.DeviceVolts, loop.CurrentMa);
        var minSupply = MinSupplyVolts(loop.DeviceVolts, loop.CurrentMa, total);
        var margin = loop.SupplyVolts - minSupply;

        bool? hartOk = loop.Hart ? total >= HartMinOhms && total <= HartMaxOhms : null;
        var upscale = point.Health.FaultHighMa;
        bool? upscaleOk = upscale is { } fault ? MinSupplyVolts(loop.DeviceVolts, fault, total) <= loop.SupplyVolts : null;

        return new LoopBudgetResult(
            loop.SupplyVolts, loop.DeviceVolts, loop.CurrentMa,
            cardOhms, shuntOhms, loop.BarrierOhms, cableOhms, cableKnown, loop.ExtraOhms,
            total, maxOhms, minSupply, margin, margin >= 0, hartOk, upscale, upscaleOk);
    }

    /// <summary>device + current * total resistance (current in mA).</summary>
    public static double MinSupplyVolts(double deviceVolts, double currentMa, double totalOhms) =>
        deviceVolts + currentMa * totalOhms / 1000.0;

    /// <summary>(supply - device) / current (current in mA).</summary>
    public static double MaxLoopOhms(double supplyVolts, double deviceVolts, double currentMa) =>
        (supplyVolts - deviceVolts) * 1000.0 / currentMa;
}
