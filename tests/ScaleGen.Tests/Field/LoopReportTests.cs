using Newtonsoft.Json.Linq;
using ScaleGen.Emit;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Field;

public class LoopReportTests
{
    // The standard card has input 250 ohm: with no cable, barrier or extra, the loop is 250 ohm.
    private const string Budgets = """
        point PT-24 {
          card AI16 at "A.1"
          range 0 .. 10 bar
          loop { supply 24 V; device 9 V }
        }
        point PT-15 {
          card AI16 at "A.2"
          range 0 .. 10 bar
          loop { supply 15 V; device 9 V }
        }
        """;

    private static JObject LoopJson(string points)
    {
        var result = TestInputs.RunCli("loop", FieldPlants.File(points), "--json");
        FieldSchemas.AssertLoop(result.Out);
        return JObject.Parse(result.Out);
    }

    private static JObject Loop(JObject json, string tag) =>
        (JObject)json["loops"]!.Single(l => (string)l["point"]! == tag);

    [Fact]
    public void Largest_resistance_and_smallest_supply()
    {
        var json = LoopJson(Budgets);
        var at24 = Loop(json, "PT-24");
        Assert.Equal(750.0, (double)at24["max_ohm"]!, 9); // common practice: (24 V - 9 V) / 20 mA
        Assert.Equal(250.0, (double)at24["total_ohm"]!, 9);
        Assert.Equal(14.0, (double)at24["min_supply_v"]!, 9); // common practice: a 250 ohm loop needs 14 V
        Assert.Equal(10.0, (double)at24["margin_v"]!, 9);
        Assert.Equal(JTokenType.Null, at24["hart_ok"]!.Type);
        Assert.True((bool)at24["ok"]!);
        Assert.Equal(300.0, (double)Loop(json, "PT-15")["max_ohm"]!, 9); // common practice: (15 V - 9 V) / 20 mA
        Assert.True((bool)json["ok"]!);
    }

    [Fact]
    public void A_supply_below_what_the_loop_needs_fails_with_exit_1()
    {
        var path = FieldPlants.File("""
            point PT-1 {
              card AI16 at "A.1"
              range 0 .. 10 bar
              loop { supply 13.9 V; device 9 V }
            }
            """);
        var json = TestInputs.RunCli("loop", path, "--json");
        Assert.Equal(1, json.ExitCode); // common practice: a 250 ohm loop needs 14 V
        FieldSchemas.AssertLoop(json.Out);
        Assert.False((bool)JObject.Parse(json.Out)["ok"]!);
        Assert.False((bool)JObject.Parse(json.Out)["loops"]![0]!["ok"]!);
        var table = TestInputs.RunCli("loop", path);
        Assert.Equal(1, table.ExitCode);
        Assert.Contains("FAIL", table.Out);
        Assert.Contains("SG2005", table.Error);
    }

    [Fact]
    public void Cable_of_500_m_1_mm2_adds_18_1_ohm()
    {
        var row = Loop(LoopJson("""
            point PT-1 {
              card AI16 at "A.1"
              range 0 .. 10 bar
              loop { supply 24 V; device 9 V; cable 500 m 1.0 mm2 }
            }
            """), "PT-1");
        Assert.Equal(18.1, (double)row["cable_ohm"]!, 9); // IEC 60228 (from memory): 18.1 ohm/km, class 1/2, two conductors of 500 m
        Assert.Equal(18.1, (double)row["conductor_ohm_per_km"]!, 9); // IEC 60228 (from memory)
        Assert.Equal(268.1, (double)row["total_ohm"]!, 9);
        Assert.Equal("1 mm2", (string)row["conductor"]!);
        Assert.Equal(500.0, (double)row["cable_m"]!);
    }

    [Fact]
    public void One_km_of_18_awg_one_way_adds_about_41_9_ohm()
    {
        var row = Loop(LoopJson("""
            point PT-1 {
              card AI16 at "A.1"
              range 0 .. 10 bar
              loop { supply 24 V; device 9 V; cable 1 km 18 AWG }
            }
            """), "PT-1");
        Assert.Equal(41.9, (double)row["cable_ohm"]!, 1); // ASTM B258 formula, IACS copper: 2 x 1 km x 20.95 ohm/km
    }

    [Fact]
    public void A_hart_loop_with_200_ohm_in_total_is_flagged()
    {
        var text = """
            card AI200 {
              counts 0 .. 27648 at 4 .. 20 mA
              limits -4864 .. 32511
              input 200 ohm
            }
            point FT-1 {
              card AI200 at "A.1"
              range 0 .. 10 bar
              loop { supply 24 V; device 9 V; hart }
            }
            """;
        var row = Loop(LoopJson(text), "FT-1");
        Assert.Equal(200.0, (double)row["total_ohm"]!, 9);
        Assert.False((bool)row["hart_ok"]!); // HART (from memory): 230 ohm minimum
        Assert.True((bool)row["hart"]!);
        Assert.True((bool)row["ok"]!); // the supply itself is fine: HART is reported, not failed

        var path = FieldPlants.File(text);
        var table = TestInputs.RunCli("loop", path);
        Assert.Equal(0, table.ExitCode);
        Assert.Matches(@"FT-1 .* LOW +- +OK", table.Out); // HART (from memory)
        var check = TestInputs.RunCli("check", path);
        Assert.Contains("SG2006", check.Out);
    }

    [Fact]
    public void Upscale_failure_current_is_checked()
    {
        // 9 V + 21 mA * 250 ohm = 14.25 V: a 14.1 V supply covers 20 mA but not the NE 43 upscale current.
        var row = Loop(LoopJson("""
            point PT-1 {
              card AI16 at "A.1"
              range 0 .. 10 bar
              health ne43
              loop { supply 14.1 V; device 9 V }
            }
            """), "PT-1");
        Assert.True((bool)row["ok"]!); // common practice: 14 V needed at 20 mA
        Assert.Equal(21.0, (double)row["upscale_fault_ma"]!); // NAMUR NE 43
        Assert.Equal(14.25, (double)row["upscale_min_supply_v"]!, 9);
        Assert.False((bool)row["upscale_ok"]!);
    }

    [Fact]
    public void Table_lists_every_resistance_and_the_caution()
    {
        var result = TestInputs.RunCli(["loop", .. TestInputs.ExampleFiles]);
        Assert.Equal(0, result.ExitCode);
        Assert.Equal("", result.Error);
        foreach (var header in new[] { "supply", "device", "current", "card", "shunt", "barrier", "cable", "extra", "total", "max", "min supply", "margin", "HART", "upscale", "result" })
            Assert.Contains(header, result.Out.Split('\n')[0]);
        Assert.Contains("not an intrinsic-safety entity check", result.Out);
        Assert.Contains("local codes", result.Out);
        Assert.Contains("IEC 60228 class 1/2", result.Out);
        Assert.Contains("0.127 mm * 92^((36 - n) / 39)", result.Out);
        // One row per point with a loop block, with aligned columns: every row as long as the header or shorter.
        var rows = LoopReport.Rows(TestInputs.CompileExample().Plant);
        Assert.Equal(TestInputs.CompileExample().Plant.Points.Count(p => p.Loop is not null), rows.Count);
        foreach (var row in rows) Assert.Contains("\n" + row.Point.Tag + " ", result.Out);
        // The result column starts at the same position on every row.
        var lines = result.Out.Split('\n').Skip(2).Take(rows.Count).ToList();
        Assert.Single(lines.Select(l => l.LastIndexOf("OK", StringComparison.Ordinal)).Distinct());
    }

    [Fact]
    public void Example_budget_json_is_valid_and_every_loop_passes()
    {
        var result = TestInputs.RunCli(["loop", .. TestInputs.ExampleFiles, "--json"]);
        Assert.Equal(0, result.ExitCode);
        FieldSchemas.AssertLoop(result.Out);
        var json = JObject.Parse(result.Out);
        Assert.True((bool)json["ok"]!);
        // A voltage card's loop counts its shunt, not a card input.
        var shunted = Loop(json, "LDIT-105");
        Assert.Equal(250.0, (double)shunted["shunt_ohm"]!); // common practice: 250 ohm turns 4-20 mA into 1-5 V
        Assert.Equal(0.0, (double)shunted["card_ohm"]!);
    }

    [Fact]
    public void The_emitter_writes_the_same_rows_as_the_command()
    {
        var compilation = TestInputs.CompileExample();
        var files = OutputCatalog.Find("loop")!.Emit(EmitContext.From(compilation)).ToDictionary(f => f.RelativePath, f => f.Content);
        Assert.Equal([LoopEmitter.TextFile, LoopEmitter.JsonFile], files.Keys.ToArray());
        var table = TestInputs.RunCli(["loop", .. TestInputs.ExampleFiles]).Out;
        Assert.EndsWith(table, files[LoopEmitter.TextFile]);
        Assert.StartsWith("# Loop power budget\n# Generated by scalegen", files[LoopEmitter.TextFile]);
        FieldSchemas.AssertLoop(files[LoopEmitter.JsonFile]);
        var fromFile = JObject.Parse(files[LoopEmitter.JsonFile]);
        var fromCommand = JObject.Parse(TestInputs.RunCli(["loop", .. TestInputs.ExampleFiles, "--json"]).Out);
        Assert.True(JToken.DeepEquals(fromCommand["loops"], fromFile["loops"]));
        Assert.Equal(3, fromFile["generated"]!["sources"]!.Count());
    }

    [Fact]
    public void The_schema_rejects_a_renamed_field()
    {
        // Proves the schema check bites: "total_ohm" is a contract name.
        var json = TestInputs.RunCli(["loop", .. TestInputs.ExampleFiles, "--json"]).Out.Replace("\"total_ohm\"", "\"total_ohms\"");
        Assert.ThrowsAny<Xunit.Sdk.XunitException>(() => FieldSchemas.AssertLoop(json));
    }

    [Fact]
    public void No_loop_blocks_is_no_failure()
    {
        var path = FieldPlants.File("""
            point AT-1 {
              card AI16 at "A.1"
              range 0 .. 14 pH
            }
            """);
        var result = TestInputs.RunCli("loop", path);
        Assert.Equal(0, result.ExitCode);
        Assert.Contains("No point has a loop block", result.Out);
        var json = TestInputs.RunCli("loop", path, "--json");
        FieldSchemas.AssertLoop(json.Out);
        Assert.Empty((JArray)JObject.Parse(json.Out)["loops"]!);
    }

    [Fact]
    public void Input_errors_exit_1_and_a_missing_file_exits_2()
    {
        var bad = FieldPlants.File("point PT-1 { card NOPE at \"A\"; range 0 .. 1 bar }");
        var result = TestInputs.RunCli("loop", bad);
        Assert.Equal(1, result.ExitCode);
        Assert.Contains("error SG1002", result.Error);
        Assert.Equal("", result.Out);
        var missing = TestInputs.RunCli("loop", "/nonexistent/plant.scale");
        Assert.Equal(2, missing.ExitCode);
        Assert.DoesNotContain("   at ", missing.Error);
    }

    [Fact]
    public void Output_is_the_same_under_de_DE()
    {
        string[] table = ["loop", .. TestInputs.ExampleFiles];
        string[] json = [.. table, "--json"];
        Assert.Equal(TestInputs.RunCli(table).Out, TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli(table).Out));
        Assert.Equal(TestInputs.RunCli(json).Out, TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli(json).Out));
    }
}
