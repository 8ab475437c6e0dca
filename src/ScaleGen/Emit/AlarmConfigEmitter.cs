using Newtonsoft.Json.Linq;
using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Emit;

/// <summary>
/// <c>alarms.json</c>: what an alarm system needs to know about every point, with each
/// alarm's trip and reset in engineering units, loop current and raw counts. The layout is
/// schemas/alarms.schema.json; docs/alarm-config.md explains the fields.
/// </summary>
/// <remarks>
/// Diff-local by design: points in plant order, one object each, no indices, no
/// cross-point alignment and no plant-wide totals, so changing one point changes only its
/// own lines (plus a comma where a point is added or removed at the end).
/// </remarks>
public sealed class AlarmConfigEmitter : IOutputEmitter
{
    public const string FileName = "alarms.json";

    public string Kind => "alarms";

    public IEnumerable<GeneratedFile> Emit(EmitContext context)
    {
        var plant = context.Plant;
        var document = new JObject
        {
            ["generated"] = GeneratedJson.Header(context, "Alarm configuration: every analog point with its status handling and alarms."),
            ["plant"] = plant.Title,
            ["cycle_s"] = JsonOutput.Number(plant.CycleSeconds),
            ["points"] = new JArray(plant.Points.Select(PointObject)),
        };
        yield return new GeneratedFile(FileName, JsonOutput.Write(document));
    }

    private static JObject PointObject(Point point) => new()
    {
        ["tag"] = point.Tag,
        ["identifier"] = point.Identifier,
        ["description"] = point.Description,
        ["card"] = point.Card.Name,
        ["address"] = point.Address,
        ["measure"] = Word(point.Measure),
        ["range"] = new JObject
        {
            ["lrv"] = JsonOutput.Number(point.Lrv),
            ["urv"] = JsonOutput.Number(point.Urv),
            ["unit"] = point.Unit,
        },
        ["signal"] = new JObject
        {
            ["low_ma"] = JsonOutput.Number(point.SignalLowMa),
            ["high_ma"] = JsonOutput.Number(point.SignalHighMa),
            ["square_root"] = point.SquareRoot,
            ["cutoff_percent"] = JsonOutput.Number(point.SquareRoot ? point.CutoffPercent : 0),
        },
        ["status_handling"] = new JObject
        {
            ["health"] = Word(point.Health.Kind),
            ["fault_low_ma"] = JsonOutput.Number(point.Health.FaultLowMa),
            ["fault_high_ma"] = JsonOutput.Number(point.Health.FaultHighMa),
            ["on_fault"] = Word(point.OnFault.Kind),
            // Hold has no fixed value (the last good one); the others substitute a known value.
            ["on_fault_value"] = point.OnFault.Kind == FaultActionKind.Hold
                ? JValue.CreateNull()
                : JsonOutput.Number(FaultActions.Substitute(point, lastGood: null)),
            ["filter_s"] = JsonOutput.Number(point.FilterSeconds),
        },
        ["alarms"] = new JArray(AlarmMath.AlarmPoints(point).Select(trip => AlarmObject(point, trip))),
    };

    private static JObject AlarmObject(Point point, AlarmPoint trip) => new()
    {
        ["kind"] = trip.Alarm.Kind.ToString(),
        ["setpoint"] = JsonOutput.Number(trip.TripValue),
        ["deadband"] = JsonOutput.Number(trip.Alarm.Deadband),
        ["reset_value"] = JsonOutput.Number(trip.ResetValue),
        ["on_delay_s"] = JsonOutput.Number(trip.Alarm.OnDelaySeconds),
        ["off_delay_s"] = JsonOutput.Number(trip.Alarm.OffDelaySeconds),
        ["priority"] = trip.Alarm.Priority,
        ["message"] = AlarmMessages.For(point, trip.Alarm),
        ["trip_ma"] = FiniteOrNull(trip.TripMa),
        ["reset_ma"] = FiniteOrNull(trip.ResetMa),
        ["trip_raw"] = trip.TripRaw is { } tripRaw ? new JValue(tripRaw) : JValue.CreateNull(),
        ["trip_raw_test"] = TestWord(trip.TripCondition.Test),
        ["reset_raw"] = trip.ResetRaw is { } resetRaw ? new JValue(resetRaw) : JValue.CreateNull(),
        ["reset_raw_test"] = TestWord(trip.ClearCondition.Test),
    };

    /// <summary>How the raw count compares with trip_raw / reset_raw: at_least, at_most, or never / always inside the card limits.</summary>
    private static string TestWord(RawTest test) => test switch
    {
        RawTest.AtLeast => "at_least",
        RawTest.AtMost => "at_most",
        RawTest.Always => "always",
        _ => "never",
    };

    /// <summary>
    /// A setpoint absurdly far outside a tiny span can put the trip current beyond what a
    /// double holds; JSON has no infinity, so such a current is written as null.
    /// </summary>
    private static JToken FiniteOrNull(double value) =>
        double.IsFinite(value) ? JsonOutput.Number(value) : JValue.CreateNull();

    private static string Word<T>(T value) where T : struct, Enum => value.ToString().ToLowerInvariant();
}
