using System.Text;

namespace ScaleGen.Syntax;

/// <summary>
/// The canonical layout of a file: two-space indents, one statement a line, one space
/// between words, `lo .. hi unit` for ranges, a blank line between declarations, comments
/// kept where they were. Numbers keep the spelling the user gave them, so formatting
/// never changes a value.
/// </summary>
public static class Formatter
{
    private const string Indent = "  ";

    public static string Format(CompilationUnitSyntax unit)
    {
        var output = new StringBuilder();
        StatementSyntax? previous = null;
        foreach (var statement in unit.Statements)
        {
            var separate = previous is not null &&
                (statement is DeclarationSyntax || previous is DeclarationSyntax || statement.Trivia.BlankLineBefore);
            if (separate) output.Append('\n');
            WriteStatement(output, statement, 0);
            previous = statement;
        }
        if (unit.TrailingComments.Length > 0 && unit.Statements.Length > 0) output.Append('\n');
        WriteComments(output, unit.TrailingComments, "");
        return output.ToString();
    }

    private static void WriteStatement(StringBuilder output, StatementSyntax statement, int depth)
    {
        var indent = string.Concat(Enumerable.Repeat(Indent, depth));
        WriteComments(output, statement.Trivia.LeadingComments, indent, blankBeforeNext: true);
        output.Append(indent).Append(Line(statement));
        var block = statement switch
        {
            DeclarationSyntax declaration => declaration.Block,
            LoopSyntax loop => loop.Block,
            _ => null,
        };
        if (block is not null) output.Append(" {");
        if (statement.Trivia.TrailingComment is { } trailing) output.Append(' ').Append(trailing);
        output.Append('\n');
        if (block is null) return;

        var first = true;
        foreach (var child in block.Statements)
        {
            if (!first && child.Trivia.BlankLineBefore) output.Append('\n');
            WriteStatement(output, child, depth + 1);
            first = false;
        }
        WriteComments(output, block.TrailingComments, indent + Indent);
        output.Append(indent).Append('}').Append('\n');
    }

    private static void WriteComments(StringBuilder output, IEnumerable<string> lines, string indent, bool blankBeforeNext = false)
    {
        var wroteAny = false;
        var blankPending = false;
        foreach (var line in lines)
        {
            // A blank line separates comment paragraphs; none is written before the first or after the last.
            if (line.Length == 0)
            {
                blankPending = wroteAny;
                continue;
            }
            if (blankPending) output.Append('\n');
            output.Append(indent).Append(line).Append('\n');
            wroteAny = true;
            blankPending = false;
        }
        // Leading comments set apart from their statement by a blank line stay apart.
        if (blankPending && blankBeforeNext) output.Append('\n');
    }

    /// <summary>The statement's own words, without block or comments.</summary>
    public static string Line(StatementSyntax statement) => statement switch
    {
        PlantTitleSyntax s => $"plant {Quote(s.Title.Value)}",
        CycleSyntax s => $"cycle {Quantity(s.Time)}",
        CardSyntax s => $"card {s.Name.Text}",
        ProfileSyntax s => $"profile {s.Name.Text}{Uses(s.Uses)}",
        PointSyntax s => $"point {s.Name.Text}{Uses(s.Uses)}",
        CountsSyntax s => $"counts {Range(s.Raw)} at {Range(s.Electrical)}",
        LimitsSyntax s => $"limits {Range(s.Raw)}",
        FaultCodeSyntax s => $"fault-code {string.Join(", ", s.Codes.Select(c => c.Text))}",
        RawTypeSyntax s => $"type {s.Type.Text}",
        QuantitySettingSyntax s => $"{s.Keyword.Text} {Quantity(s.Quantity)}",
        DescriptionSyntax s => $"desc {Quote(s.Text.Value)}",
        CardReferenceSyntax s => s.Address is null ? $"card {s.Card.Text}" : $"card {s.Card.Text} at {Quote(s.Address.Value)}",
        RangeSettingSyntax s => $"{s.Keyword.Text} {Range(s.Range)}",
        SqrtSyntax s => s.Cutoff is null ? "sqrt" : $"sqrt cutoff {Quantity(s.Cutoff)}",
        HealthSyntax s => Health(s),
        OnFaultSyntax s => s.Value is null ? $"on-fault {s.Action.Text}" : $"on-fault {s.Action.Text} {s.Value.Text}",
        MeasureSyntax s => $"measure {s.Kind.Text}",
        AlarmSyntax s => $"alarm {s.Kind.Text} {s.Setpoint.Text}{string.Concat(s.Options.Select(o => " " + AlarmOption(o)))}",
        LoopSyntax => "loop",
        CableSyntax s => $"cable {Quantity(s.Length)} {Quantity(s.Size)}",
        FlagSyntax s => s.Keyword.Text,
        _ => throw new InvalidOperationException($"The formatter has no layout for {statement.GetType().Name}."),
    };

    private static string Health(HealthSyntax s)
    {
        if (s.Below is null && s.Above is null) return $"health {s.Mode.Text}";
        var builder = new StringBuilder("health");
        if (s.Below is not null) builder.Append(" below ").Append(Quantity(s.Below));
        if (s.Above is not null) builder.Append(" above ").Append(Quantity(s.Above));
        return builder.ToString();
    }

    private static string AlarmOption(AlarmOptionSyntax option) =>
        option.Text is not null ? $"text {Quote(option.Text.Value)}" : $"{option.Name.Text} {Quantity(option.Quantity!)}";

    private static string Uses(WordSyntax? uses) => uses is null ? "" : $" uses {uses.Text}";

    private static string Quantity(QuantitySyntax quantity) =>
        quantity.Unit is null ? quantity.Number.Text : $"{quantity.Number.Text} {Unit(quantity.Unit)}";

    private static string Range(RangeSyntax range) =>
        range.Unit is null ? $"{range.Low.Text} .. {range.High.Text}" : $"{range.Low.Text} .. {range.High.Text} {Unit(range.Unit)}";

    private static string Unit(UnitSyntax unit) => unit.Quoted ? Quote(unit.Text) : unit.Text;

    /// <summary>Writes a string literal: only '"' and '\' need escapes.</summary>
    public static string Quote(string value) =>
        "\"" + value.Replace("\\", "\\\\", StringComparison.Ordinal).Replace("\"", "\\\"", StringComparison.Ordinal) + "\"";
}
