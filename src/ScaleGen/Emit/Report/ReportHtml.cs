using System.Globalization;
using System.Net;
using System.Text;

namespace ScaleGen.Emit.Report;

/// <summary>
/// Lays the report data out as one self-contained HTML page: inline CSS, inline SVG charts,
/// no scripts, no external assets. It prints on A4 without splitting a point across pages.
/// Every chart element and table row is written on its own line, so a change to one point
/// changes only that point's lines.
/// </summary>
/// <remarks>
/// What every chart draws alike (the frame, and the current axis with its grid and labels,
/// one per span of current) is drawn once, in a hidden SVG before the first point, and
/// each chart places it with &lt;use&gt;: on a large plant it was a fifth of the page.
/// <para>
/// The page is streamed (<see cref="Write"/>): a plant of 50,000 points makes a page of
/// hundreds of MB, so it is built a point at a time and spilled to the output. The parts
/// written once per point or loop row are appended piece by piece with their numbers
/// written straight into the builder (<see cref="ReportNumbers"/>), instead of through
/// interpolated strings: at that size the temporaries cost several times the writing.
/// The parts written once per page stay in the plainer interpolated form.
/// </para>
/// </remarks>
public sealed class ReportHtml
{
    private readonly TextWriter _output;
    private readonly ReportData _data;
    private readonly StringBuilder _html = new();
    private readonly ReportNumbers _numbers = new();

    /// <summary>The id of the shared current axis (grid, labels and title) of each span of current, in order of first use.</summary>
    private readonly Dictionary<(double From, double To), string> _currentAxes = new();

    private ReportHtml(TextWriter output, ReportData data)
    {
        _output = output;
        _data = data;
    }

    /// <summary>The whole page as one string (for tests and small plants).</summary>
    public static string Render(ReportData data, IReadOnlyList<string> headerLines) =>
        TextChunks.Render(output => Write(output, data, headerLines));

    /// <summary>
    /// Writes the page to <paramref name="output"/> a few points at a time. Only reads
    /// <paramref name="data"/>, so it may run beside other writers of the same data.
    /// </summary>
    public static void Write(TextWriter output, ReportData data, IReadOnlyList<string> headerLines) =>
        new ReportHtml(output, data).Page(headerLines);

    private void Page(IReadOnlyList<string> headerLines)
    {
        var html = _html;
        html.Append("<!DOCTYPE html>\n<!--\n");
        // "--" may not appear inside an HTML comment.
        foreach (var line in headerLines) html.Append("  ").Append(line.Replace("--", "- -")).Append('\n');
        html.Append("-->\n");
        html.Append("<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
        html.Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
        html.Append(Invariant, $"<title>Review report: {E(_data.Title)}</title>\n");
        html.Append("<style>\n").Append(Style).Append("</style>\n</head>\n<body>\n");

        Title();
        Summary();
        Diagnostics();
        Priorities();
        Loops();
        Points();
        Cautions();

        html.Append("</body>\n</html>\n");
        Spill(all: true);
    }

    private void Spill(bool all = false) => TextChunks.Spill(_html, _output, all);

    // ---- sections ------------------------------------------------------------------------

    private void Title()
    {
        var html = _html;
        html.Append("<header class=\"masthead\">\n");
        html.Append(Invariant, $"<p class=\"kicker\">Review report</p>\n<h1>{E(_data.Title)}</h1>\n");
        html.Append(Invariant, $"<p class=\"meta\">{_data.Summary.PointCount} points &middot; task cycle {N(_data.CycleSeconds * 1000)} ms &middot; scalegen {E(_data.ToolVersion)}</p>\n");
        html.Append("</header>\n");
        html.Append("<aside class=\"caution\">").Append(E(_data.Cautions[0])).Append("</aside>\n");
    }

    private void Summary()
    {
        var html = _html;
        var s = _data.Summary;
        html.Append("<section id=\"summary\">\n<h2>Plant summary</h2>\n<div class=\"tiles\">\n");
        Tile(s.PointCount.ToString(CultureInfo.InvariantCulture), "points", null);
        Tile(s.AlarmCount.ToString(CultureInfo.InvariantCulture), "alarms", null);
        Tile(s.LoopCount.ToString(CultureInfo.InvariantCulture), "loop budgets",
            s.LoopsFailing == 0 ? "all pass" : string.Create(Invariant, $"{s.LoopsFailing} failing"), s.LoopsFailing > 0);
        Tile(s.Errors.ToString(CultureInfo.InvariantCulture), "errors",
            string.Create(Invariant, $"{s.Warnings} warning{(s.Warnings == 1 ? "" : "s")}"), s.Errors > 0 || s.Warnings > 0);
        html.Append("</div>\n<div class=\"columns\">\n<div>\n<h3>Points by measure</h3>\n<table class=\"compact\">\n");
        html.Append("<thead><tr><th>measure</th><th class=\"num\">points</th><th class=\"share\"></th></tr></thead>\n<tbody>\n");
        foreach (var m in s.ByMeasure)
            html.Append(Invariant, $"<tr><td>{E(m.Measure)}</td><td class=\"num\">{m.Points}</td><td class=\"share\">{Bar(100.0 * m.Points / Math.Max(1, s.PointCount), "bar-measure")}</td></tr>\n");
        html.Append("</tbody>\n</table>\n</div>\n<div>\n<h3>Source files</h3>\n<table class=\"compact\">\n");
        html.Append("<thead><tr><th>file</th><th>sha256</th></tr></thead>\n<tbody>\n");
        foreach (var source in _data.Sources)
            html.Append(Invariant, $"<tr><td>{E(source.File)}</td><td><code class=\"hash\">{E(source.Sha256)}</code></td></tr>\n");
        html.Append("</tbody>\n</table>\n</div>\n</div>\n");

        html.Append("<h3>Cards</h3>\n<table>\n<thead><tr><th>card</th><th>counts</th><th>limits</th><th>fault codes</th><th>type</th><th class=\"num\">input</th><th class=\"num\">points</th></tr></thead>\n<tbody>\n");
        foreach (var c in _data.Cards)
            html.Append(Invariant, $"<tr><td><b>{E(c.Name)}</b></td><td>{N(c.RawLow)} .. {N(c.RawHigh)} at {N(c.SignalLow)} .. {N(c.SignalHigh)} {c.SignalUnit}</td><td>{c.LimitLow} .. {c.LimitHigh}</td><td>{E(c.FaultCodes)}</td><td>{c.RawType}</td><td class=\"num\">{N(c.InputOhms)} ohm</td><td class=\"num\">{c.Points}</td></tr>\n");
        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private void Tile(string number, string label, string? note, bool flagged = false) =>
        _html.Append(Invariant, $"<div class=\"tile{(flagged ? " flagged" : "")}\"><b>{E(number)}</b><span>{E(label)}</span>{(note is null ? "" : $"<small>{E(note)}</small>")}</div>\n");

    private void Diagnostics()
    {
        var html = _html;
        html.Append("<section id=\"diagnostics\">\n<h2>Diagnostics</h2>\n");
        if (_data.Diagnostics.IsEmpty)
        {
            html.Append("<p class=\"ok-note\">No errors and no warnings.</p>\n</section>\n");
            return;
        }
        html.Append("<table>\n<thead><tr><th></th><th>where</th><th>code</th><th>message</th></tr></thead>\n<tbody>\n");
        // A large plant can draw a warning on every point: one row at a time.
        foreach (var d in _data.Diagnostics)
        {
            html.Append("<tr><td><span class=\"badge ").Append(d.Severity).Append("\">").Append(d.Severity)
                .Append("</span></td><td class=\"where\">").AppendEncoded(d.File).Append('(').AppendInvariant(d.Line).Append(',').AppendInvariant(d.Column)
                .Append(")</td><td>").AppendEncoded(d.Code).Append("</td><td>").AppendEncoded(d.Message).Append("</td></tr>\n");
            Spill();
        }
        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private void Priorities()
    {
        var html = _html;
        var spread = _data.Priorities;
        var total = spread.ByPriority.Sum(p => p.Alarms);
        html.Append("<section id=\"priorities\">\n<h2>Alarm priority spread</h2>\n");
        html.Append(Invariant, $"<p>{total} alarm{(total == 1 ? "" : "s")}: ");
        html.Append(string.Join(", ", spread.ByPriority.Select(p => string.Create(Invariant, $"{p.Alarms} at priority {p.Priority}"))));
        html.Append(". The usual spread is about 80 % low, 15 % medium and 5 % high (ISA-18.2, EEMUA 191, from memory); priority 1 counts as high, 2 as medium, 3 and 4 as low.</p>\n");
        html.Append("<table class=\"spread\">\n<thead><tr><th>level</th><th>priorities</th><th class=\"num\">alarms</th><th class=\"num\">share</th><th class=\"num\">usual</th><th class=\"share\">this plant (bar) against usual (mark)</th></tr></thead>\n<tbody>\n");
        foreach (var share in spread.Shares)
            html.Append(Invariant, $"<tr><td>{share.Level}</td><td>{share.Priorities}</td><td class=\"num\">{share.Alarms}</td><td class=\"num\">{N1(share.Percent)} %</td><td class=\"num\">{N(share.UsualPercent)} %</td><td class=\"share\">{Bar(share.Percent, "bar-" + share.Level, share.UsualPercent)}</td></tr>\n");
        html.Append("</tbody>\n</table>\n</section>\n");
    }

    /// <summary>A horizontal bar as a div (prints with the page); an optional mark shows a target.</summary>
    private static string Bar(double percent, string cssClass, double? mark = null) =>
        $"<div class=\"bar\"><span class=\"{cssClass}\" style=\"width:{C(Math.Clamp(percent, 0, 100))}%\"></span>" +
        (mark is { } m ? $"<i style=\"left:{C(Math.Clamp(m, 0, 100))}%\"></i>" : "") + "</div>";

    private static readonly (string Part, string Color)[] LoopColors =
    {
        ("device", "#4f6fa8"), ("card input", "#9db8d9"), ("shunt", "#9db8d9"), ("barrier", "#d0a35e"), ("cable", "#86b58f"), ("extra", "#b98fc0"),
    };

    private static string LoopColor(string part)
    {
        foreach (var (name, color) in LoopColors)
            if (name == part) return color;
        return "#999999";
    }

    private const double BudgetWidth = 360, BudgetHeight = 18;

    // What every budget bar repeats, made once.
    private static readonly string BudgetOpen = $"<svg class=\"budget\" viewBox=\"0 0 {C(BudgetWidth)} {C(BudgetHeight)}\" role=\"img\" aria-label=\"needs ";
    private static readonly string NeedHeight = $"\" height=\"{C(BudgetHeight - 6)}\" fill=\"";
    private static readonly string SupplyMarkEnd = $"\" y=\"0\" width=\"2\" height=\"{C(BudgetHeight)}\" fill=\"#111\"/></svg>";

    private void Loops()
    {
        var html = _html;
        var chart = _data.Loops;
        html.Append("<section id=\"loops\">\n<h2>Loop budgets</h2>\n");
        if (chart.Loops.IsEmpty)
        {
            html.Append("<p>No point has a loop block.</p>\n</section>\n");
            return;
        }
        html.Append("<p>What each two-wire loop needs at its budget current (transmitter minimum voltage plus the drop across every series resistance), against its supply (black mark). A loop passes when the need stays left of the mark.</p>\n");
        html.Append("<p class=\"legend\">");
        foreach (var (part, color) in LoopColors.Where(c => c.Part != "shunt"))
            html.Append(Invariant, $"<span><i style=\"background:{color}\"></i>{(part == "card input" ? "card input or shunt" : part)}</span>");
        html.Append("</p>\n");
        double X(double volts) => volts / chart.ScaleVolts * BudgetWidth;
        html.Append("<table class=\"loops\">\n<thead><tr><th>point</th><th class=\"barcell\">");
        html.Append(Invariant, $"<svg class=\"axis\" viewBox=\"0 0 {C(BudgetWidth)} 14\" role=\"img\" aria-label=\"volts\">");
        for (var v = 0.0; v <= chart.ScaleVolts + 1e-9; v += 5)
            html.Append(Invariant, $"<text x=\"{C(Math.Clamp(X(v), 6, BudgetWidth - 10))}\" y=\"11\" text-anchor=\"middle\">{N(v)}{(v + 5 > chart.ScaleVolts ? " V" : "")}</text>");
        html.Append("</svg></th><th class=\"num\">needs</th><th class=\"num\">supply</th><th class=\"num\">margin</th><th class=\"num\">loop</th><th>HART</th></tr></thead>\n<tbody>\n");
        foreach (var loop in chart.Loops)
        {
            var supply = N(loop.SupplyVolts);
            html.Append(loop.Ok ? "<tr class=\"\"><td><a href=\"#" : "<tr class=\"failing\"><td><a href=\"#").Append(AnchorPrefix).Append(loop.Tag)
                .Append("\">").AppendEncoded(loop.Tag).Append("</a></td><td class=\"barcell\">");
            html.Append(BudgetOpen).AppendFixed(loop.MinSupplyVolts, 2).Append(" V of ").Append(supply).Append(" V\">");
            var at = 0.0;
            foreach (var need in loop.Needs)
            {
                html.Append("<rect x=\"").AppendFixed(X(at), 1).Append("\" y=\"3\" width=\"").AppendFixed(X(need.Volts), 1)
                    .Append(NeedHeight).Append(LoopColor(need.Part)).Append("\"><title>").AppendEncoded(need.Part).Append(": ")
                    .AppendFixed(need.Volts, 2).Append(" V");
                if (need.Ohms > 0) html.Append(" across ").AppendFixed(need.Ohms, 1).Append(" ohm");
                html.Append("</title></rect>");
                at += need.Volts;
            }
            html.Append("<rect x=\"").AppendFixed(X(loop.SupplyVolts) - 1, 1).Append(SupplyMarkEnd);
            html.Append("</td><td class=\"num\">").AppendFixed(loop.MinSupplyVolts, 2).Append(" V</td><td class=\"num\">").Append(supply)
                .Append(" V</td><td class=\"num").Append(loop.Ok ? "\">" : " bad\">").AppendFixed(loop.MarginVolts, 2)
                .Append(" V</td><td class=\"num\">").AppendFixed(loop.TotalOhms, 1).Append(" of ").AppendFixed(loop.MaxOhms, 1)
                .Append(" ohm</td><td>").Append(loop.HartOk switch { null => "", true => "window ok", false => "<b class=\"bad\">outside window</b>" })
                .Append("</td></tr>\n");
            Spill();
        }
        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private void Points()
    {
        var html = _html;
        html.Append("<section id=\"points\">\n<h2>Points</h2>\n");
        html.Append("<p>Each chart is the point's transfer curve: the value it shows for a loop current from 3 to 22 mA (from 0 mA on a signal without live zero), from the same arithmetic as the generated code (before the fault action and the filter). Shaded columns are the current bands; shaded rows are alarm deadbands between setpoint and reset; dots mark the trip currents.</p>\n");
        html.Append("<p class=\"legend\"><span><i class=\"sw-curve\"></i>value</span><span><i class=\"sw-fault\"></i>FAULT_LOW / FAULT_HIGH (value follows on-fault)</span><span><i class=\"sw-range\"></i>UNDER / OVER</span><span><i class=\"sw-card\"></i>CARD_FAULT (beyond the card's limits)</span><span><i class=\"sw-hi\"></i>HH / LL setpoint and deadband</span><span><i class=\"sw-lo\"></i>H / L setpoint and deadband</span></p>\n");
        SharedChartParts();
        html.Append("<nav class=\"toc\">");
        var first = true;
        foreach (var p in _data.Points)
        {
            if (!first) html.Append(' ');
            first = false;
            html.Append("<a href=\"#").Append(AnchorPrefix).Append(p.Tag).Append("\">").AppendEncoded(p.Tag).Append("</a>");
            Spill();
        }
        html.Append("</nav>\n");
        foreach (var point in _data.Points)
        {
            PointCard(point);
            Spill();
        }
        html.Append("</section>\n");
    }

    // The number columns (setpoint .. priority) are aligned by the style sheet rather than by
    // a class on each cell: the table repeats on every point.
    private const string AlarmTableHead =
        "<table class=\"alarms\">\n<thead><tr><th>alarm</th><th>setpoint</th><th>deadband</th><th>resets at</th><th>trip current</th><th>reset current</th><th>delay / clear</th><th>priority</th><th>text</th></tr></thead>\n<tbody>\n";

    private void PointCard(ReportPoint p)
    {
        var html = _html;
        html.Append("<section class=\"point\" id=\"").Append(AnchorPrefix).Append(p.Tag).Append("\">\n");
        html.Append("<h3><span class=\"tag\">").AppendEncoded(p.Tag).Append("</span> ").AppendEncoded(p.Description).Append("</h3>\n");
        html.Append("<div class=\"point-body\">\n");
        TransferChart(p);
        html.Append("<table class=\"facts\">\n<tbody>\n");
        // Each fact is the value's text HTML-encoded; encoding is per character, so the
        // pieces are encoded one by one (the fixed words need none, bar the quotes).
        html.Append("<tr><th>range</th><td>").Append(N(p.Lrv)).Append(" .. ").Append(N(p.Urv)).Append(' ').AppendEncoded(p.Unit);
        if (p.Lrv > p.Urv) html.Append(" (reverse acting)");
        html.Append("</td></tr>\n<tr><th>signal</th><td>").Append(N(p.SignalLowMa)).Append(" .. ").Append(N(p.SignalHighMa)).Append(" mA");
        if (p.ShuntOhms is { } shunt) html.Append(" through a ").Append(N(shunt)).Append(" ohm shunt");
        html.Append("</td></tr>\n<tr><th>card</th><td>").AppendEncoded(p.Card).Append(" at &quot;").AppendEncoded(p.Address).Append("&quot;");
        html.Append("</td></tr>\n<tr><th>square root</th><td>");
        if (p.SquareRoot) html.Append("yes, cutoff ").Append(N(p.CutoffPercent ?? 0)).Append(" % of flow");
        else html.Append("no");
        html.Append("</td></tr>\n<tr><th>health</th><td>").AppendEncoded(p.Health);
        html.Append("</td></tr>\n<tr><th>on fault</th><td>").AppendEncoded(p.OnFault);
        html.Append("</td></tr>\n<tr><th>filter</th><td>");
        if (p.FilterSeconds > 0) html.Append(N(p.FilterSeconds)).Append(" s");
        else html.Append("none");
        html.Append("</td></tr>\n<tr><th>measure</th><td>").AppendEncoded(p.Measure);
        html.Append("</td></tr>\n<tr><th>tolerance</th><td>").Append(N(p.TolerancePercent)).Append(" % of span");
        html.Append("</td></tr>\n</tbody>\n</table>\n</div>\n");
        if (p.Alarms.IsEmpty)
        {
            html.Append("<p class=\"no-alarms\">No alarms.</p>\n");
        }
        else
        {
            html.Append(AlarmTableHead);
            foreach (var a in p.Alarms)
            {
                html.Append("<tr><td><b class=\"kind ").Append(KindClass(a.Kind)).Append("\">").Append(a.Kind)
                    .Append("</b></td><td>").Append(N(a.Setpoint)).Append(' ').AppendEncoded(p.Unit)
                    .Append("</td><td>").Append(_numbers.Significant4(a.Deadband))
                    .Append("</td><td>").Append(_numbers.Significant4(a.ResetValue))
                    .Append("</td><td>").AppendFixed(a.TripMa, 2).Append(" mA");
                Raw(a.TripRaw);
                html.Append("</td><td>").AppendFixed(a.ResetMa, 2).Append(" mA");
                Raw(a.ResetRaw);
                html.Append("</td><td>").Append(N(a.DelaySeconds)).Append(" s / ").Append(N(a.ClearSeconds))
                    .Append(" s</td><td>").AppendInvariant(a.Priority).Append("</td><td>").AppendEncoded(a.Text ?? "").Append("</td></tr>\n");
            }
            html.Append("</tbody>\n</table>\n");
        }
        html.Append("</section>\n");
    }

    private void Raw(long? raw)
    {
        if (raw is { } r) _html.Append("<small> raw ").AppendInvariant(r).Append("</small>");
    }

    private static string KindClass(string kind) => kind is "HH" or "LL" ? "hi" : "lo";

    // ---- the transfer chart ------------------------------------------------------------

    private const double ChartWidth = 460, ChartHeight = 250;
    private const double PlotLeft = 58, PlotRight = 448, PlotTop = 24, PlotBottom = 214;

    // What every chart repeats, made once.
    private static readonly string ChartOpen = $"<svg class=\"curve\" viewBox=\"0 0 {C(ChartWidth)} {C(ChartHeight)}\" role=\"img\" aria-label=\"transfer curve of ";
    private static readonly string BandWidth = $"\" y=\"{C(PlotTop)}\" width=\"";
    private static readonly string BandTitle = $"\" height=\"{C(PlotBottom - PlotTop)}\"><title>";
    private static readonly string ValueGridStart = $"<path class=\"grid\" d=\"M{C(PlotLeft)} ";
    private static readonly string ValueLabel = $"H{C(PlotRight)}\"/><text class=\"ylabel\" x=\"{C(PlotLeft - 5)}\" y=\"";
    private static readonly string UnitTitle = $"<text class=\"axis-title\" x=\"{C(PlotLeft)}\" y=\"{C(PlotTop - 8)}\" text-anchor=\"start\">";
    private static readonly string DeadbandStart = $"\"><rect class=\"deadband\" x=\"{C(PlotLeft)}\" y=\"";
    private static readonly string DeadbandHeight = $"\" width=\"{C(PlotRight - PlotLeft)}\" height=\"";
    private static readonly string SetpointStart = $"\"/><line class=\"setpoint\" x1=\"{C(PlotLeft)}\" y1=\"";
    private static readonly string SetpointEnd = $"\" x2=\"{C(PlotRight)}\" y2=\"";
    private static readonly string LabelAtRight = $"<text class=\"alarm-label\" x=\"{C(PlotRight - 4)}\" y=\"";
    private static readonly string LabelAtLeft = $"<text class=\"alarm-label\" x=\"{C(PlotLeft + 4)}\" y=\"";
    private const string FrameId = "chart-frame";

    private void TransferChart(ReportPoint p)
    {
        var html = _html;
        var curve = p.Curve;
        // The value axis covers the curve and every setpoint and reset value.
        double min = double.PositiveInfinity, max = double.NegativeInfinity;
        foreach (var piece in curve.Pieces)
            foreach (var c in piece) Widen(c.Value);
        foreach (var a in p.Alarms)
        {
            Widen(a.Setpoint);
            Widen(a.ResetValue);
        }
        var (first, last, step) = TickRange(min, max);
        double lo = Tick(first, step), hi = Tick(last, step);
        double X(double ma) => PlotLeft + (ma - curve.FromMa) / (curve.ToMa - curve.FromMa) * (PlotRight - PlotLeft);
        double Y(double value) => PlotBottom - (value - lo) / (hi - lo) * (PlotBottom - PlotTop);

        html.Append(ChartOpen).AppendEncoded(p.Tag).Append("\">\n");
        foreach (var band in p.Bands)
        {
            if (band.Status == "OK") continue;
            var (x1, x2) = (X(band.FromMa), X(band.ToMa));
            html.Append("<rect class=\"band ").Append(BandClass(band.Status)).Append("\" x=\"").AppendFixed(x1, 1)
                .Append(BandWidth).AppendFixed(x2 - x1, 1).Append(BandTitle).Append(band.Status).Append(": ")
                .AppendFixed(band.FromMa, 2).Append(" .. ").AppendFixed(band.ToMa, 2).Append(" mA</title></rect>\n");
        }
        for (var k = first; k <= last; k++)
        {
            var tick = Tick(k, step);
            var at = Y(tick);
            html.Append(ValueGridStart).AppendFixed(at, 1).Append(ValueLabel)
                .AppendFixed(at + 3.5, 1).Append("\">").Append(N(tick)).Append("</text>\n");
        }
        html.Append("<use href=\"#").Append(_currentAxes[(curve.FromMa, curve.ToMa)]).Append("\"/>\n");
        html.Append(UnitTitle).AppendEncoded(p.Unit).Append("</text>\n");
        foreach (var a in p.Alarms)
        {
            var (top, bottom) = (Y(Math.Max(a.Setpoint, a.ResetValue)), Y(Math.Min(a.Setpoint, a.ResetValue)));
            var setpointAt = Y(a.Setpoint);
            // One line per alarm: moving a setpoint changes this line (and the alarm table's row) only.
            html.Append("<g class=\"alarm ").Append(KindClass(a.Kind)).Append(DeadbandStart).AppendFixed(top, 1)
                .Append(DeadbandHeight).AppendFixed(Math.Max(bottom - top, 0), 1)
                .Append(SetpointStart).AppendFixed(setpointAt, 1).Append(SetpointEnd).AppendFixed(setpointAt, 1).Append("\"/>");
            if (a.TripMa >= curve.FromMa && a.TripMa <= curve.ToMa)
                html.Append("<circle cx=\"").AppendFixed(X(a.TripMa), 1).Append("\" cy=\"").AppendFixed(setpointAt, 1).Append("\" r=\"3.2\"/>");
            var labelAtRight = a.Kind is "HH" or "LL";
            html.Append(labelAtRight ? LabelAtRight : LabelAtLeft).AppendFixed(setpointAt - 4, 1)
                .Append(labelAtRight ? "\" text-anchor=\"end\">" : "\" text-anchor=\"start\">")
                .Append(a.Kind).Append(' ').Append(N(a.Setpoint)).Append("</text></g>\n");
        }
        foreach (var piece in curve.Pieces)
        {
            html.Append("<polyline class=\"transfer\" points=\"");
            for (var i = 0; i < piece.Length; i++)
            {
                if (i > 0) html.Append(' ');
                var c = piece[i];
                html.AppendFixed(X(c.Ma), 1).Append(',').AppendFixed(Y(Math.Clamp(c.Value, lo, hi)), 1);
            }
            html.Append("\"/>\n");
        }
        html.Append("<use href=\"#" + FrameId + "\"/>\n</svg>\n");

        void Widen(double value)
        {
            if (value < min) min = value;
            if (value > max) max = value;
        }
    }

    /// <summary>
    /// The parts every chart draws alike, once for the page: the frame, and per span of
    /// current the axis below the plot (a grid line and label every 4 mA, and its title).
    /// They carry their style inline (see <see cref="ChartText"/>).
    /// </summary>
    private void SharedChartParts()
    {
        var html = _html;
        html.Append("<svg class=\"curve chart-parts\" aria-hidden=\"true\">\n<defs>\n");
        html.Append(Invariant, $"<rect id=\"{FrameId}\" x=\"{C(PlotLeft)}\" y=\"{C(PlotTop)}\" width=\"{C(PlotRight - PlotLeft)}\" height=\"{C(PlotBottom - PlotTop)}\" style=\"{FrameLine}\"/>\n");
        foreach (var point in _data.Points)
        {
            var (fromMa, toMa) = (point.Curve.FromMa, point.Curve.ToMa);
            if (_currentAxes.ContainsKey((fromMa, toMa))) continue;
            var id = "chart-current-axis-" + (_currentAxes.Count + 1).ToString(CultureInfo.InvariantCulture);
            _currentAxes.Add((fromMa, toMa), id);
            html.Append(Invariant, $"<g id=\"{id}\" style=\"{ChartText}; text-anchor: middle\">\n");
            double X(double ma) => PlotLeft + (ma - fromMa) / (toMa - fromMa) * (PlotRight - PlotLeft);
            for (var ma = Math.Ceiling(fromMa / 4) * 4; ma <= toMa; ma += 4)
                html.Append(Invariant, $"<path d=\"M{C(X(ma))} {C(PlotTop)}V{C(PlotBottom)}\" style=\"fill: none; {GridLine}\"/><text x=\"{C(X(ma))}\" y=\"{C(PlotBottom + 14)}\">{N(ma)}</text>\n");
            html.Append(Invariant, $"<text x=\"{C(PlotRight)}\" y=\"{C(PlotBottom + 30)}\" style=\"{AxisTitleText}; text-anchor: end\">loop current, mA</text>\n</g>\n");
        }
        html.Append("</defs>\n</svg>\n");
    }

    private static string BandClass(string status) => status switch
    {
        "FAULT_LOW" or "FAULT_HIGH" => "fault",
        "CARD_FAULT" => "card",
        _ => "range",
    };

    /// <summary>
    /// Round ticks (1, 2, 2.5 or 5 times a power of ten) that cover min .. max with as little
    /// empty space as possible, at most nine of them.
    /// </summary>
    public static IReadOnlyList<double> NiceTicks(double min, double max)
    {
        var (first, last, step) = TickRange(min, max);
        var ticks = new List<double>();
        for (var k = first; k <= last; k++) ticks.Add(Tick(k, step));
        return ticks;
    }

    private static readonly double[] TickMultiples = { 1.0, 2, 2.5, 5 };

    /// <summary>The ticks of <see cref="NiceTicks"/> as k * step for k = first .. last, without a list.</summary>
    private static (double First, double Last, double Step) TickRange(double min, double max)
    {
        if (max - min <= 0) { min -= 1; max += 1; }
        var power = Math.Pow(10, Math.Floor(Math.Log10((max - min) / 5)));
        (double First, double Last, double Step)? best = null;
        for (var s = 0; s < 3; s++)
        {
            var scale = s == 0 ? power / 10 : s == 1 ? power : power * 10;
            foreach (var multiple in TickMultiples)
            {
                var step = multiple * scale;
                var first = Math.Floor(min / step + 1e-9);
                var last = Math.Ceiling(max / step - 1e-9);
                if (last - first + 1 > 9) continue;
                var span = (last - first) * step;
                if (best is not { } b || span < (b.Last - b.First) * b.Step - 1e-9 * span)
                    best = (first, last, step);
            }
        }
        return best!.Value;
    }

    private static double Tick(double k, double step) => Math.Round(k * step, 10);

    private void Cautions()
    {
        var html = _html;
        html.Append("<section id=\"cautions\" class=\"cautions\">\n<h2>Cautions</h2>\n<ul>\n");
        foreach (var caution in _data.Cautions) html.Append(Invariant, $"<li>{E(caution)}</li>\n");
        html.Append("</ul>\n</section>\n");
    }

    // ---- small helpers -------------------------------------------------------------------

    /// <summary>Counts and limits in the page never follow the culture (some write a minus sign other than '-').</summary>
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    private static string E(string text) => WebUtility.HtmlEncode(text);

    /// <summary>Ids of points are "pt-" and the tag: tags are [A-Za-z][A-Za-z0-9_-]*, already safe in an id.</summary>
    private const string AnchorPrefix = "pt-";

    private string N(double value) => _numbers.Exact(value);
    private static string N1(double value) => DisplayNumbers.Fixed(value, 1);

    /// <summary>An SVG coordinate: one decimal is finer than any printer dot at this size.</summary>
    private static string C(double value) => DisplayNumbers.Fixed(value, 1);

    // The look of the chart parts drawn through <use>. A browser may keep the page's style
    // sheet out of what a <use> draws (Chromium does), so those parts carry their style
    // inline, from the same text as the rules the per-chart parts get.
    private const string ChartText = "font-size: 10.5px; fill: var(--muted)";
    private const string AxisTitleText = "font-size: 11px; fill: var(--ink)";
    private const string GridLine = "stroke: #e6e9ee; stroke-width: 1";
    private const string FrameLine = "fill: none; stroke: #9aa3b0; stroke-width: 1";

    private const string Style = $$"""
        :root { --ink: #1c2230; --muted: #5b6474; --rule: #d5dae2; --accent: #1f4e9c; --bad: #b3261e; --warn: #b85c00; --hi: #b3261e; --lo: #cc7a00; }
        * { box-sizing: border-box; }
        body { font: 14px/1.45 "Segoe UI", Roboto, "Helvetica Neue", Arial, "DejaVu Sans", sans-serif; color: var(--ink); margin: 0 auto; max-width: 1020px; padding: 28px 32px 48px; background: #fff; }
        h1 { font-size: 28px; margin: 0 0 4px; letter-spacing: -0.01em; }
        h2 { font-size: 19px; margin: 34px 0 10px; padding-bottom: 4px; border-bottom: 2px solid var(--accent); break-after: avoid; page-break-after: avoid; }
        h3 { font-size: 15px; margin: 16px 0 6px; }
        p { margin: 6px 0 10px; }
        .kicker { margin: 0; text-transform: uppercase; letter-spacing: 0.12em; font-size: 12px; color: var(--accent); font-weight: 600; }
        .meta { color: var(--muted); margin-top: 0; }
        .caution { border-left: 4px solid var(--warn); background: #fff6e6; padding: 10px 14px; margin: 16px 0; }
        table { border-collapse: collapse; width: 100%; }
        th, td { text-align: left; padding: 4px 8px; border-bottom: 1px solid var(--rule); vertical-align: top; }
        thead th { font-weight: 600; color: var(--muted); font-size: 12px; border-bottom: 1.5px solid #aeb6c2; }
        .num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
        td small { color: var(--muted); }
        code.hash { font-size: 11px; word-break: break-all; color: var(--muted); }
        .tiles { display: grid; grid-template-columns: repeat(4, 1fr); gap: 12px; margin: 8px 0 6px; }
        .tile { border: 1px solid var(--rule); border-radius: 6px; padding: 10px 14px; }
        .tile b { display: block; font-size: 26px; line-height: 1.1; }
        .tile span { color: var(--muted); }
        .tile small { display: block; color: var(--muted); }
        .tile.flagged { border-color: var(--warn); background: #fff6e6; }
        .columns { display: grid; grid-template-columns: 1fr 1.4fr; gap: 24px; }
        .share { width: 42%; }
        .bar { position: relative; height: 12px; background: #eef1f5; border-radius: 2px; }
        .bar span { position: absolute; left: 0; top: 0; bottom: 0; border-radius: 2px; }
        .bar i { position: absolute; top: -3px; bottom: -3px; width: 2px; margin-left: -1px; background: #111; }
        .bar-measure { background: #7f9cc8; }
        .bar-high { background: var(--hi); }
        .bar-medium { background: var(--lo); }
        .bar-low { background: #7f9cc8; }
        .badge { display: inline-block; padding: 0 6px; border-radius: 3px; font-size: 12px; font-weight: 600; color: #fff; }
        .badge.error { background: var(--bad); }
        .badge.warning { background: var(--warn); }
        .where { white-space: nowrap; font-family: ui-monospace, "DejaVu Sans Mono", Consolas, monospace; font-size: 12px; }
        .ok-note { color: #2c6e3f; font-weight: 600; }
        .bad { color: var(--bad); }
        .legend { font-size: 12px; color: var(--muted); }
        .legend span { display: inline-block; margin-right: 14px; white-space: nowrap; }
        .legend i { display: inline-block; width: 14px; height: 10px; margin-right: 5px; vertical-align: -1px; border: 1px solid rgba(0,0,0,0.15); }
        .legend i.sw-curve { height: 3px; vertical-align: 2px; background: var(--accent); border: 0; }
        .legend i.sw-fault { background: #f4d4d2; }
        .legend i.sw-range { background: #fbeccf; }
        .legend i.sw-card { background: #dcdfe4; }
        .legend i.sw-hi { background: rgba(179, 38, 30, 0.22); border-top: 2px dashed var(--hi); }
        .legend i.sw-lo { background: rgba(204, 122, 0, 0.22); border-top: 2px dashed var(--lo); }
        table.loops td, table.loops th { padding: 3px 8px; }
        table.loops td:first-child, table.loops td:last-child { white-space: nowrap; }
        .barcell { width: 380px; }
        svg.axis { width: 100%; height: auto; display: block; }
        svg.axis text { font-size: 10px; fill: var(--muted); }
        svg.budget { width: 100%; height: auto; display: block; background: #f3f5f8; }
        tr.failing td { background: #fbe9e8; }
        nav.toc { font-size: 12px; line-height: 1.9; margin: 6px 0 10px; }
        nav.toc a { display: inline-block; padding: 0 6px; margin: 0 2px 2px 0; border: 1px solid var(--rule); border-radius: 3px; text-decoration: none; color: var(--accent); }
        a { color: var(--accent); }
        .point { border: 1px solid var(--rule); border-radius: 6px; padding: 10px 14px 12px; margin: 14px 0; break-inside: avoid; page-break-inside: avoid; }
        .point h3 { margin: 0 0 6px; font-weight: 500; }
        .point h3 .tag { font-weight: 700; margin-right: 6px; }
        .point-body { display: grid; grid-template-columns: minmax(0, 460px) 1fr; gap: 16px; align-items: start; }
        .facts th { width: 84px; color: var(--muted); font-weight: 500; font-size: 12px; }
        .facts td, .facts th { padding: 2px 6px; vertical-align: baseline; }
        table.alarms { margin-top: 8px; font-size: 13px; }
        table.alarms th:nth-child(n+2):nth-child(-n+8), table.alarms td:nth-child(n+2):nth-child(-n+8) { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
        .kind.hi { color: var(--hi); }
        .kind.lo { color: var(--lo); }
        .no-alarms { color: var(--muted); font-size: 13px; }
        svg.curve { width: 100%; height: auto; display: block; }
        svg.curve.chart-parts { position: absolute; width: 0; height: 0; overflow: hidden; }
        svg.curve text { {{ChartText}}; }
        svg.curve .ylabel { text-anchor: end; }
        svg.curve .axis-title { {{AxisTitleText}}; }
        svg.curve .grid { {{GridLine}}; }
        svg.curve .band.fault { fill: #f4d4d2; }
        svg.curve .band.range { fill: #fbeccf; }
        svg.curve .band.card { fill: #dcdfe4; }
        svg.curve .transfer { fill: none; stroke: var(--accent); stroke-width: 2.2; stroke-linejoin: round; }
        svg.curve .alarm.hi { --c: var(--hi); }
        svg.curve .alarm.lo { --c: var(--lo); }
        svg.curve .deadband { fill: var(--c); fill-opacity: 0.16; }
        svg.curve .setpoint { stroke: var(--c); stroke-width: 1.3; stroke-dasharray: 5 3; }
        svg.curve .alarm circle { fill: var(--c); stroke: #fff; stroke-width: 1; }
        svg.curve .alarm-label { font-size: 10.5px; font-weight: 700; fill: var(--c); paint-order: stroke; stroke: #fff; stroke-width: 3px; stroke-linejoin: round; }
        .cautions ul { padding-left: 18px; }
        .cautions li { margin: 4px 0; }
        @media print {
          @page { size: A4; margin: 12mm; }
          * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
          body { max-width: none; padding: 0; font-size: 10pt; }
          h2 { margin-top: 20px; }
          nav.toc { display: none; }
          a { color: inherit; text-decoration: none; }
          .point { margin: 8px 0; padding: 8px 10px; }
          .point-body { grid-template-columns: 58% 1fr; gap: 10px; }
          table.alarms { font-size: 8.5pt; }
          table.alarms td small { display: block; }
          table.alarms td:last-child { min-width: 30%; }
          .facts th { width: 70px; }
          tr, #priorities { break-inside: avoid; page-break-inside: avoid; }
          #points { break-before: page; page-break-before: always; }
        }
        @media screen and (max-width: 760px) {
          .point-body, .columns { grid-template-columns: 1fr; }
          .tiles { grid-template-columns: repeat(2, 1fr); }
        }

        """;
}
