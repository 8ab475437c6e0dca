using Newtonsoft.Json;
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
            ["points"] = new JArray(), // streamed: one point at a time
        };
        yield return new GeneratedFile(FileName, output => JsonOutput.Write(output, document, "points", plant.Points, WritePoint));
    }

    private static void WritePoint(JsonWriter w, Point point)
    {
        w.WriteStartObject();
        w.Field("tag", point.Tag);
        w.Field("identifier", point.Identifier);
        w.Field("description", point.Description);
        w.Field("card", point.Card.Name);
        w.Field("address", point.Address);
        w.Field("measure", Word(point.Measure));
        w.WritePropertyName("range");
        w.WriteStartObject();
        w.NumberField("lrv", point.Lrv);
        w.NumberField("urv", point.Urv);
        w.Field("unit", point.Unit);
        w.WriteEndObject();
        w.WritePropertyName("signal");
        w.WriteStartObject();
        w.NumberField("low_ma", point.SignalLowMa);
        w.NumberField("high_ma", point.SignalHighMa);
        w.Field("square_root", point.SquareRoot);
        w.NumberField("cutoff_percent", point.SquareRoot ? point.CutoffPercent : 0);
        w.WriteEndObject();
        w.WritePropertyName("status_handling");
        w.WriteStartObject();
        w.Field("health", Word(point.Health.Kind));
        w.NumberField("fault_low_ma", point.Health.FaultLowMa);
        w.NumberField("fault_high_ma", point.Health.FaultHighMa);
        w.Field("on_fault", Word(point.OnFault.Kind));
        // Hold has no fixed value (the last good one); the others substitute a known value.
        w.NumberField("on_fault_value", point.OnFault.Kind == FaultActionKind.Hold ? null : FaultActions.Substitute(point, lastGood: null));
        w.NumberField("filter_s", point.FilterSeconds);
        w.WriteEndObject();
        w.WritePropertyName("alarms");
        w.WriteStartArray();
        foreach (var trip in AlarmMath.AlarmPoints(point)) WriteAlarm(w, point, trip);
        w.WriteEndArray();
        w.WriteEndObject();
    }

    private static void WriteAlarm(JsonWriter w, Point point, AlarmPoint trip)
    {
        w.WriteStartObject();
        w.Field("kind", trip.Alarm.Kind.ToString());
        w.NumberField("setpoint", trip.TripValue);
        w.NumberField("deadband", trip.Alarm.Deadband);
        w.NumberField("reset_value", trip.ResetValue);
        w.NumberField("on_delay_s", trip.Alarm.OnDelaySeconds);
        w.NumberField("off_delay_s", trip.Alarm.OffDelaySeconds);
        w.Field("priority", trip.Alarm.Priority);
        w.Field("message", AlarmMessages.For(point, trip.Alarm));
        w.NumberField("trip_ma", FiniteOrNull(trip.TripMa));
        w.NumberField("reset_ma", FiniteOrNull(trip.ResetMa));
        w.Field("trip_raw", trip.TripRaw);
        w.Field("trip_raw_test", TestWord(trip.TripCondition.Test));
        w.Field("reset_raw", trip.ResetRaw);
        w.Field("reset_raw_test", TestWord(trip.ClearCondition.Test));
        w.WriteEndObject();
    }

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
    private static double? FiniteOrNull(double value) => double.IsFinite(value) ? value : null;

    private static string Word<T>(T value) where T : struct, Enum => value.ToString().ToLowerInvariant();
}
