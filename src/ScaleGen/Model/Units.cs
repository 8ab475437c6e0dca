namespace ScaleGen.Model;

/// <summary>The kinds of fixed unit the language knows, each with its words and factor to the model's unit.</summary>
public enum Dimension { Current, Voltage, Resistance, Time, Length, Percent }

/// <summary>
/// The fixed unit words of the language and their factor to the unit the model stores:
/// mA, V, ohm, s, m, %.
/// </summary>
public static class Units
{
    private static readonly Dictionary<string, (Dimension Dimension, double Factor)> Table = new(StringComparer.Ordinal)
    {
        ["mA"] = (Dimension.Current, 1),
        ["A"] = (Dimension.Current, 1000),
        ["V"] = (Dimension.Voltage, 1),
        ["mV"] = (Dimension.Voltage, 0.001),
        ["ohm"] = (Dimension.Resistance, 1),
        ["kohm"] = (Dimension.Resistance, 1000),
        ["ms"] = (Dimension.Time, 0.001),
        ["s"] = (Dimension.Time, 1),
        ["min"] = (Dimension.Time, 60),
        ["h"] = (Dimension.Time, 3600),
        ["m"] = (Dimension.Length, 1),
        ["km"] = (Dimension.Length, 1000),
        ["ft"] = (Dimension.Length, 0.3048),
        ["%"] = (Dimension.Percent, 1),
    };

    public static bool TryGet(string unit, out Dimension dimension, out double factor)
    {
        if (Table.TryGetValue(unit, out var entry))
        {
            dimension = entry.Dimension;
            factor = entry.Factor;
            return true;
        }
        dimension = default;
        factor = 0;
        return false;
    }

    public static IEnumerable<string> WordsFor(Dimension dimension) =>
        Table.Where(e => e.Value.Dimension == dimension).Select(e => e.Key);

    public static string Describe(Dimension dimension) => dimension switch
    {
        Dimension.Current => "a current (mA or A)",
        Dimension.Voltage => "a voltage (V or mV)",
        Dimension.Resistance => "a resistance (ohm or kohm)",
        Dimension.Time => "a time (ms, s, min or h)",
        Dimension.Length => "a length (m, km or ft)",
        Dimension.Percent => "a percentage (%)",
        _ => dimension.ToString(),
    };

    /// <summary>The unit the model stores for a dimension, for messages.</summary>
    public static string ModelUnit(Dimension dimension) => dimension switch
    {
        Dimension.Current => "mA",
        Dimension.Voltage => "V",
        Dimension.Resistance => "ohm",
        Dimension.Time => "s",
        Dimension.Length => "m",
        _ => "%",
    };
}
