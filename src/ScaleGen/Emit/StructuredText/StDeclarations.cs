namespace ScaleGen.Emit.StructuredText;

// The generated Structured Text as data: declarations (types, variables, initial values)
// as records, bodies as text. StWriter turns them into library.st and plant.st; the
// PLCopen emitter turns the same records into TC6 XML, and PlcOpenReader turns that XML
// back into these records. Comments are plain text here (not yet sanitised): each writer
// makes them safe for its own syntax.

/// <summary>A data type as a declaration names it.</summary>
public abstract record StType
{
    public static StType Bool { get; } = new StElementaryType("BOOL");
    public static StType Real { get; } = new StElementaryType("REAL");
    public static StType Dint { get; } = new StElementaryType("DINT");
    public static StType Time { get; } = new StElementaryType("TIME");

    /// <summary>The type as Structured Text writes it.</summary>
    public abstract string Text { get; }
}

/// <summary>An elementary type: BOOL, INT, DINT, UINT, REAL, TIME, ...</summary>
public sealed record StElementaryType(string Name) : StType
{
    public override string Text => Name;
}

/// <summary>STRING[Length].</summary>
public sealed record StStringType(int Length) : StType
{
    public override string Text => $"STRING[{Length.ToString(System.Globalization.CultureInfo.InvariantCulture)}]";
}

/// <summary>A user data type or a function block, by name.</summary>
public sealed record StDerivedType(string Name) : StType
{
    public override string Text => Name;
}

/// <summary>An initial value.</summary>
public abstract record StValue;

/// <summary>A value that is one literal, as Structured Text writes it (<c>0.0</c>, <c>T#5s</c>, <c>'FT-101'</c>).</summary>
public sealed record StSimpleValue(string Literal) : StValue;

/// <summary>A structure value: <c>(Member := value, ...)</c>.</summary>
public sealed record StStructValue(IReadOnlyList<StMemberValue> Members) : StValue;

/// <summary>One member of a structure value.</summary>
/// <param name="Notes">Comment lines written before the member.</param>
/// <param name="Note">A comment written after the value.</param>
public sealed record StMemberValue(string Member, StValue Value, IReadOnlyList<string> Notes, string? Note = null)
{
    public StMemberValue(string member, StValue value) : this(member, value, []) { }
}

/// <summary>A variable or structure member.</summary>
/// <param name="Comment">A comment written after the declaration.</param>
public sealed record StVariable(string Name, StType Type, StValue? Initial = null, string? Comment = null)
{
    /// <summary>Comment lines written before the declaration (a heading for a group of members).</summary>
    public IReadOnlyList<string> Notes { get; init; } = [];
}

public enum StVarKind { Input, Output, Local, Constant }

/// <summary>One VAR_INPUT, VAR_OUTPUT, VAR or VAR CONSTANT section.</summary>
public sealed record StVarSection(StVarKind Kind, IReadOnlyList<StVariable> Variables)
{
    /// <summary>Comment lines that introduce the section (in plant.st: the point the section belongs to).</summary>
    public IReadOnlyList<string> Notes { get; init; } = [];

    /// <summary>The keyword line that opens the section.</summary>
    public string Keyword => Kind switch
    {
        StVarKind.Input => "VAR_INPUT",
        StVarKind.Output => "VAR_OUTPUT",
        StVarKind.Constant => "VAR CONSTANT",
        _ => "VAR",
    };
}

/// <summary>A TYPE declaration.</summary>
/// <param name="Comment">Comment lines written before the declaration.</param>
public abstract record StDataType(string Name, IReadOnlyList<string> Comment);

/// <summary>An enumerated type; the values in declaration order.</summary>
public sealed record StEnumType(string Name, IReadOnlyList<string> Values, IReadOnlyList<string> Comment) : StDataType(Name, Comment);

/// <summary>A STRUCT type.</summary>
public sealed record StStructType(string Name, IReadOnlyList<StVariable> Members, IReadOnlyList<string> Comment) : StDataType(Name, Comment);

public enum StPouKind { FunctionBlock, Program }

/// <summary>A function block or program: its declarations as data, its body as the exact text between the declarations and the END_ keyword.</summary>
/// <param name="Comment">Comment lines written before the POU.</param>
/// <param name="Body">The statements, each line ending in '\n'.</param>
public sealed record StPou(StPouKind Kind, string Name, IReadOnlyList<StVarSection> Sections, string Body, IReadOnlyList<string> Comment)
{
    public string Keyword => Kind == StPouKind.Program ? "PROGRAM" : "FUNCTION_BLOCK";
}
