using ApprovalTests;
using ApprovalTests.Reporters;
using CsCheck;
using Newtonsoft.Json.Linq;
using ScaleGen.Emit;
using ScaleGen.Engine;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit;

[UseReporter(typeof(QuietReporter))]
public class AlarmConfigEmitterTests
{
    private static string EmitText(Compilation compilation)
    {
        Assert.False(compilation.HasErrors, DiagnosticText(compilation));
        var file = Assert.Single(new AlarmConfigEmitter().Emit(EmitContext.From(compilation)));
        Assert.Equal("alarms.json", file.RelativePath);
        return file.Content;
    }

    private static string DiagnosticText(Compilation compilation) =>
        string.Join("\n", compilation.Diagnostics.Select(d => d.ToString()));

    private static JObject Emit(string scale) => JObject.Parse(EmitText(TestInputs.Compile(scale)));

    private static JObject PointOf(JObject document, string tag) =>
        (JObject)document["points"]!.Single(p => (string?)p["tag"] == tag);

    [Fact]
    public void Is_registered_for_build() =>
        Assert.IsType<AlarmConfigEmitter>(OutputCatalog.Find("alarms"));

    [Fact]
    public void Example_snapshot() =>
        Approvals.Verify(EmitText(TestInputs.CompileExample()));

    [Fact]
    public void Example_is_valid_against_the_schema() =>
        SchemaFiles.AssertValid(SchemaFiles.Alarms, EmitText(TestInputs.CompileExample()));

    [Fact]
    public void Random_plants_are_valid_against_the_schema()
    {
        RandomPlants.Plant.Sample(text =>
        {
            var compilation = TestInputs.Compile(text);
            Assert.False(compilation.HasErrors, DiagnosticText(compilation) + "\n" + text);
            var json = EmitText(compilation);
            SchemaFiles.AssertValid(SchemaFiles.Alarms, json);
            // Every description and alarm text survives the trip through JSON unchanged.
            var document = JObject.Parse(json);
            foreach (var point in compilation.Plant.Points)
            {
                var emitted = PointOf(document, point.Tag);
                Assert.Equal(point.Description, (string?)emitted["description"]);
                Assert.Equal(point.Alarms.Select(a => AlarmMessages.For(point, a)), emitted["alarms"]!.Select(a => (string?)a["message"]));
            }
        }, iter: 200);
    }

    [Fact]
    public void Schema_rejects_what_it_should()
    {
        var document = JObject.Parse(EmitText(TestInputs.CompileExample()));
        string Mutated(Action<JObject> change)
        {
            var copy = (JObject)document.DeepClone();
            change(copy);
            return copy.ToString();
        }
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Alarms, Mutated(d => d["extra"] = 1)));
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Alarms, Mutated(d => ((JObject)d["points"]![0]!).Remove("range"))));
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Alarms, Mutated(d => d["points"]![0]!["alarms"]![0]!["kind"] = "HHH")));
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Alarms, Mutated(d => d["points"]![0]!["alarms"]![0]!["priority"] = 5)));
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Alarms, Mutated(d => d["points"]![0]!["alarms"]![0]!["setpoint"] = "13.5")));
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Alarms, Mutated(d => d["points"]![0]!["alarms"]![0]!["trip_raw"] = null)));
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Alarms, Mutated(d => d["points"]![0]!["status_handling"]!["on_fault_value"] = 1)));
        Assert.NotEmpty(SchemaFiles.Errors(SchemaFiles.Alarms, Mutated(d => d["generated"]!["sources"]![0]!["sha256"] = "abc")));
    }

    [Fact]
    public void Alarm_fields_come_from_the_engine()
    {
        var document = Emit(TestInputs.StandardCard + """

            point LT-1 {
              desc "Tank level"
              card AI16 at "R0.S1.C2"
              range 0 .. 5.5 m
              health ne43
              alarm H 4.8 deadband 5 % delay 30 s clear 10 s priority 2
              alarm LL 0.5 deadband 0.1 m text "Tank nearly empty: stop the pump"
            }
            """);
        var point = PointOf(document, "LT-1");
        Assert.Equal("LT_1", (string?)point["identifier"]);
        Assert.Equal("AI16", (string?)point["card"]);
        Assert.Equal("R0.S1.C2", (string?)point["address"]);
        Assert.Equal(5.5, (double)point["range"]!["urv"]!);
        Assert.Equal(3.6, (double)point["status_handling"]!["fault_low_ma"]!); // NAMUR NE 43
        Assert.Equal(21.0, (double)point["status_handling"]!["fault_high_ma"]!); // NAMUR NE 43

        var high = point["alarms"]![0]!;
        Assert.Equal("H", (string?)high["kind"]);
        Assert.Equal(0.275, (double)high["deadband"]!, 12); // 5 % of a 5.5 m span, in metres
        Assert.Equal(4.525, (double)high["reset_value"]!, 12);
        Assert.Equal(30.0, (double)high["on_delay_s"]!);
        Assert.Equal(10.0, (double)high["off_delay_s"]!);
        Assert.Equal(2, (int)high["priority"]!);
        Assert.Equal("LT-1 Tank level high", (string?)high["message"]);
        Assert.Equal(4 + 16 * 4.8 / 5.5, (double)high["trip_ma"]!, 9); // IEC 60381-1 arithmetic (live zero 4 mA, span 16 mA)
        Assert.Equal(4 + 16 * 4.525 / 5.5, (double)high["reset_ma"]!, 9);
        Assert.Equal("at_least", (string?)high["trip_raw_test"]);
        Assert.Equal("at_most", (string?)high["reset_raw_test"]);

        var compiled = TestInputs.Compile(TestInputs.StandardCard + "\npoint LT-1 {\n card AI16 at \"x\"\n range 0 .. 5.5 m\n health ne43\n alarm H 4.8 deadband 5 %\n}\n");
        var expected = AlarmMath.AlarmPoints(compiled.Plant.Points[0]).Single();
        Assert.Equal(expected.TripRaw, (long?)high["trip_raw"]);
        Assert.Equal(expected.ResetRaw, (long?)high["reset_raw"]);

        var low = point["alarms"]![1]!;
        Assert.Equal("LL", (string?)low["kind"]);
        Assert.Equal("Tank nearly empty: stop the pump", (string?)low["message"]);
        Assert.Equal(3, (int)low["priority"]!); // the language's default priority
        Assert.Equal("at_most", (string?)low["trip_raw_test"]);
    }

    [Fact]
    public void Status_handling_of_each_fault_action()
    {
        var document = Emit(TestInputs.StandardCard + """

            point A-1 { card AI16 at "a"; range 100 .. 0 %; health none; on-fault hold }
            point A-2 { card AI16 at "a"; range 100 .. 0 %; health ne43; on-fault low }
            point A-3 { card AI16 at "a"; range 100 .. 0 %; health ne43; on-fault high; filter 2 s }
            point A-4 { card AI16 at "a"; range 0 .. 100 %; health below 3.7 mA above 21.2 mA; on-fault value 42.5 }
            """);
        JToken Handling(string tag) => PointOf(document, tag)["status_handling"]!;
        Assert.Equal("none", (string?)Handling("A-1")["health"]);
        Assert.Equal(JTokenType.Null, Handling("A-1")["fault_low_ma"]!.Type);
        Assert.Equal(JTokenType.Null, Handling("A-1")["on_fault_value"]!.Type);
        Assert.Equal(0.0, (double)Handling("A-2")["on_fault_value"]!); // low: the smaller end of a reverse range
        Assert.Equal(100.0, (double)Handling("A-3")["on_fault_value"]!);
        Assert.Equal(2.0, (double)Handling("A-3")["filter_s"]!);
        Assert.Equal("custom", (string?)Handling("A-4")["health"]);
        Assert.Equal(3.7, (double)Handling("A-4")["fault_low_ma"]!);
        Assert.Equal(21.2, (double)Handling("A-4")["fault_high_ma"]!);
        Assert.Equal("value", (string?)Handling("A-4")["on_fault"]);
        Assert.Equal(42.5, (double)Handling("A-4")["on_fault_value"]!);
    }

    [Fact]
    public void Square_root_point_trips_on_the_square()
    {
        var document = Emit(TestInputs.StandardCard + """

            point FT-1 { card AI16 at "a"; range 0 .. 100 m3/h; sqrt cutoff 2 %; health ne43; alarm H 50 deadband 5 % }
            """);
        var point = PointOf(document, "FT-1");
        Assert.True((bool)point["signal"]!["square_root"]!);
        Assert.Equal(2.0, (double)point["signal"]!["cutoff_percent"]!);
        // ISO 5167-1: 50 % of flow is 25 % of the differential pressure, i.e. 8 mA on a 4-20 mA signal.
        Assert.Equal(8.0, (double)point["alarms"]![0]!["trip_ma"]!, 9);
        Assert.Equal(6912L, (long)point["alarms"]![0]!["trip_raw"]!); // 25 % of 27648 counts
    }

    [Fact]
    public void Setpoint_beyond_the_card_has_no_raw_boundary()
    {
        var document = Emit(TestInputs.StandardCard + """

            point PT-1 { card AI16 at "a"; range 0 .. 100 kPa; health ne43; alarm HH 1000 }
            """);
        var alarm = PointOf(document, "PT-1")["alarms"]![0]!;
        Assert.Equal("never", (string?)alarm["trip_raw_test"]);
        Assert.Equal(JTokenType.Null, alarm["trip_raw"]!.Type);
        Assert.Equal(164.0, (double)alarm["trip_ma"]!, 9); // 4 + 16 * 1000 / 100: beyond the card, still stated
    }

    [Fact]
    public void Default_message_is_tag_description_and_kind_in_words()
    {
        var document = Emit(TestInputs.StandardCard + """

            point FIT-101 {
              desc "Raw water flow"
              card AI16 at "a"
              range 0 .. 450 m3/h
              health ne43
              alarm HH 430
              alarm H 400
              alarm L 40 text "   "
              alarm LL 10
            }
            point PT-9 { card AI16 at "a"; range 0 .. 10 bar; health ne43; alarm H 9 }
            """);
        Assert.Equal(
            ["FIT-101 Raw water flow high high", "FIT-101 Raw water flow high", "FIT-101 Raw water flow low", "FIT-101 Raw water flow low low"],
            PointOf(document, "FIT-101")["alarms"]!.Select(a => (string)a["message"]!).ToArray());
        Assert.Equal("PT-9 high", (string?)PointOf(document, "PT-9")["alarms"]![0]!["message"]);
    }

    [Fact]
    public void Hostile_text_stays_inside_its_json_strings()
    {
        const string hostile = "end *) (* start \\\" quote $ dollar ]]> <!-- \t tab \u0001 \u2028 \" } {";
        var scale = TestInputs.StandardCard + "\nplant \"" + hostile.Replace("\\", "\\\\").Replace("\"", "\\\"") + "\"\n" +
            "point P-1 {\n  desc \"" + hostile.Replace("\\", "\\\\").Replace("\"", "\\\"") + "\"\n  card AI16 at \"a\"\n  range 0 .. 1 m\n  health ne43\n" +
            "  alarm H 0.5 text \"" + hostile.Replace("\\", "\\\\").Replace("\"", "\\\"") + "\"\n}\n";
        var compilation = TestInputs.Compile(scale);
        var json = EmitText(compilation);
        SchemaFiles.AssertValid(SchemaFiles.Alarms, json);
        using var strict = System.Text.Json.JsonDocument.Parse(json); // a second, strict parser
        var root = strict.RootElement;
        Assert.Equal(hostile, root.GetProperty("plant").GetString());
        var point = root.GetProperty("points")[0];
        Assert.Equal(hostile, point.GetProperty("description").GetString());
        Assert.Equal(hostile, point.GetProperty("alarms")[0].GetProperty("message").GetString());
        Assert.DoesNotContain('\u0001', json); // control characters are escaped, never raw
        Assert.DoesNotContain('\u2028', json);
    }

    [Fact]
    public void One_point_changed_changes_only_its_own_lines()
    {
        var before = TestInputs.ExampleFiles.Select(ScaleGen.Text.SourceText.FromFile).ToArray();
        var treatment = before.Single(s => s.Path.EndsWith("treatment.scale", StringComparison.Ordinal));
        var changedText = treatment.Text.Replace("alarm H 8.8 deadband 0.15 pH", "alarm H 8.9 deadband 0.2 pH");
        Assert.NotEqual(treatment.Text, changedText);
        var after = before.Select(s => s == treatment ? new ScaleGen.Text.SourceText(s.Path, changedText) : s).ToArray();

        var oldLines = EmitText(Compilation.Compile(before)).Split('\n');
        var newLines = EmitText(Compilation.Compile(after)).Split('\n');
        Assert.Equal(oldLines.Length, newLines.Length);
        var changed = Enumerable.Range(0, oldLines.Length).Where(i => oldLines[i] != newLines[i]).ToList();
        // The source hash of treatment.scale, and AIT-302's setpoint, deadband, reset value and trip/reset currents and counts.
        var hashLine = Assert.Single(changed, i => oldLines[i].Contains("sha256", StringComparison.Ordinal));
        var pointStart = Array.FindIndex(oldLines, l => l.Contains("\"tag\": \"AIT-302\"", StringComparison.Ordinal));
        var pointEnd = Array.FindIndex(oldLines, pointStart + 1, l => l.Contains("\"tag\":", StringComparison.Ordinal));
        Assert.All(changed.Where(i => i != hashLine), i => Assert.InRange(i, pointStart, pointEnd));
        Assert.True(changed.Count > 3);
    }

    [Fact]
    public void Output_is_byte_identical_across_runs_and_cultures()
    {
        var first = EmitText(TestInputs.CompileExample());
        var second = EmitText(TestInputs.CompileExample());
        var german = TestInputs.UnderCulture("de-DE", () => EmitText(TestInputs.CompileExample()));
        Assert.Equal(first, second);
        Assert.Equal(first, german);
        Assert.Contains("\"cycle_s\": 0.1,", first); // a decimal point, never a comma
    }
}
