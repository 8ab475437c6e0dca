using System.Collections.Immutable;
using ScaleGen.Text;

namespace ScaleGen.Model;

// The bound model: plain immutable records with every default applied and every name
// resolved. Emitters and the engine read only this, never the syntax tree.
// Units inside the model are fixed: current in mA, voltage in V, resistance in ohm,
// time in seconds, length in metres, percentages as 0..100.

/// <summary>A whole plant: every file given on one command line.</summary>
public sealed record Plant(
    string? Title,
    double CycleSeconds,
    ImmutableArray<Card> Cards,
    ImmutableArray<Point> Points,
    ImmutableArray<SourceText> Sources)
{
    public const double DefaultCycleSeconds = 0.1;

    public Point? FindPoint(string tag) =>
        Points.FirstOrDefault(p => string.Equals(p.Tag, tag, StringComparison.OrdinalIgnoreCase));
}

public enum ElectricalUnit { MilliAmp, Volt }

/// <summary>Raw data type the card value has in the PLC.</summary>
public enum RawType { INT, DINT, UINT }

/// <summary>What an input card does: a straight line from raw counts to mA or V.</summary>
public sealed record Card(
    string Name,
    double RawLow,
    double RawHigh,
    double ElectricalLow,
    double ElectricalHigh,
    ElectricalUnit Unit,
    long LimitLow,
    long LimitHigh,
    ImmutableArray<long> FaultCodes,
    RawType RawType,
    double InputOhms,
    SourceLocation Location)
{
    public bool IsVoltage => Unit == ElectricalUnit.Volt;

    public static (long Min, long Max) RangeOf(RawType type) => type switch
    {
        RawType.INT => (short.MinValue, short.MaxValue),
        RawType.UINT => (ushort.MinValue, ushort.MaxValue),
        _ => (int.MinValue, int.MaxValue),
    };
}

public enum HealthKind { None, Ne43, Custom }

/// <summary>Fault thresholds on the loop current. Null means "no threshold on that side".</summary>
public sealed record Health(HealthKind Kind, double? FaultLowMa, double? FaultHighMa)
{
    /// <summary>NAMUR NE 43: failure at or below 3.6 mA, or at or above 21.0 mA.</summary>
    public static readonly Health Ne43 = new(HealthKind.Ne43, 3.6, 21.0);
    public static readonly Health None = new(HealthKind.None, null, null);
}

public enum FaultActionKind { Hold, Low, High, Value }

/// <summary>
/// What the value does while the point is faulted. Hold keeps the last good value (LRV
/// until there has been one); Low and High drive it to the lower or upper end of the
/// engineering range (whichever of LRV and URV is smaller or larger); Value substitutes a constant.
/// </summary>
public sealed record FaultAction(FaultActionKind Kind, double Value = 0)
{
    public static readonly FaultAction Hold = new(FaultActionKind.Hold);
}

public enum MeasureKind { Flow, Level, Pressure, Temperature, Analysis, Other }

public enum AlarmKind { HH, H, L, LL }

public enum PointStatus { OK, UNDER, OVER, FAULT_LOW, FAULT_HIGH, CARD_FAULT }

/// <summary>One alarm limit. Deadband is already converted to engineering units.</summary>
public sealed record Alarm(
    AlarmKind Kind,
    double Setpoint,
    double Deadband,
    double OnDelaySeconds,
    double OffDelaySeconds,
    int Priority,
    string? Message,
    SourceLocation Location)
{
    /// <summary>HH and H trip on a rising value; L and LL on a falling one.</summary>
    public bool IsHigh => Kind is AlarmKind.HH or AlarmKind.H;

    /// <summary>The value at which an active alarm clears (deadband applied).</summary>
    public double ResetValue => IsHigh ? Setpoint - Deadband : Setpoint + Deadband;
}

/// <summary>A conductor size: metric cross-section or American wire gauge.</summary>
public sealed record Conductor(double? SquareMillimetres, int? Awg)
{
    public override string ToString() => Awg is { } awg ? $"{awg} AWG" : $"{SquareMillimetres?.ToString("0.###", System.Globalization.CultureInfo.InvariantCulture)} mm2";
}

/// <summary>The loop power data of one point.</summary>
public sealed record LoopSpec(
    double SupplyVolts,
    double DeviceVolts,
    double? CableLengthMetres,
    Conductor? Conductor,
    double BarrierOhms,
    double ExtraOhms,
    bool Hart,
    double CurrentMa,
    SourceLocation Location);

/// <summary>One analog input point with every setting resolved.</summary>
public sealed record Point(
    string Tag,
    string Identifier,
    string Description,
    Card Card,
    string Address,
    double SignalLowMa,
    double SignalHighMa,
    double? ShuntOhms,
    double Lrv,
    double Urv,
    string Unit,
    bool SquareRoot,
    double CutoffPercent,
    Health Health,
    FaultAction OnFault,
    double FilterSeconds,
    MeasureKind Measure,
    double TolerancePercent,
    ImmutableArray<Alarm> Alarms,
    LoopSpec? Loop,
    SourceLocation Location)
{
    /// <summary>URV - LRV; negative on a reverse-acting point.</summary>
    public double Span => Urv - Lrv;

    public bool IsReverse => Lrv > Urv;

    public double ValueMin => Math.Min(Lrv, Urv);

    public double ValueMax => Math.Max(Lrv, Urv);
}
