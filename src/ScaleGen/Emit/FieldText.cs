using System.Globalization;
using System.Text;
using Newtonsoft.Json.Linq;

namespace ScaleGen.Emit;

/// <summary>
/// What the field outputs (loop budgets and check sheets) share: their cautions and the way
/// they print numbers. Numbers are always invariant, with a fixed number of decimals per
/// quantity, so a table reads the same on every machine.
/// </summary>
public static class FieldText
{
    /// <summary>Printed with every loop budget (table, file, JSON), one sentence per entry.</summary>
    public static readonly IReadOnlyList<string> LoopCaution =
    [
        "This loop budget is an electrical estimate, not an intrinsic-safety entity check: loops in hazardous areas need their own assessment by competent people.",
        "Energised work on a loop follows local codes, the site's permits and licensed practice.",
    ];

    /// <summary>Printed on every check sheet (text, CSV, HTML, JSON), one sentence per entry.</summary>
    public static readonly IReadOnlyList<string> SheetCaution =
    [
        "Injecting currents into a live loop is energised work: follow local codes, the site's permits and licensed practice.",
        "Forced or simulated signals can trip interlocks and start or stop plant: agree every test with operations and isolate what it could move.",
        "The alarms here are process alarms, not safety functions, and this sheet is no intrinsic-safety entity check.",
    ];

    /// <summary>Caution sentences as printed lines: the first marked CAUTION, the rest indented under it.</summary>
    public static IEnumerable<string> CautionLines(IEnumerable<string> sentences) =>
        sentences.Select((sentence, i) => (i == 0 ? "CAUTION: " : "         ") + sentence);

    public static string Ma(double ma) => Fixed(ma, 3).ToString();

    public static string Volts(double volts) => Fixed(volts, 3).ToString();

    public static string Ohms(double ohms) => Fixed(ohms, 1).ToString();

    /// <summary>Supply-side voltages and the budget current, with two decimals as a data sheet gives them.</summary>
    public static string SupplyVolts(double volts) => Fixed(volts, 2).ToString();

    public static string Percent(double percent) => PercentText(percent).ToString();

    /// <summary>Engineering values: up to four decimals, no trailing zeros, never "-0".</summary>
    public static string Value(double value) => ValueText(value).ToString();

    public static string Raw(long raw) => raw.ToString(CultureInfo.InvariantCulture);

    public static string Raw(long? raw) => raw is { } r ? Raw(r) : "-";

    // The same texts appended to a builder without a string each: a check sheet of 50,000
    // points writes some four million numbers per file.

    public static StringBuilder AppendMa(StringBuilder text, double ma) => Fixed(ma, 3).AppendTo(text);

    public static StringBuilder AppendVolts(StringBuilder text, double volts) => Fixed(volts, 3).AppendTo(text);

    public static StringBuilder AppendPercent(StringBuilder text, double percent) => PercentText(percent).AppendTo(text);

    public static StringBuilder AppendValue(StringBuilder text, double value) => ValueText(value).AppendTo(text);

    public static StringBuilder AppendRaw(StringBuilder text, long raw) => text.Append(CultureInfo.InvariantCulture, $"{raw}");

    public static StringBuilder AppendRaw(StringBuilder text, long? raw) => raw is { } r ? AppendRaw(text, r) : text.Append('-');

    /// <summary>
    /// A number's text, decided but not yet written: the digits of a short decimal for
    /// <see cref="DecimalText"/> (nearly every number), or .NET's own text for the rest.
    /// </summary>
    private readonly record struct NumberText(long Scaled, int Decimals, bool TrimZeros, string? Other)
    {
        public static NumberText Of(string text) => new(0, 0, false, text);

        public override string ToString() => Other ?? DecimalText.Format(Scaled, Decimals, TrimZeros);

        public StringBuilder AppendTo(StringBuilder text)
        {
            if (Other is not null) return text.Append(Other);
            DecimalText.Append(text, Scaled, Decimals, TrimZeros);
            return text;
        }
    }

    private static NumberText PercentText(double percent) =>
        // -0 keeps .NET's form, whatever that is; DecimalText would drop the sign.
        !double.IsNegative(percent) && DecimalText.TryScale(percent, 2, out var scaled)
            ? new NumberText(scaled, 2, TrimZeros: true, null)
            : NumberText.Of(percent.ToString("0.##", CultureInfo.InvariantCulture));

    private static NumberText ValueText(double value)
    {
        var rounded = Math.Round(value, 4, MidpointRounding.AwayFromZero);
        if (rounded == 0) return NumberText.Of("0");
        return DecimalText.TryScale(rounded, 4, out var scaled)
            ? new NumberText(scaled, 4, TrimZeros: true, null)
            : NumberText.Of(rounded.ToString("0.####", CultureInfo.InvariantCulture));
    }

    private static NumberText Fixed(double value, int decimals)
    {
        // Half away from zero, as people round by hand (the default would round to even).
        var rounded = Math.Round(value, decimals, MidpointRounding.AwayFromZero);
        if (rounded == 0) rounded = 0; // no "-0.000"
        return DecimalText.TryScale(rounded, decimals, out var scaled)
            ? new NumberText(scaled, decimals, TrimZeros: false, null)
            : NumberText.Of(rounded.ToString(FixedFormats[decimals], CultureInfo.InvariantCulture));
    }

    private static readonly string[] FixedFormats = ["F0", "F1", "F2", "F3", "F4"];

    /// <summary>The generated header and a caution, as the lines of a plain-text or CSV file starts with (without the comment mark).</summary>
    public static IEnumerable<string> HeaderLines(EmitContext context, string what, IEnumerable<string> caution) =>
        GeneratedHeader.Lines(context, what).Concat(CautionLines(caution));
}
