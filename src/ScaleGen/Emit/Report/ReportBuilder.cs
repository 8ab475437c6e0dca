using System.Collections.Immutable;
using System.Globalization;
using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Emit.Report;

/// <summary>Computes the review report's data from the plant, its diagnostics and the engine.</summary>
public static class ReportBuilder
{
    /// <summary>
    /// The loop currents a transfer curve spans on a live-zero point: a little beyond both
    /// NE 43 failure currents (3.6 and 21 mA). A signal without live zero starts at its own low end.
    /// </summary>
    public const double CurveFromMa = 3.0, CurveToMa = 22.0;

    public static (double From, double To) CurveSpan(Point point) =>
        (Math.Min(CurveFromMa, point.SignalLowMa), Math.Max(CurveToMa, point.SignalHighMa + 2));

    /// <summary>Steps of the extracted (flow) fraction between samples of a square-root curve.</summary>
    private const double SqrtStep = 0.05;

    public static ReportData Build(EmitContext context)
    {
        var plant = context.Plant;
        // Plain loops: these run once per point of plants with tens of thousands of them.
        var points = ImmutableArray.CreateBuilder<ReportPoint>(plant.Points.Length);
        var loopList = ImmutableArray.CreateBuilder<ReportLoop>();
        foreach (var point in plant.Points)
        {
            points.Add(BuildPoint(point));
            if (BuildLoop(point) is { } loop) loopList.Add(loop);
        }
        var loops = loopList.ToImmutable();
        var diagnostics = context.Diagnostics.Select(d => new ReportDiagnostic(
            d.Code, d.IsError ? "error" : "warning", Path.GetFileName(d.Location.Path), d.Location.Line, d.Location.Column, d.Message)).ToImmutableArray();

        var summary = new ReportSummary(
            plant.Points.Length,
            Enum.GetValues<MeasureKind>()
                .Select(kind => new MeasureCount(Word(kind), plant.Points.Count(p => p.Measure == kind)))
                .Where(m => m.Points > 0)
                .ToImmutableArray(),
            plant.Points.Sum(p => p.Alarms.Length),
            loops.Length,
            loops.Count(l => !l.Ok),
            diagnostics.Count(d => d.Severity == "error"),
            diagnostics.Count(d => d.Severity == "warning"));

        var cards = plant.Cards
            .Select(c => new ReportCard(c.Name, c.RawType.ToString(), c.RawLow, c.RawHigh, c.ElectricalLow, c.ElectricalHigh,
                c.IsVoltage ? "V" : "mA", c.LimitLow, c.LimitHigh,
                c.FaultCodes.IsDefaultOrEmpty ? "none" : string.Join(", ", c.FaultCodes.Select(code => code.ToString(CultureInfo.InvariantCulture))),
                c.InputOhms, plant.Points.Count(p => p.Card.Name == c.Name)))
            .ToImmutableArray();

        return new ReportData(
            plant.Title ?? "Untitled plant",
            context.ToolVersion,
            plant.CycleSeconds,
            plant.Sources.Select(s => new ReportSource(GeneratedHeader.FileNameOf(s), GeneratedHeader.Sha256(s.Text))).ToImmutableArray(),
            summary,
            cards,
            points.MoveToImmutable(),
            new LoopChart(LoopScale(loops), loops),
            Spread(plant),
            diagnostics,
            Cautions);
    }

    /// <summary>What the report tells every reader, on screen and on paper.</summary>
    public static ImmutableArray<string> Cautions { get; } = ImmutableArray.Create(
        string.Join(" ", GeneratedHeader.Caution),
        "This report shows the configuration as written in the .scale files and what ScaleGen computes from it. It does not show that the field wiring, the instruments or the PLC match it: check them at commissioning.",
        "Alarm settings and the priority spread are compared with usual starting values (ISA-18.2, EEMUA 191, from memory); the plant's own alarm philosophy decides.",
        "Loop budgets use copper conductor resistance at 20 degC (IEC 60228, from memory) and the transmitter voltage given in the file; hot cable and ageing supplies need margin. This is no intrinsic-safety entity check.");

    private static ReportPoint BuildPoint(Point point) => new(
        point.Tag,
        point.Description,
        point.Unit,
        point.Card.Name,
        point.Address,
        point.SignalLowMa,
        point.SignalHighMa,
        point.ShuntOhms,
        point.Lrv,
        point.Urv,
        point.SquareRoot,
        point.SquareRoot ? point.CutoffPercent : null,
        SettingWords.Health(point.Health),
        SettingWords.OnFault(point.OnFault),
        point.FilterSeconds,
        Word(point.Measure),
        point.TolerancePercent,
        Curve(point),
        Bands(point),
        Alarms(point));

    private static ImmutableArray<ReportAlarm> Alarms(Point point)
    {
        if (point.Alarms.IsEmpty) return ImmutableArray<ReportAlarm>.Empty;
        var alarms = ImmutableArray.CreateBuilder<ReportAlarm>(point.Alarms.Length);
        foreach (var alarm in point.Alarms)
        {
            var a = AlarmMath.AlarmPointOf(point, alarm);
            alarms.Add(new ReportAlarm(
                a.Alarm.Kind.ToString(), a.TripValue, a.Alarm.Deadband, a.ResetValue, a.TripMa, a.ResetMa, a.TripRaw, a.ResetRaw,
                a.Alarm.Priority, a.Alarm.OnDelaySeconds, a.Alarm.OffDelaySeconds, a.Alarm.Message));
        }
        return alarms.MoveToImmutable();
    }

    /// <summary>
    /// The transfer curve from the engine's signal path. A linear point is a straight line
    /// (its two ends). A square-root point is flat at LRV up to the cutoff current, then
    /// sampled at even steps of flow (so the steep start is drawn as finely as the rest).
    /// </summary>
    public static TransferCurve Curve(Point point)
    {
        var (from, to) = CurveSpan(point);
        if (!point.SquareRoot)
            return new TransferCurve(from, to, ImmutableArray.Create(ImmutableArray.Create(Sample(point, from), Sample(point, to))));

        // The current at which the shown value leaves LRV (the cutoff edge; signal low with no cutoff).
        var edge = Math.Clamp(SignalPath.ValueToMa(point, point.Lrv), from, to);
        var flat = ImmutableArray.Create(Sample(point, from), new CurvePoint(edge, SignalPath.MaToValue(point, Math.BitDecrement(edge))));
        var rising = ImmutableArray.CreateBuilder<CurvePoint>();
        rising.Add(Sample(point, edge));
        var top = SignalPath.ExtractedFraction(point, SignalPath.Fraction(point, to));
        for (var step = 1; step * SqrtStep < top; step++)
        {
            var ma = SignalPath.ValueToMa(point, SignalPath.ExtractedToValue(point, step * SqrtStep));
            if (ma > edge) rising.Add(Sample(point, ma));
        }
        rising.Add(Sample(point, to));
        return new TransferCurve(from, to, ImmutableArray.Create(flat, rising.ToImmutable()));
    }

    private static CurvePoint Sample(Point point, double ma) => new(ma, SignalPath.MaToValue(point, ma));

    /// <summary>
    /// The status of every stretch of current over the curve's span: cut at every threshold
    /// and card limit, each stretch judged by the engine at its middle, equal neighbours merged.
    /// </summary>
    public static ImmutableArray<CurrentBand> Bands(Point point)
    {
        var (from, to) = CurveSpan(point);
        // At most eight cuts: kept on the stack, sorted, the ones outside the span and the repeats left out.
        Span<double> cuts = stackalloc double[8];
        var count = 0;
        cuts[count++] = from;
        cuts[count++] = to;
        cuts[count++] = point.SignalLowMa;
        cuts[count++] = point.SignalHighMa;
        if (point.Health.FaultLowMa is { } low) cuts[count++] = low;
        if (point.Health.FaultHighMa is { } high) cuts[count++] = high;
        cuts[count++] = SignalPath.RawToMa(point, point.Card.LimitLow);
        cuts[count++] = SignalPath.RawToMa(point, point.Card.LimitHigh);
        cuts = cuts[..count];
        cuts.Sort();
        Span<double> edges = stackalloc double[8];
        var edgeCount = 0;
        foreach (var cut in cuts)
        {
            if (cut >= from && cut <= to && (edgeCount == 0 || cut != edges[edgeCount - 1]))
                edges[edgeCount++] = cut;
        }

        var bands = ImmutableArray.CreateBuilder<CurrentBand>(Math.Max(edgeCount - 1, 0));
        for (var i = 0; i + 1 < edgeCount; i++)
        {
            var status = StatusAt(point, (edges[i] + edges[i + 1]) / 2).ToString();
            if (bands.Count > 0 && bands[^1].Status == status)
                bands[^1] = bands[^1] with { ToMa = edges[i + 1] };
            else
                bands.Add(new CurrentBand(status, edges[i], edges[i + 1]));
        }
        return bands.ToImmutable();
    }

    /// <summary>The status for a loop current, with the card's limits (beyond them the card reports a fault).</summary>
    private static PointStatus StatusAt(Point point, double ma)
    {
        var raw = SignalPath.MaToRaw(point, ma);
        return raw < point.Card.LimitLow || raw > point.Card.LimitHigh ? PointStatus.CARD_FAULT : StatusBands.StatusOfMa(point, ma);
    }

    private static ReportLoop? BuildLoop(Point point)
    {
        if (LoopBudget.Evaluate(point) is not { } budget) return null;
        // Each drop is what the supply must spend to push the budget current through that resistance.
        VoltageShare Drop(string part, double ohms) => new(part, ohms, LoopBudget.MinSupplyVolts(0, budget.CurrentMa, ohms));
        var needs = new List<VoltageShare> { new("device", 0, budget.DeviceVolts) };
        if (budget.CardOhms > 0) needs.Add(Drop("card input", budget.CardOhms));
        if (budget.ShuntOhms > 0) needs.Add(Drop("shunt", budget.ShuntOhms));
        if (budget.BarrierOhms > 0) needs.Add(Drop("barrier", budget.BarrierOhms));
        if (budget.CableOhms > 0) needs.Add(Drop("cable", budget.CableOhms));
        if (budget.ExtraOhms > 0) needs.Add(Drop("extra", budget.ExtraOhms));
        return new ReportLoop(point.Tag, budget.SupplyVolts, budget.CurrentMa, budget.MinSupplyVolts, budget.MarginVolts,
            budget.TotalOhms, budget.MaxOhms, budget.Ok, budget.HartOk, needs.ToImmutableArray());
    }

    /// <summary>One volt scale for every bar, in steps of 5 V and at least 30 V, so one loop's change does not rescale the others.</summary>
    private static double LoopScale(ImmutableArray<ReportLoop> loops)
    {
        var most = loops.Select(l => Math.Max(l.SupplyVolts, l.MinSupplyVolts)).DefaultIfEmpty(0).Max();
        return Math.Max(30, Math.Ceiling(most / 5) * 5);
    }

    /// <summary>Usual split of alarm priorities (ISA-18.2 / EEMUA 191, from memory): about 80 % low, 15 % medium, 5 % high.</summary>
    private static readonly (string Level, string Priorities, int[] Members, double Usual)[] PriorityLevels =
    {
        ("high", "1", new[] { 1 }, 5),
        ("medium", "2", new[] { 2 }, 15),
        ("low", "3, 4", new[] { 3, 4 }, 80),
    };

    private static PrioritySpread Spread(Plant plant)
    {
        var alarms = plant.Points.SelectMany(p => p.Alarms).ToList();
        var byPriority = Enumerable.Range(1, 4).Select(p => new PriorityCount(p, alarms.Count(a => a.Priority == p))).ToImmutableArray();
        var shares = PriorityLevels.Select(level =>
        {
            var count = alarms.Count(a => level.Members.Contains(a.Priority));
            return new PriorityShare(level.Level, level.Priorities, count, alarms.Count == 0 ? 0 : 100.0 * count / alarms.Count, level.Usual);
        }).ToImmutableArray();
        return new PrioritySpread(byPriority, shares);
    }

    private static string Word(MeasureKind kind) => SettingWords.Measure(kind);
}
