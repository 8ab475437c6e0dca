using System.Globalization;
using System.Text;
using Newtonsoft.Json;
using Newtonsoft.Json.Linq;
using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Emit;

/// <summary>
/// Commissioning check sheets as JSON, CSV and a plain-text summary (the HTML page is
/// <see cref="SheetsHtml"/>). The numbers all come from <see cref="CheckSheets"/>; the words
/// that describe a point and its tests are here, once, for every format.
/// </summary>
public static class SheetsReport
{
    // ---- words shared by every format ---------------------------------------------------

    public static string SignalText(Point point) =>
        $"{FieldText.Percent(point.SignalLowMa)} .. {FieldText.Percent(point.SignalHighMa)} mA";

    public static string RangeText(Point point) =>
        $"{FieldText.Value(point.Lrv)} .. {FieldText.Value(point.Urv)} {point.Unit}{(point.IsReverse ? " (reverse acting)" : "")}";

    public static string ExtractionText(Point point) =>
        point.SquareRoot ? $"square root, cutoff {FieldText.Percent(point.CutoffPercent)} % of flow" : "linear";

    public static string HealthText(Point point) => point.Health switch
    {
        { Kind: HealthKind.None } => "no fault bands",
        { FaultLowMa: var low, FaultHighMa: var high } =>
            $"{(point.Health.Kind == HealthKind.Ne43 ? "NAMUR NE 43" : "own bands")}: fault at "
            + string.Join(" or ", new[]
            {
                low is { } l ? $"<= {FieldText.Percent(l)} mA" : null,
                high is { } h ? $">= {FieldText.Percent(h)} mA" : null,
            }.Where(s => s is not null)),
    };

    public static string OnFaultText(Point point) => point.OnFault.Kind switch
    {
        FaultActionKind.Low => $"shows {FieldText.Value(point.ValueMin)} {point.Unit} (low end)",
        FaultActionKind.High => $"shows {FieldText.Value(point.ValueMax)} {point.Unit} (high end)",
        FaultActionKind.Value => $"shows {FieldText.Value(point.OnFault.Value)} {point.Unit}",
        _ => "holds the last good value",
    };

    /// <summary>Where the volts column is measured.</summary>
    public static string VoltsWhere(Point point) =>
        point.Card.IsVoltage
            ? $"across the {FieldText.Percent(point.ShuntOhms ?? 0)} ohm shunt"
            : SignalPath.TerminalOhms(point) is { } ohms ? $"across the {FieldText.Percent(ohms)} ohm card input" : "not measurable (card input 0 ohm)";

    public static string ToleranceText(PointSheet sheet) =>
        $"{FieldText.Percent(sheet.Point.TolerancePercent)} % of span = +/- {FieldText.Value(sheet.Tolerance)} {sheet.Point.Unit}";

    public const string SqrtStepNote = "steps are % of the differential-pressure signal; the value is the extracted flow";

    /// <summary>The value a band test must show, in the point's unit (the unit is in the column header).</summary>
    public static string ShowsText(FaultTest test) =>
        test.HoldsLastGood ? "holds last good value" : FieldText.Value(test.Value ?? 0);

    public static string DelayText(Alarm alarm)
    {
        var parts = new List<string>();
        if (alarm.OnDelaySeconds > 0) parts.Add($"on-delay {FieldText.Percent(alarm.OnDelaySeconds)} s");
        if (alarm.OffDelaySeconds > 0) parts.Add($"off-delay {FieldText.Percent(alarm.OffDelaySeconds)} s");
        return string.Join(", ", parts);
    }

    public static string TripHowText(TripTest trip)
    {
        var how = trip.CurrentRisesToTrip
            ? "raise the current slowly until it trips, then lower it until it resets"
            : "lower the current slowly until it trips, then raise it until it resets";
        var delay = DelayText(trip.Alarm);
        return delay.Length == 0 ? how : $"{how} ({delay}: hold each current that long)";
    }

    public static string SignOffText => "technician ____________  date __________  witness ____________";

    // ---- JSON ---------------------------------------------------------------------------

    /// <summary>
    /// <c>{ "points": [ { "point", "unit", "steps", "trips", ... } ] }</c> as cli.md says, with
    /// extra fields (fault tests, raw counts, volts, descriptions); <paramref name="generated"/>
    /// (for a generated file) goes first.
    /// </summary>
    public static JObject Json(IReadOnlyList<PointSheet> sheets, JObject? generated = null)
    {
        var document = Document(generated);
        document["points"] = JsonOutput.Array(sheets, WritePoint);
        return document;
    }

    /// <summary>The same JSON, streamed point by point.</summary>
    public static void Json(TextWriter output, IReadOnlyList<PointSheet> sheets, JObject? generated = null) =>
        JsonOutput.Write(output, Document(generated), "points", sheets, WritePoint);

    private static JObject Document(JObject? generated)
    {
        var document = new JObject();
        if (generated is not null) document["generated"] = generated;
        document["caution"] = string.Join(" ", FieldText.SheetCaution);
        document["points"] = new JArray();
        return document;
    }

    private static void WritePoint(JsonText w, PointSheet sheet)
    {
        var point = sheet.Point;
        w.StartObject();
        w.Field("point", point.Tag);
        w.Field("description", point.Description);
        w.Field("card", point.Card.Name);
        w.Field("address", point.Address);
        w.Field("unit", point.Unit);
        w.NumberField("lrv", point.Lrv);
        w.NumberField("urv", point.Urv);
        w.NumberField("signal_low_ma", point.SignalLowMa);
        w.NumberField("signal_high_ma", point.SignalHighMa);
        w.Field("sqrt", point.SquareRoot);
        w.NumberField("tolerance_percent", point.TolerancePercent);
        w.Name("steps");
        w.StartArray();
        foreach (var s in sheet.Steps)
        {
            w.StartObject();
            w.NumberField("percent", s.Percent);
            w.NumberField("ma", s.Ma);
            w.NumberField("volts", s.Volts);
            w.Field("raw", s.Raw);
            w.NumberField("value", s.Value);
            w.NumberField("tolerance", s.Tolerance);
            w.EndObject();
        }
        w.EndArray();
        w.Name("fault_tests");
        w.StartArray();
        foreach (var f in sheet.FaultTests)
        {
            w.StartObject();
            w.Field("status", StatusText(f.Status));
            w.NumberField("ma", f.Ma);
            w.NumberField("volts", f.Volts);
            w.Field("raw", f.Raw);
            w.NumberField("value", f.Value);
            w.Field("holds_last_good", f.HoldsLastGood);
            w.EndObject();
        }
        w.EndArray();
        w.Name("untestable");
        w.StartArray();
        foreach (var u in sheet.Untestable)
        {
            w.StartObject();
            w.Field("status", StatusText(u.Status));
            w.Field("reason", u.Reason);
            w.EndObject();
        }
        w.EndArray();
        w.Name("trips");
        w.StartArray();
        foreach (var t in sheet.Trips)
        {
            w.StartObject();
            w.Field("alarm", AlarmText(t.Alarm.Kind));
            w.NumberField("setpoint", t.Setpoint);
            w.NumberField("trip_ma", t.TripMa);
            w.NumberField("reset_ma", t.ResetMa);
            w.NumberField("reset_value", t.ResetValue);
            w.NumberField("trip_volts", t.TripVolts);
            w.NumberField("reset_volts", t.ResetVolts);
            w.Field("trip_raw", t.TripRaw);
            w.Field("reset_raw", t.ResetRaw);
            w.Field("current_rises_to_trip", t.CurrentRisesToTrip);
            w.NumberField("on_delay_s", t.Alarm.OnDelaySeconds);
            w.NumberField("off_delay_s", t.Alarm.OffDelaySeconds);
            w.EndObject();
        }
        w.EndArray();
        w.EndObject();
    }

    // ---- CSV ----------------------------------------------------------------------------

    private static readonly string[] CsvHeader =
    [
        "point", "description", "address", "test", "percent", "ma", "volts", "raw",
        "expected_value", "unit", "tolerance", "expected_status", "as_found", "as_left", "notes",
    ];

    /// <summary>
    /// One row per test (steps, band tests, alarm trip and reset) and a sign-off row per
    /// point; as_found and as_left are left blank for the technician. The header lines come
    /// first as '#' comments.
    /// </summary>
    public static string Csv(IReadOnlyList<PointSheet> sheets, IEnumerable<string> commentLines) =>
        TextChunks.Render(output => Csv(output, sheets, commentLines));

    /// <summary>The same CSV, streamed.</summary>
    public static void Csv(TextWriter output, IReadOnlyList<PointSheet> sheets, IEnumerable<string> commentLines)
    {
        var text = new StringBuilder();
        foreach (var line in commentLines) CsvText.AppendComment(text, " " + line);
        for (var i = 0; i < CsvHeader.Length; i++)
            CsvText.AppendField(i == 0 ? text : text.Append(','), CsvHeader[i]);
        text.Append('\n');
        foreach (var sheet in sheets)
        {
            WriteCsvPoint(text, sheet);
            TextChunks.Spill(text, output);
        }
        TextChunks.Spill(text, output, all: true);
    }

    private static void WriteCsvPoint(StringBuilder text, PointSheet sheet)
    {
        // Appended field by field rather than as a row of strings: a check sheet of 50,000
        // points has ten million fields. Free text goes through CsvText's quoting; numbers
        // (digits, '.', '-') and the fixed words never need quotes and go in as they are.
        var point = sheet.Point;
        var start = CsvText.Field(point.Tag) + "," + CsvText.Field(point.Description) + "," + CsvText.Field(point.Address) + ",";
        var unit = CsvText.Field(point.Unit);

        // point, description, address, test, percent, ma, volts, raw, expected_value, unit,
        // tolerance, expected_status, as_found, as_left, notes
        var stepNote = point.SquareRoot ? SqrtStepNote : "";
        foreach (var step in sheet.Steps)
        {
            text.Append(start).Append("step,");
            FieldText.AppendPercent(text, step.Percent).Append(',');
            FieldText.AppendMa(text, step.Ma).Append(',');
            AppendCsvVolts(text, step.Volts).Append(',');
            FieldText.AppendRaw(text, step.Raw).Append(',');
            FieldText.AppendValue(text, step.Value).Append(',').Append(unit).Append(',');
            FieldText.AppendValue(text, step.Tolerance).Append(',').Append(OkText).Append(",,,");
            CsvText.AppendField(text, stepNote).Append('\n');
        }
        foreach (var (status, test, untestable) in sheet.Bands)
        {
            text.Append(start).Append("band,,");
            if (test is not null)
            {
                FieldText.AppendMa(text, test.Ma).Append(',');
                AppendCsvVolts(text, test.Volts).Append(',');
                FieldText.AppendRaw(text, test.Raw).Append(',');
                if (!test.HoldsLastGood) FieldText.AppendValue(text, test.Value ?? 0);
                text.Append(',').Append(unit).Append(",,").Append(StatusText(status)).Append(",,,");
                CsvText.AppendField(text, test.HoldsLastGood ? "value holds the last good value" : "");
            }
            else
            {
                text.Append(",,,,").Append(unit).Append(",,").Append(StatusText(status)).Append(",,,");
                CsvText.AppendField(text, "not testable: " + untestable!.Reason);
            }
            text.Append('\n');
        }
        foreach (var trip in sheet.Trips)
        {
            var words = AlarmWords[(int)trip.Alarm.Kind];
            text.Append(start).Append(words.Trip).Append(",,");
            FieldText.AppendMa(text, trip.TripMa).Append(',');
            AppendCsvVolts(text, trip.TripVolts).Append(',');
            FieldText.AppendRaw(text, trip.TripRaw).Append(',');
            FieldText.AppendValue(text, trip.Setpoint).Append(',').Append(unit).Append(",,").Append(words.Active).Append(",,,");
            CsvText.AppendField(text, TripHowText(trip)).Append('\n');

            text.Append(start).Append(words.Reset).Append(",,");
            FieldText.AppendMa(text, trip.ResetMa).Append(',');
            AppendCsvVolts(text, trip.ResetVolts).Append(',');
            FieldText.AppendRaw(text, trip.ResetRaw).Append(',');
            FieldText.AppendValue(text, trip.ResetValue).Append(',').Append(unit).Append(",,").Append(words.Clear).Append(",,,\n");
        }
        text.Append(start).Append("sign-off,,,,,,").Append(unit).Append(",,,,,");
        CsvText.AppendField(text, SignOffText).Append('\n');
    }

    /// <summary>Volts, or nothing where the card declares no input resistance.</summary>
    private static StringBuilder AppendCsvVolts(StringBuilder text, double? volts) =>
        volts is { } v ? FieldText.AppendVolts(text, v) : text;

    private static readonly string OkText = PointStatus.OK.ToString();

    // Enum names made once: Enum.ToString costs a lookup and a string per call, and every
    // format writes several per point.

    /// <summary>A status by its name (OK, UNDER, ...).</summary>
    public static string StatusText(PointStatus status) => StatusNames[(int)status];

    /// <summary>An alarm kind by its name (HH, H, L, LL).</summary>
    public static string AlarmText(AlarmKind kind) => AlarmWords[(int)kind].Name;

    private static readonly string[] StatusNames = Enum.GetValues<PointStatus>().Select(s => s.ToString()).ToArray();

    private static readonly (string Name, string Trip, string Reset, string Active, string Clear)[] AlarmWords =
        Enum.GetValues<AlarmKind>().Select(k => (k.ToString(), $"{k} trip", $"{k} reset", $"{k} active", $"{k} clear")).ToArray();

    // ---- text ---------------------------------------------------------------------------

    /// <summary>A compact sheet per point for the terminal, with the caution.</summary>
    public static string Text(IReadOnlyList<PointSheet> sheets)
    {
        var builder = new StringBuilder();
        foreach (var line in FieldText.CautionLines(FieldText.SheetCaution)) builder.Append(line).Append('\n');
        foreach (var sheet in sheets)
        {
            var point = sheet.Point;
            builder.Append('\n')
                .Append(point.Tag).Append(point.Description.Length > 0 ? "  " + point.Description : "").Append('\n')
                .Append($"  card {point.Card.Name} at {point.Address}; signal {SignalText(point)}; range {RangeText(point)}; {ExtractionText(point)}\n")
                .Append($"  {HealthText(point)}; on fault {OnFaultText(point)}; tolerance {ToleranceText(sheet)}; volts {VoltsWhere(point)}\n");

            var rows = new List<string[]> { new[] { "test", "mA", "V", "raw", $"expected {point.Unit}", "status" } };
            foreach (var s in sheet.Steps)
                rows.Add([$"{FieldText.Percent(s.Percent)} %", FieldText.Ma(s.Ma), s.Volts is { } v ? FieldText.Volts(v) : "-",
                    FieldText.Raw(s.Raw), $"{FieldText.Value(s.Value)} +/- {FieldText.Value(s.Tolerance)}", "OK"]);
            foreach (var (status, f, _) in sheet.Bands)
                if (f is not null)
                    rows.Add(["band", FieldText.Ma(f.Ma), f.Volts is { } v ? FieldText.Volts(v) : "-",
                        FieldText.Raw(f.Raw), ShowsText(f), status.ToString()]);
            foreach (var t in sheet.Trips)
            {
                var kind = t.Alarm.Kind.ToString();
                rows.Add([$"{kind} trip", FieldText.Ma(t.TripMa), t.TripVolts is { } v ? FieldText.Volts(v) : "-",
                    FieldText.Raw(t.TripRaw), FieldText.Value(t.Setpoint), $"{kind} active"]);
                rows.Add([$"{kind} reset", FieldText.Ma(t.ResetMa), t.ResetVolts is { } r ? FieldText.Volts(r) : "-",
                    FieldText.Raw(t.ResetRaw), FieldText.Value(t.ResetValue), $"{kind} clear"]);
            }
            var widths = Enumerable.Range(0, 6).Select(i => rows.Max(r => r[i].Length)).ToArray();
            foreach (var row in rows)
                builder.Append("  ").Append(string.Join("  ", row.Select((c, i) => i is 0 or 4 or 5 ? c.PadRight(widths[i]) : c.PadLeft(widths[i]))).TrimEnd()).Append('\n');
            if (point.SquareRoot) builder.Append("  note: ").Append(SqrtStepNote).Append('\n');
            foreach (var band in sheet.Untestable)
                builder.Append($"  {band.Status} not testable: {band.Reason}\n");
        }
        var steps = sheets.Sum(s => s.Steps.Length);
        var bands = sheets.Sum(s => s.FaultTests.Length);
        var trips = sheets.Sum(s => s.Trips.Length);
        builder.Append('\n')
            .Append(CultureInfo.InvariantCulture, $"{sheets.Count} point{(sheets.Count == 1 ? "" : "s")}: {steps} steps, {bands} band tests, {trips} alarm trips.")
            .Append(" Write CSV, HTML and JSON sheets with -o DIR.\n");
        return builder.ToString();
    }
}
