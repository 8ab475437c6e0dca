using ScaleGen.Text;

namespace ScaleGen.Verify;

internal enum StKind
{
    Bool, Sint, Int, Dint, Usint, Uint, Udint, Real, Lreal, Time, String, Enum, Struct, Block,
    /// <summary>An integer literal without a type prefix: it takes the type its context needs.</summary>
    AnyInt,
    /// <summary>A REAL literal without a type prefix: REAL or LREAL, as its context needs.</summary>
    AnyReal,
}

/// <summary>A Structured Text type and the C# type it translates to.</summary>
internal sealed class StType
{
    public StType(StKind kind, string name, string csName, long min = 0, long max = 0)
    {
        Kind = kind;
        Name = name;
        CsName = csName;
        Min = min;
        Max = max;
    }

    public StKind Kind { get; }

    /// <summary>The name as declared (or the elementary type's keyword).</summary>
    public string Name { get; }

    public string CsName { get; }

    /// <summary>Integer range of an integer type.</summary>
    public long Min { get; }

    public long Max { get; }

    /// <summary>STRING: the most characters it holds.</summary>
    public int StringLength { get; init; }

    /// <summary>Enumeration values in declaration order (ordinal = index).</summary>
    public List<StEnumMember> Members { get; } = [];

    public int InitialMember { get; set; }

    /// <summary>Structure fields in declaration order.</summary>
    public List<StVariable> Fields { get; } = [];

    public Dictionary<string, StVariable> FieldIndex { get; } = new(StringComparer.OrdinalIgnoreCase);

    /// <summary>The block a function block type stands for.</summary>
    public StPou? Pou { get; init; }

    public SourceLocation? Location { get; init; }

    public bool IsInteger => Kind is StKind.Sint or StKind.Int or StKind.Dint or StKind.Usint or StKind.Uint or StKind.Udint;

    public bool IsReal => Kind is StKind.Real or StKind.Lreal;

    public bool IsNumeric => IsInteger || IsReal;

    public bool IsUntyped => Kind is StKind.AnyInt or StKind.AnyReal;

    public string Display => Kind switch
    {
        StKind.String => $"STRING[{StringLength}]",
        StKind.AnyInt => "an integer literal",
        StKind.AnyReal => "a REAL literal",
        _ => Name,
    };

    public override string ToString() => Display;
}

internal sealed record StEnumMember(string Name, string CsName, int Ordinal, SourceLocation Location);

/// <summary>A variable of a block or program, or a field of a structure.</summary>
internal sealed class StVariable(string name, string csName, StVarKind kind, StType type, StInitializer? initializer, SourceLocation? location)
{
    public string Name { get; } = name;
    public string CsName { get; } = csName;
    public StVarKind Kind { get; } = kind;
    public StType Type { get; } = type;
    public StInitializer? Initializer { get; } = initializer;
    public SourceLocation? Location { get; } = location;
}

/// <summary>A function block or program (or the built-in TON).</summary>
internal sealed class StPou(string name, string csName, StPouKind kind, StPouDeclaration? syntax)
{
    public string Name { get; } = name;
    public string CsName { get; } = csName;
    public StPouKind Kind { get; } = kind;
    public StPouDeclaration? Syntax { get; } = syntax;
    public bool IsBuiltin => Syntax is null;
    public List<StVariable> Variables { get; } = [];

    /// <summary>A program's top-level statements, each with the names of the program variables it reads or writes (in any nested statement).</summary>
    public List<HashSet<string>> StatementVariables { get; } = [];
    public Dictionary<string, StVariable> VariableIndex { get; } = new(StringComparer.OrdinalIgnoreCase);

    public void Add(StVariable variable)
    {
        Variables.Add(variable);
        VariableIndex[variable.Name] = variable;
    }
}

/// <summary>The elementary types of the subset and IEC 61131-3's implicit conversions between them.</summary>
internal static class StTypes
{
    public static readonly StType Bool = new(StKind.Bool, "BOOL", "bool");
    public static readonly StType Sint = new(StKind.Sint, "SINT", "sbyte", sbyte.MinValue, sbyte.MaxValue);
    public static readonly StType Int = new(StKind.Int, "INT", "short", short.MinValue, short.MaxValue);
    public static readonly StType Dint = new(StKind.Dint, "DINT", "int", int.MinValue, int.MaxValue);
    public static readonly StType Usint = new(StKind.Usint, "USINT", "byte", byte.MinValue, byte.MaxValue);
    public static readonly StType Uint = new(StKind.Uint, "UINT", "ushort", ushort.MinValue, ushort.MaxValue);
    public static readonly StType Udint = new(StKind.Udint, "UDINT", "uint", uint.MinValue, uint.MaxValue);
    public static readonly StType Real = new(StKind.Real, "REAL", "float");
    public static readonly StType Lreal = new(StKind.Lreal, "LREAL", "double");
    /// <summary>TIME as a count of microseconds.</summary>
    public static readonly StType Time = new(StKind.Time, "TIME", "long", long.MinValue, long.MaxValue);
    public static readonly StType AnyInt = new(StKind.AnyInt, "ANY_INT", "long");
    public static readonly StType AnyReal = new(StKind.AnyReal, "ANY_REAL", "double");

    /// <summary>STRING without a length: 254 characters here (IEC 61131-3 leaves the default to the implementation).</summary>
    public const int DefaultStringLength = 254;

    public static StType String(int length) => new(StKind.String, "STRING", "string") { StringLength = length };

    private static readonly Dictionary<string, StType> ByName = new(StringComparer.OrdinalIgnoreCase)
    {
        ["BOOL"] = Bool, ["SINT"] = Sint, ["INT"] = Int, ["DINT"] = Dint, ["USINT"] = Usint, ["UINT"] = Uint,
        ["UDINT"] = Udint, ["REAL"] = Real, ["LREAL"] = Lreal, ["TIME"] = Time, ["STRING"] = String(DefaultStringLength),
    };

    /// <summary>Elementary IEC 61131-3 types outside the subset: named here so they get a clear error rather than "unknown type".</summary>
    public static readonly HashSet<string> OutsideSubset = new(StringComparer.OrdinalIgnoreCase)
    {
        "LINT", "ULINT", "BYTE", "WORD", "DWORD", "LWORD", "DATE", "TIME_OF_DAY", "TOD", "DATE_AND_TIME", "DT", "LTIME",
        "LDATE", "LTOD", "LDT", "WSTRING", "CHAR", "WCHAR", "ANY", "ANY_NUM", "ANY_REAL", "ANY_INT",
    };

    /// <summary>The integer and real types, by their keywords (the conversion functions' names use them).</summary>
    public static StType? Elementary(string name) => ByName.GetValueOrDefault(name);

    public static bool IsElementaryName(string name) => ByName.ContainsKey(name);

    /// <summary>
    /// The implicit (widening) conversions of IEC 61131-3, 3rd edition (from memory): a
    /// value converts without a function only where no value can change.
    /// SINT→INT→DINT; USINT→UINT→UDINT; USINT→INT; UINT→DINT; SINT, INT, USINT, UINT→REAL;
    /// every integer→LREAL; REAL→LREAL. DINT→REAL is not implicit (REAL has 24 bits).
    /// </summary>
    public static bool Widens(StType from, StType to)
    {
        if (ReferenceEquals(from, to)) return true;
        return from.Kind switch
        {
            StKind.Sint => to.Kind is StKind.Int or StKind.Dint or StKind.Real or StKind.Lreal,
            StKind.Int => to.Kind is StKind.Dint or StKind.Real or StKind.Lreal,
            StKind.Dint => to.Kind is StKind.Lreal,
            StKind.Usint => to.Kind is StKind.Uint or StKind.Udint or StKind.Int or StKind.Dint or StKind.Real or StKind.Lreal,
            StKind.Uint => to.Kind is StKind.Udint or StKind.Dint or StKind.Real or StKind.Lreal,
            StKind.Udint => to.Kind is StKind.Lreal,
            StKind.Real => to.Kind is StKind.Lreal,
            _ => false,
        };
    }

    /// <summary>True when the two denote the same type (every STRING length is one type for comparisons).</summary>
    public static bool Same(StType a, StType b) =>
        ReferenceEquals(a, b) || (a.Kind == StKind.String && b.Kind == StKind.String) || (a.Kind == b.Kind && a.Kind is not (StKind.Enum or StKind.Struct or StKind.Block));
}
