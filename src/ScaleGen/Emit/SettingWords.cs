using ScaleGen.Model;

namespace ScaleGen.Emit;

/// <summary>Point settings written back the way the language writes them, for people reading outputs.</summary>
public static class SettingWords
{
    /// <summary>ne43, none, or "below 3.7 mA above 21.2 mA".</summary>
    public static string Health(Health health) => health.Kind switch
    {
        HealthKind.Ne43 => "ne43",
        HealthKind.None => "none",
        _ => string.Join(" ", new[]
        {
            health.FaultLowMa is { } low ? $"below {DisplayNumbers.Exact(low)} mA" : null,
            health.FaultHighMa is { } high ? $"above {DisplayNumbers.Exact(high)} mA" : null,
        }.Where(s => s is not null)),
    };

    /// <summary>hold, low, high, or "value 10".</summary>
    public static string OnFault(FaultAction action) => action.Kind switch
    {
        FaultActionKind.Value => $"value {DisplayNumbers.Exact(action.Value)}",
        _ => action.Kind.ToString().ToLowerInvariant(),
    };

    /// <summary>flow, level, pressure, temperature, analysis, other.</summary>
    public static string Measure(MeasureKind kind) => kind.ToString().ToLowerInvariant();
}
