using ScaleGen.Model;
using ScaleGen.Text;

namespace ScaleGen.Engine;

/// <summary>
/// Checks that need the scaling math: whether the card can represent the signal span,
/// count resolution, conductor data and loop budgets. They run on the bound model, after
/// the binder, so the language rules and the math each stay in one place.
/// </summary>
public static class PlantAnalyzer
{
    /// <summary>Coarser than this, one count is a visible step on an operator screen.</summary>
    public const double ResolutionLimitPercent = 0.1;

    public static void Analyze(Plant plant, DiagnosticBag diagnostics)
    {
        foreach (var point in plant.Points)
        {
            CheckSpanOnCard(point, diagnostics);
            CheckResolution(point, diagnostics);
            CheckDeadbands(point, diagnostics);
            CheckLoop(point, diagnostics);
        }
    }

    private static void CheckSpanOnCard(Point point, DiagnosticBag diagnostics)
    {
        var card = point.Card;
        foreach (var ma in new[] { point.SignalLowMa, point.SignalHighMa })
        {
            var raw = SignalPath.MaToRaw(point, ma);
            if (raw >= card.LimitLow - 1e-9 && raw <= card.LimitHigh + 1e-9) continue;
            diagnostics.Report(DiagnosticCatalog.SpanOutsideLimits, point.Location,
                $"card '{card.Name}' cannot represent {DiagnosticBag.Num(ma)} mA of point '{point.Tag}': it would be raw {DiagnosticBag.Num(Math.Round(raw, 1))}, outside the card's limits {card.LimitLow} .. {card.LimitHigh}; use a card (or shunt) that covers the signal span");
            return;
        }
    }

    private static void CheckResolution(Point point, DiagnosticBag diagnostics)
    {
        var resolution = Deadbands.ResolutionPercentOfSpan(point);
        if (resolution > ResolutionLimitPercent)
            diagnostics.Report(DiagnosticCatalog.CoarseResolution, point.Location,
                $"one count of card '{point.Card.Name}' is {DiagnosticBag.Num(Math.Round(resolution, 4))} % of the span of '{point.Tag}', coarser than {DiagnosticBag.Num(ResolutionLimitPercent)} %: use a card with more counts");
    }

    private static void CheckDeadbands(Point point, DiagnosticBag diagnostics)
    {
        foreach (var alarm in point.Alarms)
        {
            if (alarm.Deadband <= 0) continue;
            var oneCount = Deadbands.OneCountInEu(point, alarm.Setpoint);
            if (alarm.Deadband < oneCount)
                diagnostics.Report(DiagnosticCatalog.DeadbandBelowOneCount, alarm.Location,
                    $"the {alarm.Kind} deadband of {DiagnosticBag.Num(alarm.Deadband)} {point.Unit} is less than one raw count ({DiagnosticBag.Num(Math.Round(oneCount, 6))} {point.Unit}) near the setpoint, so it cannot stop chatter: widen it");
        }
    }

    private static void CheckLoop(Point point, DiagnosticBag diagnostics)
    {
        if (point.Loop is not { } loop) return;
        if (loop.Conductor is { } conductor && ConductorResistance.OhmPerKm(conductor) is null)
        {
            var known = string.Join(", ", ConductorResistance.KnownSquareMillimetres.Select(DiagnosticBag.Num));
            diagnostics.Report(DiagnosticCatalog.UnknownConductor, loop.Location,
                $"no resistance is known for a {conductor} conductor: use one of {known} mm2, or a gauge from 0 to 40 AWG");
            return;
        }
        if (LoopBudget.Evaluate(point) is not { } budget) return;
        var v = DiagnosticBag.Num;
        if (!budget.Ok)
            diagnostics.Report(DiagnosticCatalog.LoopBudgetFails, loop.Location,
                $"loop of '{point.Tag}' needs {v(Math.Round(budget.MinSupplyVolts, 2))} V at {v(budget.CurrentMa)} mA through {v(Math.Round(budget.TotalOhms, 1))} ohm but has {v(budget.SupplyVolts)} V (at most {v(Math.Round(budget.MaxOhms, 1))} ohm): raise the supply or cut the loop resistance");
        if (budget.HartOk == false)
            diagnostics.Report(DiagnosticCatalog.HartWindow, loop.Location,
                $"HART on '{point.Tag}' needs {v(LoopBudget.HartMinOhms)} .. {v(LoopBudget.HartMaxOhms)} ohm in the loop; it has {v(Math.Round(budget.TotalOhms, 1))} ohm: {(budget.TotalOhms < LoopBudget.HartMinOhms ? "add series resistance" : "cut the loop resistance")}");
        if (budget.Ok && budget.UpscaleFaultOk == false && budget.UpscaleFaultMa is { } fault)
            diagnostics.Report(DiagnosticCatalog.UpscaleFailureUnreachable, loop.Location,
                $"the loop of '{point.Tag}' cannot drive the upscale failure current of {v(fault)} mA, so an upscale fault would read as OVER, not FAULT_HIGH: raise the supply or cut the loop resistance");
    }
}
