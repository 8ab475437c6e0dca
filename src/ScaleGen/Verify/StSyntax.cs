using System.Collections.Immutable;
using ScaleGen.Text;

namespace ScaleGen.Verify;

// The syntax tree of the Structured Text subset the verifier reads. Every node keeps the
// position it came from, so every later error names file, line and column.

internal abstract record StNode(SourceLocation Location);

// ---- declarations ---------------------------------------------------------------------

internal abstract record StDeclaration(string Name, SourceLocation Location) : StNode(Location);

/// <summary>One type inside TYPE ... END_TYPE.</summary>
internal sealed record StTypeDeclaration(string Name, StTypeSpec Spec, SourceLocation Location) : StDeclaration(Name, Location);

internal abstract record StTypeSpec(SourceLocation Location) : StNode(Location);

/// <summary><c>(A, B, C) [:= B]</c>.</summary>
internal sealed record StEnumSpec(ImmutableArray<(string Name, SourceLocation Location)> Members, (string Name, SourceLocation Location)? Initial, SourceLocation Location)
    : StTypeSpec(Location);

/// <summary><c>STRUCT fields END_STRUCT</c>.</summary>
internal sealed record StStructSpec(ImmutableArray<StVarDeclaration> Fields, SourceLocation Location) : StTypeSpec(Location);

/// <summary>A reference to a type by name; <see cref="StringLength"/> for <c>STRING[n]</c>.</summary>
internal sealed record StTypeRef(string Name, int? StringLength, SourceLocation Location) : StNode(Location);

internal sealed record StVarDeclaration(string Name, StTypeRef Type, StInitializer? Initializer, SourceLocation Location) : StNode(Location);

internal enum StVarKind { Input, Output, Local, Constant }

internal sealed record StVarBlock(StVarKind Kind, ImmutableArray<StVarDeclaration> Variables, SourceLocation Location) : StNode(Location);

internal enum StPouKind { FunctionBlock, Program }

internal sealed record StPouDeclaration(StPouKind Kind, string Name, ImmutableArray<StVarBlock> Blocks, ImmutableArray<StStatement> Body, SourceLocation Location)
    : StDeclaration(Name, Location);

// ---- initial values -------------------------------------------------------------------

internal abstract record StInitializer(SourceLocation Location) : StNode(Location);

internal sealed record StExpressionInitializer(StExpression Expression) : StInitializer(Expression.Location);

/// <summary><c>(Field := init, ...)</c>.</summary>
internal sealed record StStructInitializer(ImmutableArray<StFieldInitializer> Fields, SourceLocation Location) : StInitializer(Location);

internal sealed record StFieldInitializer(string Name, StInitializer Value, SourceLocation Location) : StNode(Location);

// ---- statements -------------------------------------------------------------------------

internal abstract record StStatement(SourceLocation Location) : StNode(Location);

internal sealed record StAssignment(StExpression Target, StExpression Value, SourceLocation Location) : StStatement(Location);

/// <summary><c>instance(Input := expr, ...);</c></summary>
internal sealed record StBlockCall(string Instance, ImmutableArray<StArgument> Arguments, SourceLocation Location) : StStatement(Location);

internal sealed record StArgument(string Name, StExpression Value, SourceLocation Location) : StNode(Location);

internal sealed record StIf(ImmutableArray<(StExpression Condition, ImmutableArray<StStatement> Body)> Branches, ImmutableArray<StStatement>? Else, SourceLocation Location)
    : StStatement(Location);

internal sealed record StEmptyStatement(SourceLocation Location) : StStatement(Location);

// ---- expressions --------------------------------------------------------------------------

internal abstract record StExpression(SourceLocation Location) : StNode(Location);

/// <summary>An integer literal; <see cref="TypeName"/> when written as <c>INT#5</c>.</summary>
internal sealed record StIntegerLiteral(long Value, string? TypeName, SourceLocation Location) : StExpression(Location);

/// <summary>A REAL literal as written (digits, point, exponent; a leading '-' when negated); parsed for its target type, so REAL gets the float nearest to the text.</summary>
internal sealed record StRealLiteral(string Text, string? TypeName, SourceLocation Location) : StExpression(Location);

internal sealed record StBoolLiteral(bool Value, SourceLocation Location) : StExpression(Location);

internal sealed record StTimeLiteral(long Microseconds, SourceLocation Location) : StExpression(Location);

internal sealed record StStringLiteral(string Value, SourceLocation Location) : StExpression(Location);

/// <summary><c>Type#Value</c> for an enumeration.</summary>
internal sealed record StEnumLiteral(string TypeName, string Member, SourceLocation Location) : StExpression(Location);

internal sealed record StNameExpression(string Name, SourceLocation Location) : StExpression(Location);

internal sealed record StMemberExpression(StExpression Target, string Member, SourceLocation Location) : StExpression(Location);

internal sealed record StCallExpression(string Function, ImmutableArray<StExpression> Arguments, SourceLocation Location) : StExpression(Location);

internal sealed record StUnaryExpression(string Operator, StExpression Operand, SourceLocation Location) : StExpression(Location);

internal sealed record StBinaryExpression(string Operator, StExpression Left, StExpression Right, SourceLocation Location) : StExpression(Location);
