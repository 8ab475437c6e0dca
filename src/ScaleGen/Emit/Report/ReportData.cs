using System.Collections.Immutable;

namespace ScaleGen.Emit.Report;

// The review report as plain data: everything the page shows, computed once from the
// plant and the engine. The HTML renderer only lays this out; the snapshot test pins this
// data (as JSON) separately from the markup. Units as in the model: mA, V, ohm, s, %.

/// <summary>Everything the review report shows.</summary>
public sealed record ReportData(
    string Title,
    string ToolVersion,
    double CycleSeconds,
    ImmutableArray<ReportSource> Sources,
    ReportSummary Summary,
    ImmutableArray<ReportCard> Cards,
    ImmutableArray<ReportPoint> Points,
    LoopChart Loops,
    PrioritySpread Priorities,
    ImmutableArray<ReportDiagnostic> Diagnostics,
    ImmutableArray<string> Cautions);

/// <summary>One input file and the hash of its text (so a printed report names what it was made from).</summary>
public sealed record ReportSource(string File, string Sha256);

/// <summary>Counts for the summary at the top.</summary>
public sealed record ReportSummary(
    int PointCount,
    ImmutableArray<MeasureCount> ByMeasure,
    int AlarmCount,
    int LoopCount,
    int LoopsFailing,
    int Errors,
    int Warnings);

public sealed record MeasureCount(string Measure, int Points);

/// <summary>A card as declared, with how many points use it.</summary>
public sealed record ReportCard(
    string Name,
    string RawType,
    double RawLow,
    double RawHigh,
    double SignalLow,
    double SignalHigh,
    string SignalUnit,
    long LimitLow,
    long LimitHigh,
    string FaultCodes,
    double InputOhms,
    int Points);

/// <summary>One point: its settings, its transfer curve, its current bands and its alarms.</summary>
public sealed record ReportPoint(
    string Tag,
    string Description,
    string Unit,
    string Card,
    string Address,
    double SignalLowMa,
    double SignalHighMa,
    double? ShuntOhms,
    double Lrv,
    double Urv,
    bool SquareRoot,
    double? CutoffPercent,
    string Health,
    string OnFault,
    double FilterSeconds,
    string Measure,
    double TolerancePercent,
    TransferCurve Curve,
    ImmutableArray<CurrentBand> Bands,
    ImmutableArray<ReportAlarm> Alarms);

/// <summary>
/// The value the point shows for a loop current, over <see cref="FromMa"/> .. <see cref="ToMa"/>,
/// as polylines. A square-root point with a cutoff has a jump at the cutoff, so two pieces.
/// Fault action and filter are not applied: the curve is the signal path itself.
/// </summary>
public sealed record TransferCurve(double FromMa, double ToMa, ImmutableArray<ImmutableArray<CurvePoint>> Pieces);

public readonly record struct CurvePoint(double Ma, double Value);

/// <summary>A stretch of loop current with one status (OK, UNDER, OVER, FAULT_LOW, FAULT_HIGH, CARD_FAULT).</summary>
public sealed record CurrentBand(string Status, double FromMa, double ToMa);

/// <summary>One alarm with where it trips and resets.</summary>
public sealed record ReportAlarm(
    string Kind,
    double Setpoint,
    double Deadband,
    double ResetValue,
    double TripMa,
    double ResetMa,
    long? TripRaw,
    long? ResetRaw,
    int Priority,
    double DelaySeconds,
    double ClearSeconds,
    string? Text);

/// <summary>Loop budgets, drawn on one shared volt scale.</summary>
public sealed record LoopChart(double ScaleVolts, ImmutableArray<ReportLoop> Loops);

/// <summary>
/// One loop's budget: the supply against what the loop needs, split into the transmitter's
/// minimum voltage and the drop across each series resistance at the budget current.
/// </summary>
public sealed record ReportLoop(
    string Tag,
    double SupplyVolts,
    double CurrentMa,
    double MinSupplyVolts,
    double MarginVolts,
    double TotalOhms,
    double MaxOhms,
    bool Ok,
    bool? HartOk,
    ImmutableArray<VoltageShare> Needs);

/// <summary>A part of what a loop needs: the device, or the drop across one resistance.</summary>
public sealed record VoltageShare(string Part, double Ohms, double Volts);

/// <summary>
/// Alarm priorities against the usual spread of about 80 % low, 15 % medium, 5 % high
/// (ISA-18.2 / EEMUA 191, from memory). Priority 1 counts as high, 2 as medium, 3 and 4 as low.
/// </summary>
public sealed record PrioritySpread(ImmutableArray<PriorityCount> ByPriority, ImmutableArray<PriorityShare> Shares);

public sealed record PriorityCount(int Priority, int Alarms);

public sealed record PriorityShare(string Level, string Priorities, int Alarms, double Percent, double UsualPercent);

public sealed record ReportDiagnostic(string Code, string Severity, string File, int Line, int Column, string Message);
