using System.Collections.Immutable;
using System.Globalization;
using System.Runtime.InteropServices;
using Sprache;
using ScaleGen.Text;

namespace ScaleGen.Syntax;

/// <summary>
/// Parses one file into a <see cref="CompilationUnitSyntax"/>. A statement with an error is
/// reported and skipped; parsing goes on with the next statement or block, so one run
/// reports every mistake in the file.
/// </summary>
public static class SyntaxParser
{
    private sealed record Context(string Name, IReadOnlyDictionary<string, Grammar.StatementRule> Rules);

    private static readonly Context TopLevel = new("the top level", Grammar.TopLevel);
    private static readonly Context CardBody = new("a card", Grammar.CardBody);
    private static readonly Context PointBody = new("a point or profile", Grammar.PointBody);
    private static readonly Context LoopBody = new("a loop block", Grammar.LoopBody);
    private static readonly Context[] AllContexts = { TopLevel, CardBody, PointBody, LoopBody };

    /// <summary>Below this many top-level statements a file is parsed on one thread: starting others costs more.</summary>
    private const int ParallelThreshold = 256;

    public static CompilationUnitSyntax Parse(SourceText source, DiagnosticBag diagnostics) => Parse(source, diagnostics, direct: true);

    /// <summary>
    /// The parse, with a switch for tests: <paramref name="direct"/> false parses every
    /// statement with the Sprache grammar alone, which must give the same tree.
    /// </summary>
    internal static CompilationUnitSyntax Parse(SourceText source, DiagnosticBag diagnostics, bool direct)
    {
        var top = new StatementScanner(source, diagnostics).Scan();
        var statements = ParseTopLevel(source, top.Statements, diagnostics, direct);
        if (top.Statements.Count == 0)
            diagnostics.Report(DiagnosticCatalog.EmptyFile, source, new TextSpan(0, 0),
                "this file declares nothing: add a card, profile or point, or leave it off the command line");
        return new CompilationUnitSyntax(source, statements, top.TrailingComments.ToImmutableArray());
    }

    /// <summary>
    /// Parses every file, the files and the top-level declarations of large files in
    /// parallel. The result is the same as parsing one after another: units in file order,
    /// and diagnostics collected in file and statement order.
    /// </summary>
    public static ImmutableArray<CompilationUnitSyntax> ParseAll(IReadOnlyList<SourceText> sources, DiagnosticBag diagnostics)
    {
        if (sources.Count == 1) return [Parse(sources[0], diagnostics)];
        var units = new CompilationUnitSyntax[sources.Count];
        var bags = new DiagnosticBag[sources.Count];
        Parallel.For(0, sources.Count, i =>
        {
            bags[i] = new DiagnosticBag();
            units[i] = Parse(sources[i], bags[i]);
        });
        foreach (var bag in bags) diagnostics.AddRange(bag);
        return [.. units];
    }

    /// <summary>
    /// The top-level statements, in parallel chunks when there are many. A statement's parse
    /// depends only on its own text, so the chunks are independent; each reports into its
    /// own bag, and the bags are added in chunk order.
    /// </summary>
    private static ImmutableArray<StatementSyntax> ParseTopLevel(SourceText source, List<RawStatement> raws, DiagnosticBag diagnostics, bool direct)
    {
        if (raws.Count < ParallelThreshold || Environment.ProcessorCount == 1)
            return new Reader(source, diagnostics, direct).ParseStatements(raws, TopLevel);

        var parsed = new StatementSyntax[raws.Count];
        var chunkSize = Math.Max(32, raws.Count / (Environment.ProcessorCount * 8));
        var bags = new DiagnosticBag[(raws.Count + chunkSize - 1) / chunkSize];
        Parallel.For(0, bags.Length, chunk =>
        {
            var bag = new DiagnosticBag();
            var reader = new Reader(source, bag, direct);
            for (var i = chunk * chunkSize; i < Math.Min(raws.Count, (chunk + 1) * chunkSize); i++)
                parsed[i] = reader.ParseWithTrivia(raws[i], TopLevel);
            bags[chunk] = bag;
        });
        foreach (var bag in bags) diagnostics.AddRange(bag);
        return ImmutableCollectionsMarshal.AsImmutableArray(parsed);
    }

    private sealed class Reader(SourceText source, DiagnosticBag diagnostics, bool direct)
    {
        private readonly string _text = source.Text;
        private readonly FastReader _reader = new();

        public ImmutableArray<StatementSyntax> ParseStatements(List<RawStatement> raws, Context context)
        {
            var builder = ImmutableArray.CreateBuilder<StatementSyntax>(raws.Count);
            foreach (var raw in raws) builder.Add(ParseWithTrivia(raw, context));
            return builder.MoveToImmutable();
        }

        public StatementSyntax ParseWithTrivia(RawStatement raw, Context context)
        {
            var statement = ParseStatement(raw, context);
            // Most statements have no comments: they keep the shared empty trivia, uncopied.
            if (raw.LeadingComments.Count == 0 && raw.TrailingComment is null && !raw.BlankLineBefore) return statement;
            return statement with
            {
                Trivia = new Trivia(raw.LeadingComments.ToImmutableArray(), raw.TrailingComment, raw.BlankLineBefore),
            };
        }

        /// <summary>
        /// A statement that was reported stays in the tree as an <see cref="ErrorStatementSyntax"/>:
        /// the binder then knows its block is incomplete and does not add "missing range" and
        /// the like on top of the real mistake.
        /// </summary>
        private StatementSyntax ParseStatement(RawStatement raw, Context context)
        {
            var rawSpan = TextSpan.FromBounds(raw.Start, raw.End);
            if (raw.Broken) return new ErrorStatementSyntax(rawSpan, new WordSyntax(new TextSpan(raw.Start, 0), ""));
            _reader.Reset(_text, raw.Start, raw.End);
            var keyword = _reader.Word();
            if (keyword is null)
            {
                ReportBadStart(raw);
                return new ErrorStatementSyntax(rawSpan, new WordSyntax(new TextSpan(raw.Start, 0), ""));
            }
            if (!context.Rules.TryGetValue(keyword.Text, out var rule))
            {
                ReportUnknownKeyword(keyword, context);
                return new ErrorStatementSyntax(rawSpan, keyword);
            }

            // The direct reader takes the well-formed statement; anything else goes to the
            // Sprache grammar, which says what is wrong.
            var arguments = _reader.Position;
            var statement = direct ? rule.Direct(_reader, keyword) : null;
            if (statement is null || !_reader.AtEnd)
            {
                var result = rule.Arguments(new SourceInput(_text, arguments, raw.End));
                if (!result.WasSuccessful)
                {
                    ReportFailure(rule, result.Remainder.Position, raw.End, result.Message);
                    return new ErrorStatementSyntax(rawSpan, keyword);
                }
                if (!result.Remainder.AtEnd)
                {
                    ReportFailure(rule, result.Remainder.Position, raw.End, null, trailing: true);
                    return new ErrorStatementSyntax(rawSpan, keyword);
                }
                statement = result.Value(keyword);
            }
            if (rule.HasBlock)
            {
                if (raw.Block is null)
                {
                    diagnostics.Report(DiagnosticCatalog.MissingBlock, source, keyword.Span,
                        $"'{keyword.Text}' needs a block: write '{rule.Usage}' with '{{' on the same line");
                    return new ErrorStatementSyntax(rawSpan, keyword);
                }
                statement = AttachBlock(statement, raw.Block);
            }
            else if (raw.Block is not null)
            {
                diagnostics.Report(DiagnosticCatalog.UnexpectedBlock, source, new TextSpan(raw.Block.OpenBrace, 1),
                    $"'{keyword.Text}' takes no block: remove the braces, or end the statement before '{{'");
                return new ErrorStatementSyntax(rawSpan, keyword);
            }

            CheckNames(statement);
            return statement;
        }

        private StatementSyntax AttachBlock(StatementSyntax statement, RawBlock raw)
        {
            var childContext = statement switch
            {
                CardSyntax => CardBody,
                LoopSyntax => LoopBody,
                _ => PointBody,
            };
            var end = raw.CloseBrace >= 0 ? raw.CloseBrace + 1 : _text.Length;
            var block = new BlockSyntax(TextSpan.FromBounds(raw.OpenBrace, end),
                ParseStatements(raw.Statements, childContext), raw.TrailingComments.ToImmutableArray());
            var span = TextSpan.FromBounds(statement.Span.Start, end);
            return statement switch
            {
                CardSyntax card => card with { Block = block, Span = span },
                ProfileSyntax profile => profile with { Block = block, Span = span },
                PointSyntax point => point with { Block = block, Span = span },
                LoopSyntax loop => loop with { Block = block, Span = span },
                _ => statement,
            };
        }

        private void CheckNames(StatementSyntax statement)
        {
            // Tags may contain '-' as instrument tags do; card and profile names may not.
            WordSyntax? name = statement switch
            {
                CardSyntax card => card.Name,
                ProfileSyntax profile => profile.Name,
                _ => null,
            };
            if (name is not null && name.Text.Contains('-'))
                diagnostics.Report(DiagnosticCatalog.InvalidName, source, name.Span,
                    $"'{name.Text}' is not a valid name: names use letters, digits and '_' (write '{name.Text.Replace('-', '_')}')");

            // The grammar reads any letter so that a name like 'FİT-101' gets this message rather
            // than a puzzling "unexpected text"; IEC 61131-3 identifiers are ASCII only.
            var declared = statement is DeclarationSyntax declaration ? declaration.Name : null;
            if (declared is not null && declared.Text.FirstOrDefault(c => !char.IsAscii(c)) is var other and not '\0')
                diagnostics.Report(DiagnosticCatalog.InvalidName, source, declared.Span,
                    $"'{declared.Text}' contains '{other}' ({Describe(other)}): names and tags use only the letters A-Z and a-z, digits, '_' (and '-' in tags)");
        }

        private void ReportBadStart(RawStatement raw)
        {
            var c = _text[raw.Start];
            var span = new TextSpan(raw.Start, 1);
            if (IsInvalidCharacter(c))
                diagnostics.Report(DiagnosticCatalog.InvalidCharacter, source, span, InvalidCharacterMessage(c, atStart: true));
            else
                diagnostics.Report(DiagnosticCatalog.UnknownKeyword, source, span,
                    $"expected a keyword at the start of the statement, found '{Excerpt(raw.Start, raw.End)}'");
        }

        private void ReportUnknownKeyword(WordSyntax keyword, Context context)
        {
            var word = keyword.Text;
            string message;
            var home = AllContexts.FirstOrDefault(c => c != context && c.Rules.ContainsKey(word));
            if (home is not null)
                message = $"'{word}' belongs in {home.Name}, not in {context.Name}: move it there";
            else if (word is "priority" or "deadband" or "delay" or "clear" or "text")
                message = $"'{word}' is an option of an alarm: write it on the alarm's line, e.g. 'alarm H 400 {word} ...'";
            else
            {
                var suggestion = Suggest(word, context.Rules.Keys);
                message = suggestion is not null
                    ? $"unknown keyword '{word}' in {context.Name}: did you mean '{suggestion}'?"
                    : $"unknown keyword '{word}' in {context.Name}: expected one of {string.Join(", ", context.Rules.Keys)}";
            }
            diagnostics.Report(DiagnosticCatalog.UnknownKeyword, source, keyword.Span, message);
        }

        private void ReportFailure(Grammar.StatementRule rule, int position, int end, string? message, bool trailing = false)
        {
            var span = new TextSpan(Math.Min(position, Math.Max(end - 1, 0)), position < end ? 1 : 0);
            if (message is not null && message.StartsWith(Grammar.NotANumberMarker, StringComparison.Ordinal))
            {
                diagnostics.Report(DiagnosticCatalog.NotANumber, source, new TextSpan(position, 1), message[Grammar.NotANumberMarker.Length..]);
                return;
            }
            if (position < end && _text[position] == ',' && position > 0 && char.IsDigit(_text[position - 1])
                && position + 1 < end && char.IsDigit(_text[position + 1]))
            {
                var number = DecimalCommaNumber(position);
                diagnostics.Report(DiagnosticCatalog.DecimalComma, source, new TextSpan(position, 1),
                    $"decimal comma in '{number}': numbers use a decimal point, write '{number.Replace(',', '.')}'");
                return;
            }
            if (position < end && IsInvalidCharacter(_text[position]))
            {
                diagnostics.Report(DiagnosticCatalog.InvalidCharacter, source, span, InvalidCharacterMessage(_text[position], atStart: false));
                return;
            }
            if (position >= end)
            {
                diagnostics.Report(DiagnosticCatalog.MalformedStatement, source, new TextSpan(end, 0),
                    $"'{rule.Keyword}' is incomplete: write it as '{rule.Usage}'");
                return;
            }
            var found = Excerpt(position, end);
            diagnostics.Report(trailing ? DiagnosticCatalog.TrailingText : DiagnosticCatalog.MalformedStatement, source, span,
                trailing
                    ? $"unexpected '{found}' after the '{rule.Keyword}' statement: remove it, or write '{rule.Usage}'"
                    : $"unexpected '{found}' in '{rule.Keyword}': write it as '{rule.Usage}'");
        }

        private string DecimalCommaNumber(int comma)
        {
            var start = comma;
            while (start > 0 && (char.IsDigit(_text[start - 1]) || _text[start - 1] == '-')) start--;
            var end = comma + 1;
            while (end < _text.Length && char.IsDigit(_text[end])) end++;
            return _text[start..end];
        }

        private string Excerpt(int start, int end)
        {
            var stop = start;
            while (stop < end && !char.IsWhiteSpace(_text[stop])) stop++;
            if (stop == start) stop = Math.Min(end, start + 1);
            var word = _text[start..stop];
            return word.Length > 30 ? word[..30] + "..." : word;
        }
    }

    /// <summary>
    /// Characters no token starts with: controls, U+FFFD (bytes that were not UTF-8), lone
    /// surrogates, invisible formats, and white space other than ' ' and tab, such as the
    /// no-break space a copy from a document brings along.
    /// </summary>
    internal static bool IsInvalidCharacter(char c) =>
        (char.IsControl(c) && c is not ('\t' or '\r' or '\n')) || c == '\uFFFD' || char.IsSurrogate(c)
        || (char.IsWhiteSpace(c) && c is not (' ' or '\t' or '\r' or '\n'))
        || char.GetUnicodeCategory(c) is UnicodeCategory.Format or UnicodeCategory.PrivateUse or UnicodeCategory.OtherNotAssigned;

    private static string InvalidCharacterMessage(char c, bool atStart) =>
        char.IsWhiteSpace(c) && !char.IsControl(c)
            ? $"character {Describe(c)} is a space but not a plain one: write ' ' or a tab instead"
            : $"character {Describe(c)} cannot appear here: remove it" + (atStart ? " (is the file text in UTF-8?)" : "");

    private static string Describe(char c) =>
        string.Create(CultureInfo.InvariantCulture, $"U+{(int)c:X4}");

    /// <summary>
    /// The nearest keyword for "did you mean": within one edit for words of up to five
    /// letters, two for longer ones. A wider net suggests nonsense ('kg' would become 'h').
    /// </summary>
    public static string? Suggest(string word, IEnumerable<string> candidates)
    {
        string? best = null;
        var bestDistance = (word.Length <= 5 ? 1 : 2) + 1;
        foreach (var candidate in candidates.OrderBy(c => c, StringComparer.Ordinal))
        {
            var distance = EditDistance(word.ToLowerInvariant(), candidate.ToLowerInvariant());
            if (distance < bestDistance)
            {
                best = candidate;
                bestDistance = distance;
            }
        }
        return best;
    }

    private static int EditDistance(string a, string b)
    {
        var previous = new int[b.Length + 1];
        var current = new int[b.Length + 1];
        for (var j = 0; j <= b.Length; j++) previous[j] = j;
        for (var i = 1; i <= a.Length; i++)
        {
            current[0] = i;
            for (var j = 1; j <= b.Length; j++)
            {
                var cost = a[i - 1] == b[j - 1] ? 0 : 1;
                current[j] = Math.Min(Math.Min(current[j - 1] + 1, previous[j] + 1), previous[j - 1] + cost);
                // Transposition ("rnage" for "range") counts as one edit.
                if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1])
                    current[j] = Math.Min(current[j], previous[j - 1]);
            }
            (previous, current) = (current, previous);
        }
        return previous[b.Length];
    }
}
