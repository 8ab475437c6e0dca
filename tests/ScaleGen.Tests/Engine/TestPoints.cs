using System.Collections.Immutable;
using ScaleGen.Model;
using ScaleGen.Text;

namespace ScaleGen.Tests.Engine;

/// <summary>
/// Model records for engine tests, built directly (no parser). Invented, typical cards;
/// override anything with <c>with</c>.
/// </summary>
internal static class TestPoints
{
    public static readonly SourceLocation Here = new(new SourceText("test.scale", ""), default);

    /// <summary>16-bit card, 0..27648 at 4..20 mA, over-range to 32511, wire break 32767.</summary>
    public static readonly Card Card4To20 = new("AI16", 0, 27648, 4, 20, ElectricalUnit.MilliAmp,
        -4864, 32511, [32767], RawType.INT, 250, Here);

    /// <summary>0..27648 at 0..20 mA (no live zero on the card).</summary>
    public static readonly Card Card0To20 = new("AI0_20", 0, 27648, 0, 20, ElectricalUnit.MilliAmp,
        0, 32511, [32767], RawType.INT, 250, Here);

    /// <summary>0..32000 at 0..10 V, read through a shunt.</summary>
    public static readonly Card Card0To10V = new("AV10", 0, 32000, 0, 10, ElectricalUnit.Volt,
        -1000, 32767, [], RawType.INT, 0, Here);

    /// <summary>Counts fall as the current rises: 30000 at 4 mA, 2000 at 20 mA.</summary>
    public static readonly Card CardDescending = new("AIDOWN", 30000, 2000, 4, 20, ElectricalUnit.MilliAmp,
        -4000, 32000, [32767], RawType.INT, 250, Here);

    /// <summary>Unsigned 16-bit, 4000..60000 at 4..20 mA (3500 counts per mA), no fault codes.</summary>
    public static readonly Card CardUint = new("AIU", 4000, 60000, 4, 20, ElectricalUnit.MilliAmp,
        0, 65535, [], RawType.UINT, 100, Here);

    public static IEnumerable<Card> AllCards => [Card4To20, Card0To20, Card0To10V, CardDescending, CardUint];

    /// <summary>A linear 4..20 mA point, 0..100 "%", health none, hold, no filter, no alarms, no loop.</summary>
    public static Point Linear(double lrv = 0, double urv = 100, Card? card = null) => new(
        Tag: "PT-1",
        Identifier: "PT_1",
        Description: "test point",
        Card: card ?? Card4To20,
        Address: "R0.S0.C0",
        SignalLowMa: 4,
        SignalHighMa: 20,
        ShuntOhms: (card ?? Card4To20).IsVoltage ? 250 : null,
        Lrv: lrv,
        Urv: urv,
        Unit: "%",
        SquareRoot: false,
        CutoffPercent: 0,
        Health: Health.None,
        OnFault: FaultAction.Hold,
        FilterSeconds: 0,
        Measure: MeasureKind.Other,
        TolerancePercent: 0.5,
        Alarms: [],
        Loop: null,
        Location: Here);

    /// <summary>A square-root DP flow point, 0..100, with the given cutoff (% of flow span).</summary>
    public static Point Flow(double cutoffPercent = 0, double lrv = 0, double urv = 100, Card? card = null) =>
        Linear(lrv, urv, card) with { Tag = "FT-1", Identifier = "FT_1", SquareRoot = true, CutoffPercent = cutoffPercent, Measure = MeasureKind.Flow };

    public static Point WithAlarms(this Point point, params Alarm[] alarms) =>
        point with { Alarms = [.. alarms] };

    public static Alarm Alarm(AlarmKind kind, double setpoint, double deadband = 0, double onDelay = 0, double offDelay = 0) =>
        new(kind, setpoint, deadband, onDelay, offDelay, 3, null, Here);

    public static LoopSpec Loop(double supply = 24, double device = 9, double? cableMetres = null, Conductor? conductor = null,
        double barrier = 0, double extra = 0, bool hart = false, double currentMa = 20) =>
        new(supply, device, cableMetres, conductor, barrier, extra, hart, currentMa, Here);
}
