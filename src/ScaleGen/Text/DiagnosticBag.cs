using System.Collections;
using System.Globalization;

namespace ScaleGen.Text;

/// <summary>A diagnostic's identity: its code, severity and a one-line title for the docs table.</summary>
public sealed record DiagnosticDescriptor(string Code, Severity Severity, string Title);

/// <summary>
/// Every diagnostic ScaleGen can report, in one place. Each has its own code:
/// SG0xxx lexical and syntax, SG1xxx binding and validation errors, SG2xxx warnings,
/// SG30xx I/O-list import errors and SG31xx import warnings.
/// docs/language.md carries the same table; a test keeps the two in step.
/// </summary>
public static class DiagnosticCatalog
{
    // Lexical and syntax (SG0xxx)
    public static readonly DiagnosticDescriptor InvalidCharacter = E("SG0001", "character that cannot start any token");
    public static readonly DiagnosticDescriptor UnterminatedString = E("SG0002", "string not closed on its line");
    public static readonly DiagnosticDescriptor StrayCloseBrace = E("SG0003", "'}' with no open block");
    public static readonly DiagnosticDescriptor UnclosedBlock = E("SG0004", "'{' never closed");
    public static readonly DiagnosticDescriptor BlockWithoutStatement = E("SG0005", "'{' that follows no declaration");
    public static readonly DiagnosticDescriptor UnknownKeyword = E("SG0010", "unknown or misplaced keyword");
    public static readonly DiagnosticDescriptor MalformedStatement = E("SG0011", "statement does not have the expected form");
    public static readonly DiagnosticDescriptor DecimalComma = E("SG0012", "decimal comma instead of decimal point");
    public static readonly DiagnosticDescriptor NotANumber = E("SG0013", "NaN, Infinity, hex or an out-of-range number");
    public static readonly DiagnosticDescriptor TrailingText = E("SG0014", "unexpected text after a complete statement");
    public static readonly DiagnosticDescriptor MissingBlock = E("SG0015", "declaration needs a { ... } block");
    public static readonly DiagnosticDescriptor UnexpectedBlock = E("SG0016", "statement takes no block");
    public static readonly DiagnosticDescriptor EmptyFile = E("SG0017", "file declares nothing");
    public static readonly DiagnosticDescriptor InvalidName = E("SG0018", "name or tag not of the allowed form");
    public static readonly DiagnosticDescriptor UnknownChoice = E("SG0019", "word not among the allowed choices");
    public static readonly DiagnosticDescriptor InvalidEscape = E("SG0020", "unknown escape in a string");

    // Binding and validation errors (SG1xxx)
    public static readonly DiagnosticDescriptor DuplicateName = E("SG1001", "card, profile or point declared twice");
    public static readonly DiagnosticDescriptor UnknownCard = E("SG1002", "card not declared");
    public static readonly DiagnosticDescriptor UnknownProfile = E("SG1003", "profile not declared");
    public static readonly DiagnosticDescriptor ProfileCycle = E("SG1004", "profiles that use each other in a cycle");
    public static readonly DiagnosticDescriptor MissingRange = E("SG1005", "point without range");
    public static readonly DiagnosticDescriptor MissingCard = E("SG1006", "point without card");
    public static readonly DiagnosticDescriptor EmptyRange = E("SG1007", "LRV equals URV");
    public static readonly DiagnosticDescriptor WrongUnit = E("SG1008", "quantity with a unit of the wrong kind");
    public static readonly DiagnosticDescriptor EqualCounts = E("SG1009", "card counts with equal raw or electrical values");
    public static readonly DiagnosticDescriptor MissingCounts = E("SG1010", "card without counts");
    public static readonly DiagnosticDescriptor SpanOutsideLimits = E("SG1011", "signal span the card cannot represent inside its limits");
    public static readonly DiagnosticDescriptor PriorityOutOfRange = E("SG1012", "alarm priority outside 1..4");
    public static readonly DiagnosticDescriptor DuplicateAlarm = E("SG1013", "two alarms of the same kind on one point");
    public static readonly DiagnosticDescriptor MisorderedAlarms = E("SG1014", "HH below H, or LL above L");
    public static readonly DiagnosticDescriptor TagCollision = E("SG1015", "two tags that map to the same IEC 61131-3 identifier");
    public static readonly DiagnosticDescriptor ReservedTag = E("SG1016", "tag that maps onto an IEC 61131-3 keyword");
    public static readonly DiagnosticDescriptor UnknownConductor = E("SG1017", "conductor size with no known resistance");
    public static readonly DiagnosticDescriptor Ne43WithoutLiveZero = E("SG1018", "health ne43 on a signal with no live zero");
    public static readonly DiagnosticDescriptor DuplicateSetting = E("SG1019", "setting given twice in one block");
    public static readonly DiagnosticDescriptor ShuntMismatch = E("SG1020", "shunt missing on a voltage card, or given for a current card");
    public static readonly DiagnosticDescriptor DuplicateTopLevel = E("SG1021", "plant or cycle given twice");
    public static readonly DiagnosticDescriptor NotPositive = E("SG1022", "value that must be positive (or not negative) is not");
    public static readonly DiagnosticDescriptor BadSignal = E("SG1023", "signal span empty or falling");
    public static readonly DiagnosticDescriptor BadHealthBands = E("SG1024", "custom fault thresholds not outside the signal span");
    public static readonly DiagnosticDescriptor BadLimits = E("SG1025", "card limits reversed or outside the raw type");
    public static readonly DiagnosticDescriptor IncompleteLoop = E("SG1026", "loop block without supply or device voltage");
    

    // Warnings (SG2xxx)
    public static readonly DiagnosticDescriptor SetpointOutsideRange = W("SG2001", "alarm setpoint outside the range");
    public static readonly DiagnosticDescriptor DeadbandBelowOneCount = W("SG2002", "deadband smaller than one raw count");
    public static readonly DiagnosticDescriptor DeadbandBelowUsual = W("SG2003", "deadband below the usual starting value for the measure kind");
    public static readonly DiagnosticDescriptor SqrtWithoutCutoff = W("SG2004", "square-root extraction with no low-flow cutoff");
    public static readonly DiagnosticDescriptor LoopBudgetFails = W("SG2005", "loop supply does not cover the loop resistance");
    public static readonly DiagnosticDescriptor HartWindow = W("SG2006", "HART loop resistance outside 230..1100 ohm");
    public static readonly DiagnosticDescriptor CoarseResolution = W("SG2007", "card resolution coarser than 0.1 % of span");
    public static readonly DiagnosticDescriptor NoHealthOnLiveZero = W("SG2008", "live-zero signal with no fault bands");
    public static readonly DiagnosticDescriptor UpscaleFailureUnreachable = W("SG2009", "loop cannot drive the upscale failure current");
    public static readonly DiagnosticDescriptor UnusedDeclaration = W("SG2010", "card or profile that no point uses");
    public static readonly DiagnosticDescriptor DelayBelowCycle = W("SG2011", "delay or filter shorter than the task cycle");
    public static readonly DiagnosticDescriptor IneffectiveSetting = W("SG2012", "setting that has no effect on this point");
    public static readonly DiagnosticDescriptor NoPoints = W("SG2013", "plant with no points");

    // Import of an I/O list (SG3xxx): errors SG30xx, warnings SG31xx. They point at a CSV
    // row and column, not at a line of a .scale file (see Import/ImportProblem.cs).
    public static readonly DiagnosticDescriptor CsvUnreadable = E("SG3001", "CSV text that cannot be read (quotes, encoding)");
    public static readonly DiagnosticDescriptor MissingColumn = E("SG3002", "required I/O-list column missing from the header row");
    public static readonly DiagnosticDescriptor DuplicateColumn = E("SG3003", "two header cells for the same I/O-list column");
    public static readonly DiagnosticDescriptor CellNotANumber = E("SG3004", "cell that should hold a number does not");
    public static readonly DiagnosticDescriptor CellDecimalComma = E("SG3005", "number written with a decimal comma");
    public static readonly DiagnosticDescriptor MissingCell = E("SG3006", "required cell left empty");
    public static readonly DiagnosticDescriptor CellInvalidName = E("SG3007", "tag, card or profile name not of the allowed form");
    public static readonly DiagnosticDescriptor CellUnknownChoice = E("SG3008", "cell not among the allowed words");
    public static readonly DiagnosticDescriptor CellsIncomplete = E("SG3009", "cell that needs another cell of its row");
    public static readonly DiagnosticDescriptor DuplicateTagRow = E("SG3010", "tag on two rows");
    public static readonly DiagnosticDescriptor NoDataRows = E("SG3011", "I/O list with no data rows");
    public static readonly DiagnosticDescriptor IgnoredColumn = W("SG3101", "header cell that is no I/O-list column; ignored");
    public static readonly DiagnosticDescriptor UnmatchedMapping = W("SG3102", "header mapping names a header the file does not have");

    public static IReadOnlyList<DiagnosticDescriptor> All { get; } = typeof(DiagnosticCatalog)
        .GetFields(System.Reflection.BindingFlags.Public | System.Reflection.BindingFlags.Static)
        .Where(f => f.FieldType == typeof(DiagnosticDescriptor))
        .Select(f => (DiagnosticDescriptor)f.GetValue(null)!)
        .OrderBy(d => d.Code, StringComparer.Ordinal)
        .ToArray();

    private static DiagnosticDescriptor E(string code, string title) => new(code, Severity.Error, title);
    private static DiagnosticDescriptor W(string code, string title) => new(code, Severity.Warning, title);
}

/// <summary>Collects diagnostics while a phase runs. Messages say what to change.</summary>
public sealed class DiagnosticBag : IEnumerable<Diagnostic>
{
    private readonly List<Diagnostic> _items = new();

    public int Count => _items.Count;

    public bool HasErrors => _items.Any(d => d.IsError);

    public void Report(DiagnosticDescriptor descriptor, SourceLocation location, string message) =>
        _items.Add(new Diagnostic(descriptor.Code, descriptor.Severity, location, message));

    public void Report(DiagnosticDescriptor descriptor, SourceText source, TextSpan span, string message) =>
        Report(descriptor, new SourceLocation(source, span), message);

    public void AddRange(IEnumerable<Diagnostic> diagnostics) => _items.AddRange(diagnostics);

    /// <summary>Diagnostics in file order, then line, column and code: stable output.</summary>
    public IReadOnlyList<Diagnostic> ToSortedList(IReadOnlyList<SourceText> fileOrder)
    {
        var rank = new Dictionary<SourceText, int>();
        for (var i = 0; i < fileOrder.Count; i++) rank[fileOrder[i]] = i;
        return _items
            .OrderBy(d => rank.TryGetValue(d.Location.Source, out var r) ? r : int.MaxValue)
            .ThenBy(d => d.Location.Span.Start)
            .ThenBy(d => d.Code, StringComparer.Ordinal)
            .ToArray();
    }

    public IEnumerator<Diagnostic> GetEnumerator() => _items.GetEnumerator();

    IEnumerator IEnumerable.GetEnumerator() => GetEnumerator();

    /// <summary>Numbers in messages are always written the invariant way.</summary>
    public static string Num(double value) => value.ToString("0.######", CultureInfo.InvariantCulture);
}
