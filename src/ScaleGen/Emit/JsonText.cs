using System.Buffers;
using System.Globalization;
using System.Text;
using Newtonsoft.Json;
using Newtonsoft.Json.Linq;

namespace ScaleGen.Emit;

/// <summary>
/// Writes JSON into a StringBuilder exactly as <see cref="JsonOutput"/>'s Newtonsoft writer
/// does (two-space indents, '\n', "name": value, "[]" and "{}" when empty, the same string
/// escapes and numbers), for outputs of tens of thousands of records: Newtonsoft's general
/// writer (state checks, a call into the TextWriter per token) costs several times more per
/// token than appending to a builder. Strings that need escaping and unusual numbers are
/// still formatted by Newtonsoft, so those rules live in one place.
/// </summary>
/// <remarks>One writer per builder and thread. It checks nothing: a caller that closes what it did not open gets wrong JSON.</remarks>
public sealed class JsonText(StringBuilder text)
{
    // Values written so far in each open object or array, innermost last.
    private int[] _counts = new int[8];
    private int _depth;
    private bool _afterName;

    /// <summary>The builder written to (for spilling it to a file now and then).</summary>
    public StringBuilder Text => text;

    public void StartObject()
    {
        BeforeValue();
        text.Append('{');
        Open();
    }

    public void EndObject() => Close('}');

    public void StartArray()
    {
        BeforeValue();
        text.Append('[');
        Open();
    }

    public void EndArray() => Close(']');

    public void Name(string name)
    {
        if (_counts[_depth - 1]++ > 0) text.Append(',');
        NewLine(_depth);
        AppendString(name);
        text.Append(':');
        _afterName = true;
    }

    public void String(string? value)
    {
        BeforeValue();
        AppendString(value);
    }

    public void Integer(long value)
    {
        BeforeValue();
        Span<char> digits = stackalloc char[20];
        value.TryFormat(digits, out var length, default, CultureInfo.InvariantCulture);
        text.Append(digits[..length]);
    }

    /// <summary>A double as <see cref="JsonOutput.Number(double)"/> makes it: rounded to 10 decimals, a whole number without a fraction.</summary>
    public void Number(double value)
    {
        if (!double.IsFinite(value)) throw new ArgumentOutOfRangeException(nameof(value), "JSON has no NaN or infinity.");
        if (Math.Abs(value) < 1e15) value = Math.Round(value, 10);
        if (Math.Abs(value) < 1e15 && Math.Floor(value) == value) Integer((long)value);
        else Double(value);
    }

    public void Bool(bool value)
    {
        BeforeValue();
        text.Append(value ? "true" : "false");
    }

    public void Null()
    {
        BeforeValue();
        text.Append("null");
    }

    /// <summary>A token as Newtonsoft writes it; objects, arrays, strings, whole numbers, doubles, booleans and nulls.</summary>
    public void Token(JToken token)
    {
        switch (token)
        {
            case JObject obj:
                StartObject();
                foreach (var property in obj.Properties())
                {
                    Name(property.Name);
                    Token(property.Value);
                }
                EndObject();
                break;
            case JArray array:
                StartArray();
                foreach (var item in array) Token(item);
                EndArray();
                break;
            case JValue { Type: JTokenType.String } value:
                String((string?)value.Value);
                break;
            case JValue { Type: JTokenType.Integer, Value: long or int } value:
                Integer(Convert.ToInt64(value.Value, CultureInfo.InvariantCulture));
                break;
            case JValue { Type: JTokenType.Float, Value: double number }:
                Double(number);
                break;
            case JValue { Type: JTokenType.Boolean, Value: bool flag }:
                Bool(flag);
                break;
            case JValue { Type: JTokenType.Null }:
                Null();
                break;
            default:
                throw new ArgumentException($"No JSON text for a {token.Type} token here.", nameof(token));
        }
    }

    // ---- fields, the same as JsonOutput's for Newtonsoft's writer ----------------------------

    public void Field(string name, string? value)
    {
        Name(name);
        String(value);
    }

    public void Field(string name, bool value)
    {
        Name(name);
        Bool(value);
    }

    public void Field(string name, long value)
    {
        Name(name);
        Integer(value);
    }

    public void Field(string name, long? value)
    {
        Name(name);
        if (value is { } v) Integer(v);
        else Null();
    }

    public void NumberField(string name, double value)
    {
        Name(name);
        Number(value);
    }

    public void NumberField(string name, double? value)
    {
        Name(name);
        if (value is { } v) Number(v);
        else Null();
    }

    // ---- layout ----------------------------------------------------------------------------

    private void Open()
    {
        if (_depth == _counts.Length) Array.Resize(ref _counts, _depth * 2);
        _counts[_depth++] = 0;
    }

    private void Close(char bracket)
    {
        var empty = _counts[--_depth] == 0;
        if (!empty) NewLine(_depth);
        text.Append(bracket);
    }

    /// <summary>A value goes after its name and a space, or on a new line after a comma in an array.</summary>
    private void BeforeValue()
    {
        if (_afterName)
        {
            _afterName = false;
            text.Append(' ');
            return;
        }
        if (_depth == 0) return;
        if (_counts[_depth - 1]++ > 0) text.Append(',');
        NewLine(_depth);
    }

    private void NewLine(int depth) => text.Append(depth < NewLines.Length ? NewLines[depth] : "\n" + new string(' ', depth * 2));

    /// <summary>A line break and the indent of each depth, made once.</summary>
    private static readonly string[] NewLines = Enumerable.Range(0, 16).Select(depth => "\n" + new string(' ', depth * 2)).ToArray();

    /// <summary>A double as Newtonsoft writes one (shortest round-trip form, "2.0" for a whole number).</summary>
    private void Double(double value)
    {
        BeforeValue();
        JsonOutput.AppendDouble(text, value);
    }

    /// <summary>Printable ASCII but the quote and the backslash: written as it is.</summary>
    private static readonly SearchValues<char> Plain =
        SearchValues.Create(string.Concat(Enumerable.Range(' ', '~' - ' ' + 1).Select(c => (char)c).Where(c => c is not ('"' or '\\'))));

    private void AppendString(string? value)
    {
        if (value is null)
        {
            text.Append("null");
            return;
        }
        // Anything Newtonsoft might escape (control characters, quote, backslash and, to be
        // safe with its few non-ASCII escapes, everything beyond ASCII) goes to Newtonsoft.
        if (value.AsSpan().ContainsAnyExcept(Plain))
        {
            text.Append(JsonConvert.ToString(value));
            return;
        }
        text.Append('"').Append(value).Append('"');
    }
}
