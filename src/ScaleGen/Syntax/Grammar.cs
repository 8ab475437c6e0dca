using System.Collections.Immutable;
using Sprache;
using ScaleGen.Text;

namespace ScaleGen.Syntax;

/// <summary>
/// The Sprache grammar of one statement. Statements are parsed one at a time (the
/// <see cref="StatementScanner"/> finds their bounds), dispatched on the keyword, so no
/// statement parser ever backtracks across another's keyword.
/// </summary>
/// <remarks>
/// Speed (docs/performance.md): Sprache's character parsers allocate an input and a result
/// for every character, which made reading a large plant many times slower than reading
/// the same points as JSON. The tokens (words, numbers, strings, units, blanks) are
/// therefore hand-written parsers that scan the text directly and allocate once per token;
/// Sprache combines tokens into statements. Every statement parser is built once, when
/// this class is loaded, and never per statement. Where a token fails is where the
/// Sprache version failed, so diagnostics point at the same place.
/// </remarks>
internal static class Grammar
{
    /// <summary>A failure message that starts with a code names a specific diagnostic.</summary>
    internal const string NotANumberMarker = "SG0013:";

    // ---- Reading the text -------------------------------------------------------------

    /// <summary>Where the statement being parsed ends (exclusive).</summary>
    private static int EndOf(IInput input) => input is SourceInput statement ? statement.End : input.Source.Length;

    /// <summary>The same input, moved on to an absolute position.</summary>
    private static IInput MoveTo(IInput input, int position)
    {
        if (input is SourceInput statement) return statement.At(position);
        var rest = input;
        while (rest.Position < position) rest = rest.Advance();
        return rest;
    }

    private static IResult<T> Fail<T>(IInput input, int position, string message, string[] expected) =>
        Result.Failure<T>(position == input.Position ? input : MoveTo(input, position), message, expected);

    // What a failing token expected, made once: failures are common (every optional unit that
    // is not there is one), and Sprache keeps the array with the failure.
    private static readonly string[] ExpectedNumber = { "number" };
    private static readonly string[] ExpectedString = { "a \"quoted string\"" };
    private static readonly string[] ExpectedUnit = { "unit" };

    /// <summary>A parser followed by blanks (spaces and tabs), which it skips.</summary>
    private static Parser<T> Token<T>(this Parser<T> parser) => input =>
    {
        var result = parser(input);
        if (!result.WasSuccessful) return result;
        var rest = result.Remainder;
        var next = Tokens.SkipBlanks(rest.Source, rest.Position, EndOf(rest));
        return next == rest.Position ? result : Result.Success(result.Value, MoveTo(rest, next));
    };

    // ---- Tokens: Sprache parsers over the scanning functions of Tokens ------------------

    /// <summary>A letter, then letters, digits, '_' and '-'; blanks after it are skipped.</summary>
    internal static readonly Parser<WordSyntax> Word = WordToken("word");

    /// <summary>A word; <paramref name="expected"/> names what a failure expected.</summary>
    private static Parser<WordSyntax> WordToken(string expected) => WordToken(new[] { expected });

    private static Parser<WordSyntax> WordToken(string[] expected) => input =>
    {
        var text = input.Source;
        var start = input.Position;
        var end = EndOf(input);
        var stop = Tokens.ScanWord(text, start, end);
        if (stop == start) return Fail<WordSyntax>(input, start, "expected a word", expected);
        var word = new WordSyntax(new TextSpan(start, stop - start), Words.Get(text, start, stop - start));
        return Result.Success(word, MoveTo(input, Tokens.SkipBlanks(text, stop, end)));
    };

    /// <summary>One of the given words; any other word fails where it starts.</summary>
    private static Parser<WordSyntax> OneOf(string expected, params string[] words)
    {
        var expectations = new[] { expected };
        var word = WordToken(expectations);
        return input =>
        {
            var result = word(input);
            if (result.WasSuccessful && Array.IndexOf(words, result.Value.Text) < 0)
                return Fail<WordSyntax>(input, input.Position, "unexpected word", expectations);
            return result;
        };
    }

    private static Parser<WordSyntax> Keyword(string text) => OneOf($"'{text}'", text);

    /// <summary>
    /// A number and the blanks after it. NaN, Infinity, hex and numbers too large for a
    /// double fail with <see cref="NotANumberMarker"/>, so they get their own diagnostic.
    /// </summary>
    private static readonly Parser<NumberSyntax> NumberToken = input =>
    {
        var text = input.Source;
        var start = input.Position;
        var end = EndOf(input);
        switch (Tokens.ScanNumber(text, start, end, out var stop, out var value, out var problem))
        {
            case Tokens.NumberScan.NotANumber:
                return Fail<NumberSyntax>(input, start, NotANumberMarker + problem, ExpectedNumber);
            case Tokens.NumberScan.None:
                return Fail<NumberSyntax>(input, start, "expected a number", ExpectedNumber);
        }
        var number = new NumberSyntax(new TextSpan(start, stop - start), value, Words.Get(text, start, stop - start));
        return Result.Success(number, MoveTo(input, Tokens.SkipBlanks(text, stop, end)));
    };

    /// <summary>A double-quoted string and the blanks after it. An unclosed string fails where the closing quote should be.</summary>
    private static readonly Parser<StringSyntax> QuotedString = input =>
    {
        var text = input.Source;
        var start = input.Position;
        var end = EndOf(input);
        if (!Tokens.ScanString(text, start, end, out var stop))
            return Fail<StringSyntax>(input, stop, stop == start ? "expected a quoted string" : "expected '\"'", ExpectedString);
        return Result.Success(new StringSyntax(TextSpan.FromBounds(start, stop), Tokens.StringValue(text, start, stop)),
            MoveTo(input, Tokens.SkipBlanks(text, stop, end)));
    };

    /// <summary>
    /// A unit: any run of characters but white space, braces, '#', ';' and '"', or a quoted
    /// string. It may not start like a number or like '..', and words that the statement
    /// itself uses as keywords are never taken as a unit.
    /// </summary>
    private static Parser<UnitSyntax> Unit(params string[] notUnits) => input =>
    {
        var text = input.Source;
        var start = input.Position;
        var end = EndOf(input);
        if (start < end && text[start] == '"')
        {
            var quoted = QuotedString(input);
            return quoted.WasSuccessful
                ? Result.Success(new UnitSyntax(quoted.Value.Span, quoted.Value.Value, true), quoted.Remainder)
                : Result.Failure<UnitSyntax>(quoted.Remainder, quoted.Message, quoted.Expectations);
        }
        var stop = Tokens.ScanUnitWord(text, start, end);
        if (stop == start) return Fail<UnitSyntax>(input, start, "expected a unit", ExpectedUnit);
        var unit = Words.Get(text, start, stop - start);
        if (Array.IndexOf(notUnits, unit) >= 0) return Fail<UnitSyntax>(input, start, "a keyword of the statement, not a unit", ExpectedUnit);
        return Result.Success(new UnitSyntax(new TextSpan(start, stop - start), unit, false), MoveTo(input, Tokens.SkipBlanks(text, stop, end)));
    };

    /// <summary>Fixed text such as '..'; fails at the first character that differs. Blanks after it are skipped.</summary>
    private static Parser<string> Literal(string literal)
    {
        var expected = new[] { $"'{literal}'" };
        var message = $"expected '{literal}'";
        return input =>
        {
            var text = input.Source;
            var i = input.Position;
            var end = EndOf(input);
            foreach (var c in literal)
            {
                if (i >= end || text[i] != c) return Fail<string>(input, i, message, expected);
                i++;
            }
            return Result.Success(literal, MoveTo(input, Tokens.SkipBlanks(text, i, end)));
        };
    }

    private static readonly Parser<string> Dots = Literal("..");

    private static Parser<QuantitySyntax> Quantity(params string[] notUnits) =>
        NumberToken.Then(Unit(notUnits).Maybe(), (number, unit) =>
            new QuantitySyntax(TextSpan.FromBounds(number.Span.Start, unit?.Span.End ?? number.Span.End), number, unit));

    private static Parser<RangeSyntax> Range(params string[] notUnits) =>
        NumberToken.Then(Dots, NumberToken, Unit(notUnits).Maybe(), (low, _, high, unit) =>
            new RangeSyntax(TextSpan.FromBounds(low.Span.Start, unit?.Span.End ?? high.Span.End), low, high, unit));

    // ---- Statements -----------------------------------------------------------------

    /// <summary>
    /// How one keyword's statement is parsed, and what it must look like. <see cref="Arguments"/>
    /// reads what follows the keyword and returns how to make the statement from the keyword;
    /// it is the grammar, and it reports every error. <see cref="Direct"/> reads the same
    /// statement through a <see cref="FastReader"/>, or gives up with null (see there).
    /// </summary>
    internal sealed record StatementRule(string Keyword, Parser<Func<WordSyntax, StatementSyntax>> Arguments,
        Func<FastReader, WordSyntax, StatementSyntax?> Direct, string Usage, bool HasBlock = false);

    private static StatementRule Rule<T>(string keyword, string usage, Parser<Func<WordSyntax, T>> arguments,
        Func<FastReader, WordSyntax, T?> direct, bool hasBlock = false)
        where T : StatementSyntax =>
        new(keyword, arguments, direct, usage, hasBlock);

    /// <summary>Gives a statement's constructor its type, so the grammar's lambdas infer.</summary>
    private static Func<WordSyntax, T> Make<T>(Func<WordSyntax, T> make) => make;

    private static TextSpan Through(WordSyntax keyword, SyntaxNode? last) =>
        TextSpan.FromBounds(keyword.Span.Start, last?.Span.End ?? keyword.Span.End);

    private static readonly string[] NoWords = [];

    private static readonly Parser<Func<WordSyntax, QuantitySettingSyntax>> QuantitySetting =
        Quantity().Map(q => Make(k => new QuantitySettingSyntax(Through(k, q), k, q)));

    private static QuantitySettingSyntax? DirectQuantitySetting(FastReader r, WordSyntax k) =>
        r.Quantity(NoWords) is { } q ? new QuantitySettingSyntax(Through(k, q), k, q) : null;

    private static readonly Parser<Func<WordSyntax, RangeSettingSyntax>> RangeSetting =
        Range().Map(r => Make(k => new RangeSettingSyntax(Through(k, r), k, r)));

    private static RangeSettingSyntax? DirectRangeSetting(FastReader r, WordSyntax k) =>
        r.Range(NoWords) is { } range ? new RangeSettingSyntax(Through(k, range), k, range) : null;

    private static readonly Parser<WordSyntax> DeclarationName = WordToken("a name");

    private static readonly Parser<WordSyntax?> UsesClause = Keyword("uses").Then(DeclarationName, (_, name) => name).Maybe();

    /// <summary>A name, and the profile after 'uses' if there is one. False when the clause is broken.</summary>
    private static bool DirectNameAndUses(FastReader r, out WordSyntax name, out WordSyntax? uses)
    {
        uses = null;
        name = r.Word()!;
        if (name is null) return false;
        if (r.AtEnd) return true;
        return r.Keyword("uses") is not null && (uses = r.Word()) is not null;
    }

    private static readonly string[] AlarmOptionWords = { "priority", "deadband", "delay", "clear", "text" };

    private static readonly Parser<(QuantitySyntax? Quantity, StringSyntax? Text, int End)> AlarmText =
        QuotedString.Map(s => ((QuantitySyntax?)null, (StringSyntax?)s, s.Span.End));

    private static readonly Parser<(QuantitySyntax? Quantity, StringSyntax? Text, int End)> AlarmQuantity =
        Quantity(AlarmOptionWords).Map(q => ((QuantitySyntax?)q, (StringSyntax?)null, q.Span.End));

    private static readonly Parser<AlarmOptionSyntax> AlarmOption =
        OneOf("priority, deadband, delay, clear or text", AlarmOptionWords).Then(
            name => name.Text == "text" ? AlarmText : AlarmQuantity,
            (name, value) => new AlarmOptionSyntax(TextSpan.FromBounds(name.Span.Start, value.End), name, value.Quantity, value.Text));

    private static AlarmSyntax? DirectAlarm(FastReader r, WordSyntax k)
    {
        if (r.Word() is not { } kind || r.Number() is not { } setpoint) return null;
        ImmutableArray<AlarmOptionSyntax>.Builder? options = null;
        while (!r.AtEnd)
        {
            if (r.Word() is not { } name || Array.IndexOf(AlarmOptionWords, name.Text) < 0) return null;
            AlarmOptionSyntax option;
            if (name.Text == "text")
            {
                if (r.String() is not { } text) return null;
                option = new AlarmOptionSyntax(TextSpan.FromBounds(name.Span.Start, text.Span.End), name, null, text);
            }
            else
            {
                if (r.Quantity(AlarmOptionWords) is not { } quantity) return null;
                option = new AlarmOptionSyntax(TextSpan.FromBounds(name.Span.Start, quantity.Span.End), name, quantity, null);
            }
            (options ??= ImmutableArray.CreateBuilder<AlarmOptionSyntax>()).Add(option);
        }
        var list = options is null ? ImmutableArray<AlarmOptionSyntax>.Empty : options.ToImmutable();
        return new AlarmSyntax(Through(k, list.Length > 0 ? list[^1] : setpoint), k, kind, setpoint, list);
    }

    private static HealthSyntax? DirectHealth(FastReader r, WordSyntax k)
    {
        if (r.Word() is not { } mode) return null;
        switch (mode.Text)
        {
            case "below":
                if (r.Quantity(AboveWord) is not { } low) return null;
                QuantitySyntax? high = null;
                if (!r.AtEnd && (r.Keyword("above") is null || (high = r.Quantity(NoWords)) is null)) return null;
                return new HealthSyntax(Through(k, high ?? low), k, mode, low, high);
            case "above":
                return r.Quantity(NoWords) is { } above ? new HealthSyntax(Through(k, above), k, mode, null, above) : null;
            default:
                return new HealthSyntax(Through(k, mode), k, mode, null, null);
        }
    }

    private static readonly string[] AboveWord = { "above" };

    private static readonly Parser<NumberSyntax?> OnFaultValue = NumberToken;

    private static readonly Parser<NumberSyntax?> NoValue = Parse.Return((NumberSyntax?)null);

    public static readonly IReadOnlyDictionary<string, StatementRule> TopLevel = Rules(
        Rule("plant", "plant \"Title of the plant\"",
            QuotedString.Map(s => Make(k => new PlantTitleSyntax(Through(k, s), k, s))),
            (r, k) => r.String() is { } s ? new PlantTitleSyntax(Through(k, s), k, s) : null),
        Rule("cycle", "cycle 100 ms",
            Quantity().Map(q => Make(k => new CycleSyntax(Through(k, q), k, q))),
            (r, k) => r.Quantity(NoWords) is { } q ? new CycleSyntax(Through(k, q), k, q) : null),
        Rule("card", "card NAME { ... }",
            DeclarationName.Map(n => Make(k => new CardSyntax(Through(k, n), k, n, BlockSyntax.Empty(default)))),
            (r, k) => r.Word() is { } n ? new CardSyntax(Through(k, n), k, n, BlockSyntax.Empty(default)) : null, hasBlock: true),
        Rule("profile", "profile NAME [uses PROFILE] { ... }",
            DeclarationName.Then(UsesClause, (n, u) => Make(k => new ProfileSyntax(Through(k, u ?? n), k, n, u, BlockSyntax.Empty(default)))),
            (r, k) => DirectNameAndUses(r, out var n, out var u) ? new ProfileSyntax(Through(k, u ?? n), k, n, u, BlockSyntax.Empty(default)) : null,
            hasBlock: true),
        Rule("point", "point TAG [uses PROFILE] { ... }",
            DeclarationName.Then(UsesClause, (n, u) => Make(k => new PointSyntax(Through(k, u ?? n), k, n, u, BlockSyntax.Empty(default)))),
            (r, k) => DirectNameAndUses(r, out var n, out var u) ? new PointSyntax(Through(k, u ?? n), k, n, u, BlockSyntax.Empty(default)) : null,
            hasBlock: true));

    private static readonly string[] AtWord = { "at" };

    public static readonly IReadOnlyDictionary<string, StatementRule> CardBody = Rules(
        Rule("counts", "counts 0 .. 27648 at 4 .. 20 mA",
            Range("at").Then(Keyword("at"), Range(), (raw, _, electrical) => Make(k => new CountsSyntax(Through(k, electrical), k, raw, electrical))),
            (r, k) => r.Range(AtWord) is { } raw && r.Keyword("at") is not null && r.Range(NoWords) is { } electrical
                ? new CountsSyntax(Through(k, electrical), k, raw, electrical) : null),
        Rule("limits", "limits -4864 .. 32511",
            Range().Map(r => Make(k => new LimitsSyntax(Through(k, r), k, r))),
            (r, k) => r.Range(NoWords) is { } range ? new LimitsSyntax(Through(k, range), k, range) : null),
        Rule("fault-code", "fault-code 32767[, 32767...]",
            NumberToken.DelimitedBy(Parse.Char(',').Token())
                .Map(codes => codes.ToImmutableArray())
                .Map(codes => Make(k => new FaultCodeSyntax(Through(k, codes[^1]), k, codes))),
            (r, k) =>
            {
                var codes = ImmutableArray.CreateBuilder<NumberSyntax>();
                do
                {
                    if (r.Number() is not { } code) return null;
                    codes.Add(code);
                } while (r.Literal(","));
                return new FaultCodeSyntax(Through(k, codes[^1]), k, codes.ToImmutable());
            }),
        Rule("type", "type INT|DINT|UINT",
            Word.Map(w => Make(k => new RawTypeSyntax(Through(k, w), k, w))),
            (r, k) => r.Word() is { } w ? new RawTypeSyntax(Through(k, w), k, w) : null),
        Rule("input", "input 250 ohm", QuantitySetting, DirectQuantitySetting));

    public static readonly IReadOnlyDictionary<string, StatementRule> PointBody = Rules(
        Rule("desc", "desc \"Raw water inlet flow\"",
            QuotedString.Map(s => Make(k => new DescriptionSyntax(Through(k, s), k, s))),
            (r, k) => r.String() is { } s ? new DescriptionSyntax(Through(k, s), k, s) : null),
        Rule("card", "card AI16 at \"R1.S2.C0\"",
            DeclarationName.Then(Keyword("at").Then(QuotedString, (_, s) => s).Maybe(),
                (card, address) => Make(k => new CardReferenceSyntax(Through(k, (SyntaxNode?)address ?? card), k, card, address))),
            (r, k) =>
            {
                if (r.Word() is not { } card) return null;
                StringSyntax? address = null;
                if (!r.AtEnd && (r.Keyword("at") is null || (address = r.String()) is null)) return null;
                return new CardReferenceSyntax(Through(k, (SyntaxNode?)address ?? card), k, card, address);
            }),
        Rule("signal", "signal 4 .. 20 mA", RangeSetting, DirectRangeSetting),
        Rule("shunt", "shunt 250 ohm", QuantitySetting, DirectQuantitySetting),
        Rule("range", "range 0 .. 450 m3/h", RangeSetting, DirectRangeSetting),
        Rule("sqrt", "sqrt cutoff 1 %",
            Keyword("cutoff").Then(Quantity(), (_, q) => q).Maybe()
                .Map(c => Make(k => new SqrtSyntax(Through(k, c), k, c))),
            (r, k) =>
            {
                QuantitySyntax? cutoff = null;
                if (!r.AtEnd && (r.Keyword("cutoff") is null || (cutoff = r.Quantity(NoWords)) is null)) return null;
                return new SqrtSyntax(Through(k, cutoff), k, cutoff);
            }),
        Rule("health", "health ne43 | none | below 3.6 mA above 21 mA",
            Keyword("below").Then(Quantity("above"), Keyword("above").Then(Quantity(), (_, q) => q).Maybe(),
                    (below, low, high) => Make(k => new HealthSyntax(Through(k, high ?? low), k, below, low, high)))
                .Or(Keyword("above").Then(Quantity(), (above, high) => Make(k => new HealthSyntax(Through(k, high), k, above, null, high))))
                .Or(Word.Map(w => Make(k => new HealthSyntax(Through(k, w), k, w, null, null)))),
            DirectHealth),
        Rule("on-fault", "on-fault hold | low | high | value 0.0",
            Word.Then(action => action.Text == "value" ? OnFaultValue : NoValue,
                (action, value) => Make(k => new OnFaultSyntax(Through(k, (SyntaxNode?)value ?? action), k, action, value))),
            (r, k) =>
            {
                if (r.Word() is not { } action) return null;
                NumberSyntax? value = null;
                if (action.Text == "value" && (value = r.Number()) is null) return null;
                return new OnFaultSyntax(Through(k, (SyntaxNode?)value ?? action), k, action, value);
            }),
        Rule("filter", "filter 2 s", QuantitySetting, DirectQuantitySetting),
        Rule("measure", "measure flow | level | pressure | temperature | analysis | other",
            Word.Map(w => Make(k => new MeasureSyntax(Through(k, w), k, w))),
            (r, k) => r.Word() is { } w ? new MeasureSyntax(Through(k, w), k, w) : null),
        Rule("tolerance", "tolerance 0.5 %", QuantitySetting, DirectQuantitySetting),
        Rule("alarm", "alarm HH 430 [priority 1] [deadband 2 %] [delay 5 s] [clear 10 s] [text \"...\"]",
            WordToken("HH, H, L or LL").Then(NumberToken, AlarmOption.Repeated(),
                (kind, setpoint, options) => Make(k => new AlarmSyntax(Through(k, options.Length > 0 ? options[^1] : setpoint), k, kind, setpoint, options))),
            DirectAlarm),
        Rule("loop", "loop { supply 24 V ... }",
            Parse.Return(Make(k => new LoopSyntax(k.Span, k, BlockSyntax.Empty(default)))),
            (_, k) => new LoopSyntax(k.Span, k, BlockSyntax.Empty(default)), hasBlock: true));

    public static readonly IReadOnlyDictionary<string, StatementRule> LoopBody = Rules(
        Rule("supply", "supply 24 V", QuantitySetting, DirectQuantitySetting),
        Rule("device", "device 10.5 V", QuantitySetting, DirectQuantitySetting),
        Rule("cable", "cable 450 m 1.0 mm2",
            Quantity().Then(Quantity(), (length, size) => Make(k => new CableSyntax(Through(k, size), k, length, size))),
            (r, k) => r.Quantity(NoWords) is { } length && r.Quantity(NoWords) is { } size ? new CableSyntax(Through(k, size), k, length, size) : null),
        Rule("barrier", "barrier 280 ohm", QuantitySetting, DirectQuantitySetting),
        Rule("extra", "extra 0 ohm", QuantitySetting, DirectQuantitySetting),
        Rule("hart", "hart",
            Parse.Return(Make(k => new FlagSyntax(k.Span, k))),
            (_, k) => new FlagSyntax(k.Span, k)),
        Rule("current", "current 20 mA", QuantitySetting, DirectQuantitySetting));

    private static IReadOnlyDictionary<string, StatementRule> Rules(params StatementRule[] rules) =>
        rules.ToDictionary(r => r.Keyword, StringComparer.Ordinal);
}
