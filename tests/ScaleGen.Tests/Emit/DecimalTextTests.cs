using System.Globalization;
using System.Text;
using CsCheck;
using CsvHelper;
using CsvHelper.Configuration;
using Newtonsoft.Json;
using Newtonsoft.Json.Linq;
using ScaleGen.Emit;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit;

/// <summary>
/// The fast number, JSON and CSV writers the large outputs use must give exactly the text
/// the general ones (.NET formatting, Newtonsoft, CsvHelper) give: outputs keep their bytes.
/// Each property compares the two on many values, under de-DE so that a culture leak shows.
/// </summary>
public class DecimalTextTests
{
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    // The formatting the emitters used before the fast paths, as the reference.
    private static string ValueReference(double value)
    {
        var rounded = Math.Round(value, 4, MidpointRounding.AwayFromZero);
        return (rounded == 0 ? 0.0 : rounded).ToString("0.####", Invariant);
    }

    private static string FixedReference(double value, int decimals)
    {
        var rounded = Math.Round(value, decimals, MidpointRounding.AwayFromZero);
        return (rounded == 0 ? 0.0 : rounded).ToString("F" + decimals.ToString(Invariant), Invariant);
    }

    private static string ReadableReference(double value, int decimals)
    {
        var rounded = Math.Round(value, decimals);
        if (rounded == 0) rounded = 0;
        return rounded.ToString("0." + new string('#', decimals), Invariant);
    }

    private static string RealReference(double value)
    {
        var single = (float)value;
        if (float.IsPositiveInfinity(single)) single = float.MaxValue;
        if (float.IsNegativeInfinity(single)) single = float.MinValue;
        if (single == 0f) return "0.0";
        var text = single.ToString("R", Invariant);
        var e = text.IndexOfAny(['E', 'e']);
        var mantissa = e < 0 ? text : text[..e];
        if (!mantissa.Contains('.')) mantissa += ".0";
        if (e < 0) return mantissa;
        return mantissa + "E" + int.Parse(text[(e + 1)..], NumberStyles.AllowLeadingSign, Invariant).ToString(Invariant);
    }

    /// <summary>Doubles as the outputs meet them: short decimals, computed values, midpoints, tiny and huge ones, any bits.</summary>
    private static readonly Gen<double> Numbers = Gen.OneOf(
        Gen.Double.Where(double.IsFinite),
        Gen.Select(Gen.Int[-10_000_000, 10_000_000], Gen.Int[0, 10]).Select((k, d) => k / Math.Pow(10, d)),
        Gen.Select(Gen.Int[-100_000, 100_000], Gen.Int[0, 8]).Select((k, d) => (k + 0.5) / Math.Pow(10, d)),
        Gen.Select(Gen.Int[-2000, 2000], Gen.Int[1, 2000], Gen.Int[1, 13]).Select((a, b, c) => a + b * (c / 13.0)),
        Gen.Select(Gen.Double[0, 1], Gen.Int[-12, 20]).Select((f, e) => f * Math.Pow(10, e)),
        Gen.Select(Gen.Int[-5, 5], Gen.Bool).Select((n, negative) => negative ? -0.0 * n - 0.0 : n * 1e-13));

    [Fact]
    public void Field_numbers_are_the_text_dotnet_formats() =>
        TestInputs.UnderCulture("de-DE", () =>
        {
            Numbers.Sample(v =>
                FieldText.Value(v) == ValueReference(v)
                && FieldText.Percent(v) == v.ToString("0.##", Invariant)
                && FieldText.Ma(v) == FixedReference(v, 3)
                && FieldText.Ohms(v) == FixedReference(v, 1)
                && FieldText.SupplyVolts(v) == FixedReference(v, 2)
                && FieldText.AppendValue(new StringBuilder(), v).ToString() == ValueReference(v)
                && FieldText.AppendMa(new StringBuilder(), v).ToString() == FixedReference(v, 3)
                && FieldText.AppendPercent(new StringBuilder(), v).ToString() == v.ToString("0.##", Invariant),
                iter: 200_000);
            return 0;
        });

    [Fact]
    public void Structured_text_numbers_are_the_text_dotnet_formats() =>
        TestInputs.UnderCulture("de-DE", () =>
        {
            Gen.Select(Numbers, Gen.Int[0, 9]).Sample((v, d) =>
                StLiterals.Readable(v, d) == ReadableReference(v, d) && StLiterals.Real(v) == RealReference(v), iter: 200_000);
            return 0;
        });

    [Fact]
    public void Every_six_digit_decimal_is_the_real_literal_dotnet_formats()
    {
        // The REAL fast path takes exactly the floats of decimals of up to six digits: all of those from 10^-4 to 10^6.
        for (var decimals = 0; decimals <= 10; decimals++)
        {
            for (var k = 1; k < 1_000_000; k += 7)
            {
                var value = k / Math.Pow(10, decimals);
                Assert.Equal(RealReference(value), StLiterals.Real(value));
                Assert.Equal(RealReference(-value), StLiterals.Real(-value));
            }
        }
    }

    [Theory]
    [InlineData(0.0, 4, "0")]
    [InlineData(-12.5, 4, "-12.5")]
    [InlineData(0.0042, 4, "0.0042")]
    [InlineData(100.0, 2, "100")]
    public void Decimal_text_trims_zeros_and_keeps_a_leading_zero(double value, int decimals, string expected)
    {
        Assert.True(DecimalText.TryScale(value, decimals, out var scaled));
        Assert.Equal(expected, DecimalText.Format(scaled, decimals, trimZeros: true));
    }

    [Fact]
    public void Decimal_text_refuses_what_it_cannot_write_exactly()
    {
        Assert.False(DecimalText.TryScale(1.0 / 3, 4, out _));
        Assert.False(DecimalText.TryScale(double.NaN, 2, out _));
        Assert.False(DecimalText.TryScale(1e300, 0, out _));
    }

    /// <summary>JSON values with strings that need escaping and numbers of every kind.</summary>
    private static readonly Gen<JToken> JsonValues = Gen.OneOf<JToken>(
        Numbers.Select(v => JsonOutput.Number(v)),
        Numbers.Select(v => (JToken)new JValue(v)),
        Gen.Long.Select(v => (JToken)new JValue(v)),
        Gen.String.Select(s => (JToken)new JValue(s)),
        Gen.OneOfConst("", "plain", "a\"b", "back\\slash", "tab\there", "\u0001\u001f\u007f", "\u0085\u2028\u2029", "é µ Ω 😀", "<b>&amp;</b>", "'")
            .Select(s => (JToken)new JValue(s)),
        Gen.Bool.Select(b => (JToken)new JValue(b)),
        Gen.Const((JToken)JValue.CreateNull()));

    private static readonly Gen<JToken> JsonDocuments =
        Gen.Select(Gen.String.Array[0, 5], JsonValues.Array[0, 5], JsonValues.Array[0, 4], Gen.Int[0, 2])
            .Select((names, values, items, emptyObjects) =>
            {
                var document = new JObject();
                for (var i = 0; i < Math.Min(names.Length, values.Length); i++) document[names[i] + i.ToString(Invariant)] = values[i];
                document["list"] = new JArray(items);
                document["nested"] = new JObject { ["inner"] = new JArray(new JObject(), new JArray(), new JObject { ["x"] = new JArray(items) }) };
                for (var i = 0; i < emptyObjects; i++) document["empty" + i.ToString(Invariant)] = new JObject();
                return (JToken)document;
            });

    [Fact]
    public void Json_text_writes_what_newtonsoft_writes() =>
        TestInputs.UnderCulture("de-DE", () =>
        {
            JsonDocuments.Sample(document =>
            {
                var json = new JsonText(new StringBuilder());
                json.Token(document);
                return json.Text.Append('\n').ToString() == JsonOutput.Write(document);
            }, iter: 5_000);
            return 0;
        });

    [Fact]
    public void Json_text_numbers_are_json_output_numbers()
    {
        Numbers.Sample(v =>
        {
            var json = new JsonText(new StringBuilder());
            json.StartArray();
            json.Number(v);
            json.EndArray();
            return json.Text.Append('\n').ToString() == JsonOutput.Write(new JArray(JsonOutput.Number(v)));
        }, iter: 100_000);
    }

    [Fact]
    public void Csv_fields_are_quoted_where_csvhelper_quotes_them()
    {
        var pieces = Gen.OneOfConst("", "a", " ", ",", "\"", "\n", "\r", "\r\n", "\t", "#", "=1+1", "-2", "é", "x y", "😀");
        pieces.Array[0, 6].Select(parts => string.Concat(parts)).Array[1, 5].Sample(fields =>
        {
            var expected = new StringWriter(Invariant) { NewLine = "\n" };
            using (var csv = new CsvWriter(expected, new CsvConfiguration(Invariant) { NewLine = "\n" }, leaveOpen: true))
            {
                foreach (var field in fields) csv.WriteField(field);
                csv.NextRecord();
            }
            var actual = new StringBuilder();
            for (var i = 0; i < fields.Length; i++) CsvText.AppendField(i == 0 ? actual : actual.Append(','), fields[i]);
            return actual.Append('\n').ToString() == expected.ToString();
        }, iter: 20_000);
    }
}
