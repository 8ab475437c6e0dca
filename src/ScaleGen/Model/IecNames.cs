namespace ScaleGen.Model;

/// <summary>How tags become IEC 61131-3 identifiers, and which identifiers are taken.</summary>
public static class IecNames
{
    /// <summary>'-' is not allowed in an identifier; '_' stands in for it.</summary>
    public static string ToIdentifier(string tag) => tag.Replace('-', '_');

    /// <summary>
    /// IEC 61131-3 identifiers allow no double and no trailing underscore; identifiers are
    /// compared without regard to case.
    /// </summary>
    public static bool IsWellFormed(string identifier) =>
        identifier.Length > 0 && !identifier.Contains("__", StringComparison.Ordinal) && !identifier.EndsWith('_');

    public static bool IsReserved(string identifier) => Reserved.Contains(identifier);

    /// <summary>
    /// Keywords, elementary type names and standard function and function block names of
    /// IEC 61131-3: a variable with one of these names would not compile in a PLC.
    /// </summary>
    private static readonly HashSet<string> Reserved = new(StringComparer.OrdinalIgnoreCase)
    {
        // Keywords
        "ACTION", "END_ACTION", "ARRAY", "OF", "AT", "CASE", "END_CASE", "CONFIGURATION", "END_CONFIGURATION",
        "CONSTANT", "DO", "ELSE", "ELSIF", "END_IF", "EN", "ENO", "EXIT", "FALSE", "TRUE", "F_EDGE", "R_EDGE",
        "FOR", "END_FOR", "FROM", "FUNCTION", "END_FUNCTION", "FUNCTION_BLOCK", "END_FUNCTION_BLOCK",
        "IF", "THEN", "INITIAL_STEP", "END_STEP", "NOT", "AND", "OR", "XOR", "MOD", "ON", "PRIORITY",
        "PROGRAM", "END_PROGRAM", "READ_ONLY", "READ_WRITE", "REPEAT", "END_REPEAT", "UNTIL", "RESOURCE",
        "END_RESOURCE", "RETAIN", "NON_RETAIN", "RETURN", "SINGLE", "INTERVAL", "STEP", "STRUCT", "END_STRUCT",
        "TASK", "TO", "BY", "TRANSITION", "END_TRANSITION", "TYPE", "END_TYPE", "VAR", "END_VAR", "VAR_INPUT",
        "VAR_OUTPUT", "VAR_IN_OUT", "VAR_TEMP", "VAR_EXTERNAL", "VAR_ACCESS", "VAR_CONFIG", "VAR_GLOBAL",
        "WHILE", "END_WHILE", "WITH", "CLASS", "END_CLASS", "METHOD", "END_METHOD", "INTERFACE", "END_INTERFACE",
        "NAMESPACE", "END_NAMESPACE", "USING", "EXTENDS", "IMPLEMENTS", "THIS", "SUPER", "ABSTRACT", "FINAL",
        "OVERRIDE", "PUBLIC", "PRIVATE", "PROTECTED", "INTERNAL", "REF", "REF_TO", "NULL", "CONTINUE",
        // Elementary data types
        "BOOL", "SINT", "INT", "DINT", "LINT", "USINT", "UINT", "UDINT", "ULINT", "REAL", "LREAL", "TIME", "LTIME",
        "DATE", "LDATE", "TIME_OF_DAY", "TOD", "LTOD", "DATE_AND_TIME", "DT", "LDT", "STRING", "WSTRING", "CHAR",
        "WCHAR", "BYTE", "WORD", "DWORD", "LWORD", "ANY", "ANY_NUM", "ANY_REAL", "ANY_INT", "ANY_BIT",
        // Standard functions
        "ABS", "SQRT", "LN", "LOG", "EXP", "SIN", "COS", "TAN", "ASIN", "ACOS", "ATAN", "ATAN2", "ADD", "SUB",
        "MUL", "DIV", "EXPT", "MOVE", "SHL", "SHR", "ROL", "ROR", "SEL", "MAX", "MIN", "LIMIT", "MUX", "GT",
        "GE", "EQ", "LE", "LT", "NE", "LEN", "LEFT", "RIGHT", "MID", "CONCAT", "INSERT", "DELETE", "REPLACE",
        "FIND", "TRUNC",
        // Standard function blocks
        "SR", "RS", "TP", "TON", "TOF", "CTU", "CTD", "CTUD", "R_TRIG", "F_TRIG",
    };
}
