using System.Collections.Immutable;
using ScaleGen.Text;

namespace ScaleGen.Syntax;

// The syntax tree: what the file says, with a span for every piece, before any name is
// resolved or any default applied. Comments are kept as trivia so that `fmt` can write
// them back.

/// <summary>
/// Comments and blank lines around a statement, kept for the formatter. Comments are kept
/// with their '#'; an empty entry among the leading comments is a blank line.
/// </summary>
public sealed record Trivia(ImmutableArray<string> LeadingComments, string? TrailingComment, bool BlankLineBefore)
{
    public static readonly Trivia None = new(ImmutableArray<string>.Empty, null, false);
}

public abstract record SyntaxNode(TextSpan Span);

// ---- Values -------------------------------------------------------------------------

/// <summary>A number as written; <see cref="Text"/> keeps the user's spelling for fmt.</summary>
public sealed record NumberSyntax(TextSpan Span, double Value, string Text) : SyntaxNode(Span);

/// <summary>A unit: a fixed electrical/time/length word, or an engineering unit (maybe quoted).</summary>
public sealed record UnitSyntax(TextSpan Span, string Text, bool Quoted) : SyntaxNode(Span);

/// <summary>A number with an optional unit: <c>4 mA</c>, <c>250ohm</c>, <c>2 %</c>, <c>5</c>.</summary>
public sealed record QuantitySyntax(TextSpan Span, NumberSyntax Number, UnitSyntax? Unit) : SyntaxNode(Span)
{
    public double Value => Number.Value;
}

/// <summary><c>lo .. hi unit</c>; the unit applies to both ends.</summary>
public sealed record RangeSyntax(TextSpan Span, NumberSyntax Low, NumberSyntax High, UnitSyntax? Unit) : SyntaxNode(Span);

public sealed record StringSyntax(TextSpan Span, string Value) : SyntaxNode(Span);

/// <summary>A bare word: a name, a tag or a fixed choice such as <c>ne43</c>.</summary>
public sealed record WordSyntax(TextSpan Span, string Text) : SyntaxNode(Span);

// ---- Statements -----------------------------------------------------------------------

/// <summary>Any statement: a keyword, its arguments, its trivia.</summary>
public abstract record StatementSyntax(TextSpan Span, WordSyntax Keyword) : SyntaxNode(Span)
{
    public Trivia Trivia { get; init; } = Trivia.None;
}

/// <summary>A statement whose keyword is unknown or whose form is wrong; kept so fmt can refuse.</summary>
public sealed record ErrorStatementSyntax(TextSpan Span, WordSyntax Keyword) : StatementSyntax(Span, Keyword);

// Top level
public sealed record PlantTitleSyntax(TextSpan Span, WordSyntax Keyword, StringSyntax Title) : StatementSyntax(Span, Keyword);
public sealed record CycleSyntax(TextSpan Span, WordSyntax Keyword, QuantitySyntax Time) : StatementSyntax(Span, Keyword);

/// <summary>The shared shape of card, profile and point: a header and a block of settings.</summary>
public abstract record DeclarationSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Name, WordSyntax? Uses, BlockSyntax Block)
    : StatementSyntax(Span, Keyword);

public sealed record CardSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Name, BlockSyntax Block)
    : DeclarationSyntax(Span, Keyword, Name, null, Block);
public sealed record ProfileSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Name, WordSyntax? Uses, BlockSyntax Block)
    : DeclarationSyntax(Span, Keyword, Name, Uses, Block);
public sealed record PointSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Name, WordSyntax? Uses, BlockSyntax Block)
    : DeclarationSyntax(Span, Keyword, Name, Uses, Block);

/// <summary>The statements between braces, and comments just before the closing brace.</summary>
public sealed record BlockSyntax(TextSpan Span, ImmutableArray<StatementSyntax> Statements, ImmutableArray<string> TrailingComments)
    : SyntaxNode(Span)
{
    public static BlockSyntax Empty(TextSpan span) => new(span, ImmutableArray<StatementSyntax>.Empty, ImmutableArray<string>.Empty);
}

// Card settings
public sealed record CountsSyntax(TextSpan Span, WordSyntax Keyword, RangeSyntax Raw, RangeSyntax Electrical) : StatementSyntax(Span, Keyword);
public sealed record LimitsSyntax(TextSpan Span, WordSyntax Keyword, RangeSyntax Raw) : StatementSyntax(Span, Keyword);
public sealed record FaultCodeSyntax(TextSpan Span, WordSyntax Keyword, ImmutableArray<NumberSyntax> Codes) : StatementSyntax(Span, Keyword);
public sealed record RawTypeSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Type) : StatementSyntax(Span, Keyword);

/// <summary>
/// A keyword followed by one quantity: card <c>input</c>, point <c>shunt</c>, <c>filter</c>,
/// <c>tolerance</c>, loop <c>supply</c>, <c>device</c>, <c>barrier</c>, <c>extra</c>, <c>current</c>.
/// </summary>
public sealed record QuantitySettingSyntax(TextSpan Span, WordSyntax Keyword, QuantitySyntax Quantity) : StatementSyntax(Span, Keyword);

// Point and profile settings
public sealed record DescriptionSyntax(TextSpan Span, WordSyntax Keyword, StringSyntax Text) : StatementSyntax(Span, Keyword);
public sealed record CardReferenceSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Card, StringSyntax? Address) : StatementSyntax(Span, Keyword);

/// <summary><c>signal</c> and <c>range</c>: a keyword and a range.</summary>
public sealed record RangeSettingSyntax(TextSpan Span, WordSyntax Keyword, RangeSyntax Range) : StatementSyntax(Span, Keyword);
public sealed record SqrtSyntax(TextSpan Span, WordSyntax Keyword, QuantitySyntax? Cutoff) : StatementSyntax(Span, Keyword);
public sealed record HealthSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Mode, QuantitySyntax? Below, QuantitySyntax? Above) : StatementSyntax(Span, Keyword);
public sealed record OnFaultSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Action, NumberSyntax? Value) : StatementSyntax(Span, Keyword);
public sealed record MeasureSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Kind) : StatementSyntax(Span, Keyword);

/// <summary>One option of an alarm: <c>priority 1</c>, <c>deadband 2 %</c>, <c>delay 5 s</c>, <c>clear 10 s</c>, <c>text "..."</c>.</summary>
public sealed record AlarmOptionSyntax(TextSpan Span, WordSyntax Name, QuantitySyntax? Quantity, StringSyntax? Text) : SyntaxNode(Span);
public sealed record AlarmSyntax(TextSpan Span, WordSyntax Keyword, WordSyntax Kind, NumberSyntax Setpoint, ImmutableArray<AlarmOptionSyntax> Options)
    : StatementSyntax(Span, Keyword);

public sealed record LoopSyntax(TextSpan Span, WordSyntax Keyword, BlockSyntax Block) : StatementSyntax(Span, Keyword);

// Loop settings
public sealed record CableSyntax(TextSpan Span, WordSyntax Keyword, QuantitySyntax Length, QuantitySyntax Size) : StatementSyntax(Span, Keyword);
public sealed record FlagSyntax(TextSpan Span, WordSyntax Keyword) : StatementSyntax(Span, Keyword);

/// <summary>One parsed file: its declarations and the comments after the last one.</summary>
public sealed record CompilationUnitSyntax(SourceText Source, ImmutableArray<StatementSyntax> Statements, ImmutableArray<string> TrailingComments);
