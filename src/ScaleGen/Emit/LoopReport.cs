using System.Globalization;
using System.Text;
using Newtonsoft.Json;
using Newtonsoft.Json.Linq;
using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Emit;

/// <summary>
/// One row of the loop budget: a point with a <c>loop</c> block, its budget from
/// <see cref="LoopBudget"/>, and the cable data the budget was worked out from.
/// </summary>
/// <param name="OhmPerKm">Resistance of one conductor per km (IEC 60228 class 1/2 for mm2, ASTM B258 with annealed copper for AWG); null without a cable.</param>
/// <param name="UpscaleMinSupplyVolts">Supply needed to drive the upscale failure current; null when the point has none.</param>
public sealed record LoopRow(
    Point Point,
    LoopBudgetResult Budget,
    double? CableMetres,
    Conductor? Conductor,
    double? OhmPerKm,
    double? UpscaleMinSupplyVolts)
{
    /// <summary>"ok", "LOW" or "HIGH" against the HART window; "-" when the loop does not use HART.</summary>
    public string HartText => Budget.HartOk switch
    {
        null => "-",
        true => "ok",
        false => Budget.TotalOhms < LoopBudget.HartMinOhms ? "LOW" : "HIGH",
    };

    public string UpscaleText => Budget.UpscaleFaultMa is { } fault
        ? $"{FieldText.Percent(fault)} mA {(Budget.UpscaleFaultOk == true ? "ok" : "NO")}"
        : "-";

    public string ResultText => Budget.Ok ? "OK" : "FAIL";
}

/// <summary>
/// The loop power budget as a table and as JSON. The `loop` command and the "loop" output
/// of `build` both call these, so the two always agree.
/// </summary>
public static class LoopReport
{
    /// <summary>Every point with a loop block, in plant order.</summary>
    public static IReadOnlyList<LoopRow> Rows(Plant plant)
    {
        var rows = new List<LoopRow>();
        foreach (var point in plant.Points)
        {
            if (LoopBudget.Evaluate(point) is not { } budget) continue;
            var loop = point.Loop!;
            var hasCable = loop.CableLengthMetres is not null && loop.Conductor is not null;
            double? upscaleSupply = budget.UpscaleFaultMa is { } fault
                ? LoopBudget.MinSupplyVolts(budget.DeviceVolts, fault, budget.TotalOhms)
                : null;
            rows.Add(new LoopRow(point, budget,
                hasCable ? loop.CableLengthMetres : null,
                hasCable ? loop.Conductor : null,
                hasCable ? ConductorResistance.OhmPerKm(loop.Conductor!) : null,
                upscaleSupply));
        }
        return rows;
    }

    /// <summary>True when every loop's supply covers its resistance (HART and upscale findings do not count).</summary>
    public static bool AllOk(IEnumerable<LoopRow> rows) => rows.All(r => r.Budget.Ok);

    /// <summary>How the numbers were worked out, printed under the table.</summary>
    public static readonly IReadOnlyList<string> Legend =
    [
        "max = (supply - device) / current; min supply = device + current * total; margin = supply - min supply.",
        "total = card input (current card) + shunt (voltage card) + barrier + cable (both conductors) + extra.",
        "Cable: mm2 sizes use the IEC 60228 class 1/2 (solid or stranded) maximum resistance of plain copper at 20 degC;",
        "AWG sizes use the ASTM B258 diameter d = 0.127 mm * 92^((36 - n) / 39) with annealed copper (IACS, 1.7241e-8 ohm m).",
        $"HART: total loop resistance {FieldText.Percent(LoopBudget.HartMinOhms)} .. {FieldText.Percent(LoopBudget.HartMaxOhms)} ohm. Upscale: can the loop still drive the upscale failure current of the point's health bands.",
    ];

    /// <summary>The aligned table with its legend and caution.</summary>
    public static string Table(IReadOnlyList<LoopRow> rows) => TextChunks.Render(output => Table(output, rows));

    /// <summary>The same table, streamed.</summary>
    public static void Table(TextWriter output, IReadOnlyList<LoopRow> rows)
    {
        var builder = new StringBuilder();
        if (rows.Count == 0)
        {
            builder.Append("No point has a loop block: there is no loop budget to judge.\n");
        }
        else
        {
            // Two header lines: what each column is, then its unit.
            string[] headers =
            [
                "point", "supply", "device", "current", "card", "shunt", "barrier", "cable run",
                "cable", "extra", "total", "max", "min supply", "margin", "HART", "upscale", "result",
            ];
            string[] units =
            [
                "", "V", "V", "mA", "ohm", "ohm", "ohm", "one way", "ohm", "ohm", "ohm", "ohm", "V", "V", "", "fault", "",
            ];
            var lines = rows.Select(r => new[]
            {
                r.Point.Tag,
                FieldText.SupplyVolts(r.Budget.SupplyVolts),
                FieldText.SupplyVolts(r.Budget.DeviceVolts),
                FieldText.SupplyVolts(r.Budget.CurrentMa),
                r.Point.Card.IsVoltage ? "-" : FieldText.Ohms(r.Budget.CardOhms),
                r.Point.Card.IsVoltage ? FieldText.Ohms(r.Budget.ShuntOhms) : "-",
                FieldText.Ohms(r.Budget.BarrierOhms),
                CableText(r),
                r.CableMetres is null ? "-" : FieldText.Ohms(r.Budget.CableOhms),
                FieldText.Ohms(r.Budget.ExtraOhms),
                FieldText.Ohms(r.Budget.TotalOhms),
                FieldText.Ohms(r.Budget.MaxOhms),
                FieldText.SupplyVolts(r.Budget.MinSupplyVolts),
                FieldText.SupplyVolts(r.Budget.MarginVolts),
                r.HartText,
                r.UpscaleText,
                r.ResultText,
            }).ToList();
            // Text columns (tag, cable, findings) align left, numbers right.
            var leftAligned = new HashSet<int> { 0, 7, 14, 15, 16 };
            var widths = headers.Select((h, i) => Math.Max(Math.Max(h.Length, units[i].Length), lines.Max(l => l[i].Length))).ToArray();
            string Line(string[] cells) => string.Join("  ", cells.Select((c, i) =>
                leftAligned.Contains(i) ? c.PadRight(widths[i]) : c.PadLeft(widths[i]))).TrimEnd();
            builder.Append(Line(headers)).Append('\n').Append(Line(units)).Append('\n');
            foreach (var line in lines)
            {
                builder.Append(Line(line)).Append('\n');
                TextChunks.Spill(builder, output);
            }

            var failed = rows.Count(r => !r.Budget.Ok);
            var hart = rows.Count(r => r.Budget.HartOk == false);
            var upscale = rows.Count(r => r.Budget.UpscaleFaultOk == false);
            builder.Append('\n')
                .Append(CultureInfo.InvariantCulture, $"{rows.Count} loop{(rows.Count == 1 ? "" : "s")}: {rows.Count - failed} OK, {failed} FAIL")
                .Append(CultureInfo.InvariantCulture, $"; {hart} outside the HART window; {upscale} cannot drive the upscale failure current.\n");
            builder.Append('\n');
            foreach (var line in Legend) builder.Append(line).Append('\n');
        }
        builder.Append('\n');
        foreach (var line in FieldText.CautionLines(FieldText.LoopCaution)) builder.Append(line).Append('\n');
        TextChunks.Spill(builder, output, all: true);
    }

    private static string CableText(LoopRow row) =>
        row.CableMetres is { } metres && row.Conductor is { } conductor
            ? $"{metres.ToString("0.###", CultureInfo.InvariantCulture)} m {conductor}"
            : "-";

    /// <summary>
    /// <c>{ "loops": [...], "ok": bool }</c> as cli.md says, with extra fields for each
    /// series resistance, the cable and the upscale check; <paramref name="generated"/>
    /// (for a generated file) goes first.
    /// </summary>
    public static JObject Json(IReadOnlyList<LoopRow> rows, JObject? generated = null)
    {
        var document = Document(rows, generated);
        document["loops"] = JsonOutput.Array(rows, WriteRow);
        return document;
    }

    /// <summary>The same JSON, streamed row by row.</summary>
    public static void Json(TextWriter output, IReadOnlyList<LoopRow> rows, JObject? generated = null) =>
        JsonOutput.Write(output, Document(rows, generated), "loops", rows, WriteRow);

    private static JObject Document(IReadOnlyList<LoopRow> rows, JObject? generated)
    {
        var document = new JObject();
        if (generated is not null) document["generated"] = generated;
        document["loops"] = new JArray();
        document["ok"] = AllOk(rows);
        document["caution"] = string.Join(" ", FieldText.LoopCaution);
        return document;
    }

    private static void WriteRow(JsonWriter w, LoopRow row)
    {
        var b = row.Budget;
        w.WriteStartObject();
        w.Field("point", row.Point.Tag);
        w.NumberField("supply_v", b.SupplyVolts);
        w.NumberField("device_v", b.DeviceVolts);
        w.NumberField("current_ma", b.CurrentMa);
        w.NumberField("card_ohm", b.CardOhms);
        w.NumberField("shunt_ohm", b.ShuntOhms);
        w.NumberField("barrier_ohm", b.BarrierOhms);
        w.NumberField("cable_m", row.CableMetres);
        w.Field("conductor", row.Conductor?.ToString());
        w.NumberField("conductor_ohm_per_km", row.OhmPerKm);
        w.NumberField("cable_ohm", b.CableOhms);
        w.NumberField("extra_ohm", b.ExtraOhms);
        w.NumberField("total_ohm", b.TotalOhms);
        w.NumberField("max_ohm", b.MaxOhms);
        w.NumberField("min_supply_v", b.MinSupplyVolts);
        w.NumberField("margin_v", b.MarginVolts);
        w.Field("hart", b.HartOk is not null);
        w.Field("hart_ok", b.HartOk);
        w.NumberField("upscale_fault_ma", b.UpscaleFaultMa);
        w.NumberField("upscale_min_supply_v", row.UpscaleMinSupplyVolts);
        w.Field("upscale_ok", b.UpscaleFaultOk);
        w.Field("ok", b.Ok);
        w.WriteEndObject();
    }
}
