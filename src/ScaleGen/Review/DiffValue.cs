using Newtonsoft.Json.Linq;
using ScaleGen.Emit;

namespace ScaleGen.Review;

/// <summary>
/// One side of a field change: a number (in the model's fixed unit or the point's
/// engineering unit), a string, a flag, or nothing (the field does not apply or is unset).
/// </summary>
public readonly struct DiffValue
{
    private readonly object? _value;

    private DiffValue(object? value) => _value = value;

    public static DiffValue None { get; } = new(null);

    public static DiffValue Of(double value) => new(value);

    public static DiffValue Of(double? value) => value is { } v ? new(v) : None;

    public static DiffValue Of(string? value) => new(value);

    public static DiffValue Of(bool value) => new(value);

    /// <summary>A keyword or name (ne43, hold, INT, a card name): shown without quotes.</summary>
    public static DiffValue Word(string? value) => value is null ? None : new(new WordText(value));

    private sealed record WordText(string Text);

    public bool IsNone => _value is null;

    /// <summary>
    /// The same value? Numbers count as the same within 1e-12 relative: a deadband of 5 %
    /// of 900 and one of 45 m3/h are the same deadband, whatever the last binary digit says.
    /// </summary>
    public bool SameAs(DiffValue other) => (_value, other._value) switch
    {
        (null, null) => true,
        (double a, double b) => a == b || Math.Abs(a - b) <= 1e-12 * Math.Max(Math.Abs(a), Math.Abs(b)),
        (string a, string b) => string.Equals(a, b, StringComparison.Ordinal),
        (WordText a, WordText b) => string.Equals(a.Text, b.Text, StringComparison.Ordinal),
        (bool a, bool b) => a == b,
        _ => false,
    };

    public JToken ToJson() => _value switch
    {
        null => JValue.CreateNull(),
        double d => JsonOutput.Number(d),
        string s => new JValue(s),
        WordText w => new JValue(w.Text),
        bool b => new JValue(b),
        _ => throw new InvalidOperationException("unreachable"),
    };

    /// <summary>For people: numbers as written, strings quoted, flags as yes/no, nothing as "none".</summary>
    public string Display() => _value switch
    {
        null => "none",
        double d => DisplayNumbers.Exact(d),
        string s => "\"" + s.Replace("\\", "\\\\").Replace("\"", "\\\"") + "\"",
        WordText w => w.Text,
        bool b => b ? "yes" : "no",
        _ => throw new InvalidOperationException("unreachable"),
    };

    public override string ToString() => Display();
}
