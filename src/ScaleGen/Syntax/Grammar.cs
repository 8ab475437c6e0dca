using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using System.Text.RegularExpressions;
using Sprache;
using ScaleGen.Text;

namespace ScaleGen.Syntax;

/// <summary>
/// The Sprache grammar of one statement. Statements are parsed one at a time (the
/// <see cref="StatementScanner"/> finds their bounds), dispatched on the keyword, so no
/// statement parser ever backtracks across another's keyword.
/// </summary>
internal static class Grammar
{
    /// <summary>A failure message that starts with a code names a specific diagnostic.</summary>
    internal const string NotANumberMarker = "SG0013:";

    private static readonly Parser<string> Blank = Parse.Chars(' ', '\t').Many().Text();

    private static Parser<T> Token<T>(this Parser<T> parser) =>
        from value in parser
        from _ in Blank
        select value;

    /// <summary>Runs a parser and reports the span it consumed (before trailing blanks).</summary>
    private static Parser<(T Value, TextSpan Span)> Spanned<T>(this Parser<T> parser) => input =>
    {
        var result = parser(input);
        return result.WasSuccessful
            ? Result.Success((result.Value, TextSpan.FromBounds(input.Position, result.Remainder.Position)), result.Remainder)
            : Result.Failure<(T, TextSpan)>(result.Remainder, result.Message, result.Expectations);
    };

    // ---- Tokens ---------------------------------------------------------------------

    internal static readonly Parser<WordSyntax> Word =
        (from first in Parse.Letter
         from rest in Parse.LetterOrDigit.Or(Parse.Chars('_', '-')).Many().Text()
         select first + rest)
        .Spanned()
        .Select(w => new WordSyntax(w.Span, w.Value))
        .Token();

    private static Parser<WordSyntax> Keyword(string text) =>
        Word.Where(w => w.Text == text).Named($"'{text}'");

    private static readonly Regex NumberPattern = new(@"\G-?[0-9]+(\.[0-9]+)?([eE][+-]?[0-9]+)?", RegexOptions.Compiled | RegexOptions.CultureInvariant);
    private static readonly Regex NotANumberPattern = new(@"\G-?(NaN|nan|Infinity|infinity|inf|Inf|INF|∞)", RegexOptions.Compiled | RegexOptions.CultureInvariant);

    /// <summary>Numbers are always written with a '.'; the machine's culture plays no part.</summary>
    internal static readonly Parser<NumberSyntax> Number = input =>
    {
        var text = input.Source;
        var start = input.Position;
        var invalid = NotANumberPattern.Match(text, start);
        if (invalid.Success && invalid.Index == start)
            return Result.Failure<NumberSyntax>(input, $"{NotANumberMarker}'{invalid.Value}' is not a number: write a finite decimal number such as 0 or 450.5", new[] { "number" });
        var match = NumberPattern.Match(text, start);
        if (!match.Success || match.Index != start || start + match.Length > EndOf(input))
            return Result.Failure<NumberSyntax>(input, "expected a number", new[] { "number" });
        var end = start + match.Length;
        if (end < EndOf(input) && match.Value.TrimStart('-') == "0" && text[end] is 'x' or 'X')
            return Result.Failure<NumberSyntax>(input, $"{NotANumberMarker}hexadecimal numbers are not allowed: write the value in decimal", new[] { "number" });
        var value = double.Parse(match.Value, NumberStyles.Float, CultureInfo.InvariantCulture);
        if (!double.IsFinite(value))
            return Result.Failure<NumberSyntax>(input, $"{NotANumberMarker}'{match.Value}' is too large for a number: use a value within ±1.7e308", new[] { "number" });
        IInput rest = input is SourceInput statement ? statement.At(end) : input;
        while (rest.Position < end) rest = rest.Advance();
        return Result.Success(new NumberSyntax(new TextSpan(start, match.Length), value, match.Value), rest);
    };

    private static int EndOf(IInput input) => input is SourceInput statement ? statement.End : input.Source.Length;

    private static readonly Parser<NumberSyntax> NumberToken = Number.Token();

    private static readonly Parser<StringSyntax> QuotedString =
        (from open in Parse.Char('"')
         from content in Parse.Char('\\').Then(_ => Parse.AnyChar.Select(c => "\\" + c))
             .Or(Parse.CharExcept("\"\\\r\n").Many().Text().Where(s => s.Length > 0))
             .Many()
         from close in Parse.Char('"')
         select Unescape(string.Concat(content)))
        .Spanned()
        .Select(s => new StringSyntax(s.Span, s.Value))
        .Token()
        .Named("a \"quoted string\"");

    /// <summary>\" and \\ are the escapes; any other backslash is kept as written (the binder reports it).</summary>
    private static string Unescape(string raw)
    {
        if (!raw.Contains('\\')) return raw;
        var builder = new StringBuilder(raw.Length);
        for (var i = 0; i < raw.Length; i++)
        {
            if (raw[i] == '\\' && i + 1 < raw.Length && raw[i + 1] is '"' or '\\')
            {
                builder.Append(raw[i + 1]);
                i++;
            }
            else builder.Append(raw[i]);
        }
        return builder.ToString();
    }

    /// <summary>
    /// A unit: any run of characters but white space, braces, '#', ';' and '"', or a quoted
    /// string. It may not start like a number or like '..', and words that the statement
    /// itself uses as keywords are never taken as a unit.
    /// </summary>
    private static Parser<UnitSyntax> Unit(params string[] notUnits) =>
        QuotedString.Select(s => new UnitSyntax(s.Span, s.Value, true))
        .Or((from first in Parse.Char(c => !char.IsWhiteSpace(c) && !char.IsControl(c) && !char.IsDigit(c) && "{}#;\".,-+".IndexOf(c) < 0, "unit")
             from rest in Parse.Char(c => !char.IsWhiteSpace(c) && !char.IsControl(c) && "{}#;\"".IndexOf(c) < 0, "unit").Many().Text()
             select first + rest)
            .Spanned()
            .Where(u => Array.IndexOf(notUnits, u.Value) < 0)
            .Select(u => new UnitSyntax(u.Span, u.Value, false))
            .Token());

    private static Parser<QuantitySyntax> Quantity(params string[] notUnits) =>
        from number in NumberToken
        from unit in Unit(notUnits).Optional()
        select new QuantitySyntax(
            TextSpan.FromBounds(number.Span.Start, unit.IsDefined ? unit.Get().Span.End : number.Span.End),
            number, unit.GetOrDefault());

    private static Parser<RangeSyntax> Range(params string[] notUnits) =>
        from low in NumberToken
        from dots in Parse.String("..").Token().Named("'..'")
        from high in NumberToken
        from unit in Unit(notUnits).Optional()
        select new RangeSyntax(
            TextSpan.FromBounds(low.Span.Start, unit.IsDefined ? unit.Get().Span.End : high.Span.End),
            low, high, unit.GetOrDefault());

    // ---- Statements -----------------------------------------------------------------

    /// <summary>How one keyword's statement is parsed, and what it must look like.</summary>
    internal sealed record StatementRule(string Keyword, Func<WordSyntax, Parser<StatementSyntax>> Arguments, string Usage, bool HasBlock = false);

    private static StatementRule Rule<T>(string keyword, string usage, Func<WordSyntax, Parser<T>> arguments, bool hasBlock = false)
        where T : StatementSyntax =>
        new(keyword, k => arguments(k).Select(s => (StatementSyntax)s), usage, hasBlock);

    private static TextSpan Through(WordSyntax keyword, SyntaxNode? last) =>
        TextSpan.FromBounds(keyword.Span.Start, last?.Span.End ?? keyword.Span.End);

    private static Parser<QuantitySettingSyntax> QuantitySetting(WordSyntax k) =>
        Quantity().Select(q => new QuantitySettingSyntax(Through(k, q), k, q));

    private static Parser<RangeSettingSyntax> RangeSetting(WordSyntax k) =>
        Range().Select(r => new RangeSettingSyntax(Through(k, r), k, r));

    private static Parser<WordSyntax> DeclarationName => Word.Named("a name");

    private static readonly string[] AlarmOptionWords = { "priority", "deadband", "delay", "clear", "text" };

    private static readonly Parser<AlarmOptionSyntax> AlarmOption =
        (from name in Word.Where(w => Array.IndexOf(AlarmOptionWords, w.Text) >= 0).Named("priority, deadband, delay, clear or text")
         from value in name.Text == "text"
             ? QuotedString.Select(s => (Q: (QuantitySyntax?)null, S: (StringSyntax?)s, End: s.Span.End))
             : Quantity(AlarmOptionWords).Select(q => (Q: (QuantitySyntax?)q, S: (StringSyntax?)null, End: q.Span.End))
         select new AlarmOptionSyntax(TextSpan.FromBounds(name.Span.Start, value.End), name, value.Q, value.S));

    public static readonly IReadOnlyDictionary<string, StatementRule> TopLevel = Rules(
        Rule("plant", "plant \"Title of the plant\"",
            k => QuotedString.Select(s => new PlantTitleSyntax(Through(k, s), k, s))),
        Rule("cycle", "cycle 100 ms",
            k => Quantity().Select(q => new CycleSyntax(Through(k, q), k, q))),
        Rule("card", "card NAME { ... }",
            k => DeclarationName.Select(n => new CardSyntax(Through(k, n), k, n, BlockSyntax.Empty(default))), hasBlock: true),
        Rule("profile", "profile NAME [uses PROFILE] { ... }",
            k => from n in DeclarationName
                 from u in Keyword("uses").Then(_ => DeclarationName).Optional()
                 select new ProfileSyntax(Through(k, u.GetOrDefault() ?? n), k, n, u.GetOrDefault(), BlockSyntax.Empty(default)), hasBlock: true),
        Rule("point", "point TAG [uses PROFILE] { ... }",
            k => from n in DeclarationName
                 from u in Keyword("uses").Then(_ => DeclarationName).Optional()
                 select new PointSyntax(Through(k, u.GetOrDefault() ?? n), k, n, u.GetOrDefault(), BlockSyntax.Empty(default)), hasBlock: true));

    public static readonly IReadOnlyDictionary<string, StatementRule> CardBody = Rules(
        Rule("counts", "counts 0 .. 27648 at 4 .. 20 mA",
            k => from raw in Range("at")
                 from at in Keyword("at")
                 from electrical in Range()
                 select new CountsSyntax(Through(k, electrical), k, raw, electrical)),
        Rule("limits", "limits -4864 .. 32511",
            k => Range().Select(r => new LimitsSyntax(Through(k, r), k, r))),
        Rule("fault-code", "fault-code 32767[, 32767...]",
            k => NumberToken.DelimitedBy(Parse.Char(',').Token())
                 .Select(codes => new FaultCodeSyntax(Through(k, codes.Last()), k, codes.ToImmutableArray()))),
        Rule("type", "type INT|DINT|UINT",
            k => Word.Select(w => new RawTypeSyntax(Through(k, w), k, w))),
        Rule("input", "input 250 ohm", QuantitySetting));

    public static readonly IReadOnlyDictionary<string, StatementRule> PointBody = Rules(
        Rule("desc", "desc \"Raw water inlet flow\"",
            k => QuotedString.Select(s => new DescriptionSyntax(Through(k, s), k, s))),
        Rule("card", "card AI16 at \"R1.S2.C0\"",
            k => from card in DeclarationName
                 from address in Keyword("at").Then(_ => QuotedString).Optional()
                 select new CardReferenceSyntax(Through(k, (SyntaxNode?)address.GetOrDefault() ?? card), k, card, address.GetOrDefault())),
        Rule("signal", "signal 4 .. 20 mA", RangeSetting),
        Rule("shunt", "shunt 250 ohm", QuantitySetting),
        Rule("range", "range 0 .. 450 m3/h", RangeSetting),
        Rule("sqrt", "sqrt cutoff 1 %",
            k => Keyword("cutoff").Then(_ => Quantity()).Optional()
                 .Select(c => new SqrtSyntax(Through(k, c.GetOrDefault()), k, c.GetOrDefault()))),
        Rule("health", "health ne43 | none | below 3.6 mA above 21 mA",
            k => (from below in Keyword("below")
                  from low in Quantity("above")
                  from high in Keyword("above").Then(_ => Quantity()).Optional()
                  select new HealthSyntax(Through(k, high.GetOrDefault() ?? low), k, below, low, high.GetOrDefault()))
                 .Or(from above in Keyword("above")
                     from high in Quantity()
                     select new HealthSyntax(Through(k, high), k, above, null, high))
                 .Or(Word.Select(w => new HealthSyntax(Through(k, w), k, w, null, null)))),
        Rule("on-fault", "on-fault hold | low | high | value 0.0",
            k => from action in Word
                 from value in action.Text == "value" ? NumberToken.Select(n => (NumberSyntax?)n) : Parse.Return((NumberSyntax?)null)
                 select new OnFaultSyntax(Through(k, (SyntaxNode?)value ?? action), k, action, value)),
        Rule("filter", "filter 2 s", QuantitySetting),
        Rule("measure", "measure flow | level | pressure | temperature | analysis | other",
            k => Word.Select(w => new MeasureSyntax(Through(k, w), k, w))),
        Rule("tolerance", "tolerance 0.5 %", QuantitySetting),
        Rule("alarm", "alarm HH 430 [priority 1] [deadband 2 %] [delay 5 s] [clear 10 s] [text \"...\"]",
            k => from kind in Word.Named("HH, H, L or LL")
                 from setpoint in NumberToken
                 from options in AlarmOption.Many()
                 let list = options.ToImmutableArray()
                 select new AlarmSyntax(Through(k, list.Length > 0 ? list[^1] : setpoint), k, kind, setpoint, list)),
        Rule("loop", "loop { supply 24 V ... }",
            k => Parse.Return(new LoopSyntax(k.Span, k, BlockSyntax.Empty(default))), hasBlock: true));

    public static readonly IReadOnlyDictionary<string, StatementRule> LoopBody = Rules(
        Rule("supply", "supply 24 V", QuantitySetting),
        Rule("device", "device 10.5 V", QuantitySetting),
        Rule("cable", "cable 450 m 1.0 mm2",
            k => from length in Quantity()
                 from size in Quantity()
                 select new CableSyntax(Through(k, size), k, length, size)),
        Rule("barrier", "barrier 280 ohm", QuantitySetting),
        Rule("extra", "extra 0 ohm", QuantitySetting),
        Rule("hart", "hart",
            k => Parse.Return(new FlagSyntax(k.Span, k))),
        Rule("current", "current 20 mA", QuantitySetting));

    private static IReadOnlyDictionary<string, StatementRule> Rules(params StatementRule[] rules) =>
        rules.ToDictionary(r => r.Keyword, StringComparer.Ordinal);
}
