namespace ScaleGen.Import;

/// <summary>What a cell of a column holds, which decides how it is read.</summary>
public enum CellKind { Tag, Name, Text, Number, YesNo, Choice }

/// <summary>
/// One column of ScaleGen's own I/O-list layout. <see cref="Unit"/> is the unit every number
/// in the column is in; a cell may repeat it ("250 ohm", "3 %") but may not use another.
/// </summary>
public sealed record IoListColumn(string Name, CellKind Kind, bool Required, string? Unit, string Meaning);

/// <summary>
/// The columns `scalegen import` reads, in the order the docs list them. The first sixteen
/// are the core set every I/O list has; the rest are optional extras. A header cell names a
/// column when it equals the column's name after trimming, ignoring case, and reading a
/// space or '-' as '_' ("Signal Lo" is signal_lo); other header names are mapped with
/// <see cref="HeaderMap"/>.
/// </summary>
public static class IoListColumns
{
    public static readonly IoListColumn Tag = new("tag", CellKind.Tag, true, null, "point tag, e.g. FIT-501 (letters, digits, '_' and '-', starting with a letter)");
    public static readonly IoListColumn Description = new("description", CellKind.Text, false, null, "free text for comments, alarm texts and sheets");
    public static readonly IoListColumn Card = new("card", CellKind.Name, true, null, "name of a card declared in another .scale file");
    public static readonly IoListColumn Address = new("address", CellKind.Text, false, null, "channel address on the card, free text, e.g. R3.S1.C0");
    public static readonly IoListColumn SignalLow = new("signal_lo", CellKind.Number, false, "mA", "transmitter output at LRV, mA (empty with signal_hi: 4 mA or the profile's)");
    public static readonly IoListColumn SignalHigh = new("signal_hi", CellKind.Number, false, "mA", "transmitter output at URV, mA (empty with signal_lo: 20 mA or the profile's)");
    public static readonly IoListColumn Lrv = new("lrv", CellKind.Number, true, null, "engineering value at signal low");
    public static readonly IoListColumn Urv = new("urv", CellKind.Number, true, null, "engineering value at signal high (below lrv: a reverse-acting point)");
    public static readonly IoListColumn Unit = new("unit", CellKind.Text, false, null, "engineering unit, e.g. m3/h, bar, mg/L");
    public static readonly IoListColumn Sqrt = new("sqrt", CellKind.YesNo, false, null, "yes: square-root extraction (DP flow); no or empty: none written (a profile may set it)");
    public static readonly IoListColumn Cutoff = new("cutoff", CellKind.Number, false, "%", "low-flow cutoff, % of flow span; needs sqrt yes");
    public static readonly IoListColumn Health = new("health", CellKind.Choice, false, null, "ne43 or none; empty: the profile's, else none");
    public static readonly IoListColumn HH = new("hh", CellKind.Number, false, null, "HH alarm setpoint, engineering units");
    public static readonly IoListColumn H = new("h", CellKind.Number, false, null, "H alarm setpoint");
    public static readonly IoListColumn L = new("l", CellKind.Number, false, null, "L alarm setpoint");
    public static readonly IoListColumn LL = new("ll", CellKind.Number, false, null, "LL alarm setpoint");

    // Optional extras.
    public static readonly IoListColumn Profile = new("profile", CellKind.Name, false, null, "profile the point uses (declared in another .scale file)");
    public static readonly IoListColumn Measure = new("measure", CellKind.Choice, false, null, "flow, level, pressure, temperature, analysis or other");
    public static readonly IoListColumn Shunt = new("shunt", CellKind.Number, false, "ohm", "shunt resistor for a voltage card, ohm");
    public static readonly IoListColumn OnFault = new("on_fault", CellKind.Choice, false, null, "hold, low, high, or a number (the value to show while faulted)");
    public static readonly IoListColumn Filter = new("filter", CellKind.Number, false, "s", "first-order lag time constant, s");
    public static readonly IoListColumn Tolerance = new("tolerance", CellKind.Number, false, "%", "calibration tolerance, % of span");
    public static readonly IoListColumn Deadband = new("deadband", CellKind.Number, false, "%", "deadband of every alarm on the row, % of span");
    public static readonly IoListColumn Delay = new("delay", CellKind.Number, false, "s", "on-delay of every alarm on the row, s");
    public static readonly IoListColumn HHPriority = new("hh_priority", CellKind.Number, false, null, "priority of the HH alarm, 1 (most urgent) .. 4; empty: 3");
    public static readonly IoListColumn HPriority = new("h_priority", CellKind.Number, false, null, "priority of the H alarm");
    public static readonly IoListColumn LPriority = new("l_priority", CellKind.Number, false, null, "priority of the L alarm");
    public static readonly IoListColumn LLPriority = new("ll_priority", CellKind.Number, false, null, "priority of the LL alarm");

    public static IReadOnlyList<IoListColumn> All { get; } = new[]
    {
        Tag, Description, Card, Address, SignalLow, SignalHigh, Lrv, Urv, Unit, Sqrt, Cutoff, Health, HH, H, L, LL,
        Profile, Measure, Shunt, OnFault, Filter, Tolerance, Deadband, Delay, HHPriority, HPriority, LPriority, LLPriority,
    };

    /// <summary>The alarm columns with their priority columns, in HH, H, L, LL order.</summary>
    public static IReadOnlyList<(string Kind, IoListColumn Setpoint, IoListColumn Priority)> Alarms { get; } = new[]
    {
        ("HH", HH, HHPriority), ("H", H, HPriority), ("L", L, LPriority), ("LL", LL, LLPriority),
    };

    /// <summary>The column a header cell names by itself, or null.</summary>
    public static IoListColumn? Find(string header)
    {
        var key = Normalize(header);
        return All.FirstOrDefault(c => string.Equals(c.Name, key, StringComparison.Ordinal));
    }

    /// <summary>Trimmed, lower case, with spaces and '-' read as '_'.</summary>
    public static string Normalize(string header) =>
        string.Join('_', header.Trim().ToLowerInvariant().Split(new[] { ' ', '-', '\t' }, StringSplitOptions.RemoveEmptyEntries));

    public static string Names => string.Join(", ", All.Select(c => c.Name));
}
