using System.Text.Json.Nodes;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Cli;

/// <summary>
/// `scalegen eval` against check values from outside the project; each check names its
/// source as /work/shared/reference/check-values.md and DEVELOPERS.md write it.
/// </summary>
public sealed class EvalCommandTests : IDisposable
{
    private const string Plant = """
        card ai {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511
          fault-code 32767
        }
        card ai_zero {
          counts 0 .. 27648 at 0 .. 20 mA
          limits 0 .. 32511
          fault-code 32767
        }
        card av {
          counts 0 .. 4000 at 1 .. 5 V
          limits -500 .. 4500
        }
        point LIN-1 { card ai at "a"; range 0 .. 200 kPa; health ne43; measure pressure; alarm H 150 deadband 2 %; alarm L 20 deadband 2 % }
        point DP-1 { card ai at "b"; range 0 .. 100 %; sqrt cutoff 3 %; health ne43; measure flow }
        point DP-2 { card ai at "c"; range 10 .. 110 m3/h; sqrt cutoff 3 %; health ne43; measure flow }
        point REV-1 { card ai at "d"; range 100 .. 0 %; health ne43 }
        point VOLT-1 { card av at "e"; shunt 250 ohm; range 0 .. 100 %; health ne43 }
        point ZERO-1 { card ai_zero at "f"; range 0 .. 14 pH; health ne43 }
        """;

    private readonly TempFolder _folder = new();
    private readonly string _file;

    public EvalCommandTests() => _file = _folder.Write("eval.scale", Plant);

    public void Dispose() => _folder.Dispose();

    private JsonObject Eval(string tag, params string[] input)
    {
        var result = TestInputs.RunCli(["eval", _file, "--point", tag, .. input, "--json"]);
        Assert.True(result.ExitCode == 0, result.Error);
        SchemaFiles.AssertValid(SchemaFiles.Eval, result.Out);
        return JsonNode.Parse(result.Out)!.AsObject();
    }

    private static double D(JsonObject reading, string field) => reading[field]!.GetValue<double>();

    [Fact]
    public void The_plant_compiles_clean()
    {
        var compilation = TestInputs.Compile(Plant);
        Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics));
    }

    [Theory]
    [InlineData(4.0, 0.0, 0.0)]
    [InlineData(12.0, 50.0, 100.0)]
    [InlineData(20.0, 100.0, 200.0)]
    public void Linear_point_4_12_20_mA(double ma, double percent, double value)
    {
        var reading = Eval("LIN-1", "--ma", ma.ToString(System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(percent, D(reading, "percent"), 9); // IEC 60381-1; common practice: 4 mA = 0 %, 12 mA = 50 %, 20 mA = 100 %
        Assert.Equal(value, D(reading, "value"), 9); // IEC 60381-1; common practice
        Assert.Equal("OK", (string?)reading["status"]);
        Assert.Equal("kPa", (string?)reading["unit"]);
    }

    [Fact]
    public void Twelve_mA_reads_mid_count_and_sets_the_alarms()
    {
        var reading = Eval("LIN-1", "--ma", "12");
        Assert.Equal(13824, reading["raw"]!.GetValue<long>()); // half of 27648 counts: IEC 60381-1; common practice
        Assert.Equal(12.0, D(reading, "ma"), 12);
        Assert.False(reading["alarms"]!["H"]!.GetValue<bool>());
        Assert.False(reading["alarms"]!["L"]!.GetValue<bool>());
        var high = Eval("LIN-1", "--ma", "18"); // 4 + 16 * 150 / 200 = 16 mA is the setpoint
        Assert.True(high["alarms"]!["H"]!.GetValue<bool>());
    }

    [Theory]
    [InlineData(8.0, 25.0, 50.000)]
    [InlineData(12.0, 50.0, 70.711)]
    [InlineData(16.0, 75.0, 86.603)]
    [InlineData(20.0, 100.0, 100.000)]
    public void Dp_flow_is_the_square_root_of_the_signal(double ma, double percent, double flow)
    {
        var reading = Eval("DP-1", "--ma", ma.ToString(System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(percent, D(reading, "percent"), 9); // percent is the DP signal, before extraction
        Assert.Equal(flow, D(reading, "value"), 3); // ISO 5167-1: Q / Q_max = sqrt(dP / dP_max)
    }

    [Theory]
    [InlineData("4")]
    [InlineData("4.01")] // sqrt(0.01 / 16) = 2.5 % of flow, below the 3 % cutoff
    public void Below_the_cutoff_the_value_is_LRV(string ma)
    {
        var reading = Eval("DP-2", "--ma", ma);
        Assert.Equal(10.0, D(reading, "value")); // common practice: a low-flow cutoff shows LRV
        Assert.Equal("OK", (string?)reading["status"]);
    }

    [Fact]
    public void Just_above_the_cutoff_the_value_follows_the_root()
    {
        var reading = Eval("DP-2", "--ma", "4.02"); // sqrt(0.02 / 16) = 3.5 % of flow
        Assert.Equal(10 + 100 * Math.Sqrt(D(reading, "percent") / 100), D(reading, "value"), 9); // ISO 5167-1
        Assert.True(D(reading, "value") > 13.0);
    }

    [Theory]
    [InlineData("3.5", "FAULT_LOW")] // NAMUR NE 43: failure at or below 3.6 mA
    [InlineData("3.7", "UNDER")] // NAMUR NE 43: below 4 mA but not yet failure
    [InlineData("20.7", "OVER")] // NAMUR NE 43: above 20 mA but not yet failure
    [InlineData("21.5", "FAULT_HIGH")] // NAMUR NE 43: failure at or above 21.0 mA
    public void Ne43_bands(string ma, string status) =>
        Assert.Equal(status, (string?)Eval("LIN-1", "--ma", ma)["status"]);

    [Fact]
    public void Faults_turn_the_alarms_off_and_hold_shows_LRV()
    {
        var reading = Eval("LIN-1", "--ma", "3.5"); // NAMUR NE 43
        Assert.Equal(0.0, D(reading, "value")); // hold with no history: LRV
        Assert.False(reading["alarms"]!["L"]!.GetValue<bool>());
    }

    [Theory]
    [InlineData("32767")] // the card's fault code
    [InlineData("32600")] // beyond the card's limits
    [InlineData("-5000")]
    public void Card_fault_code_or_beyond_limits_is_CARD_FAULT(string raw) =>
        Assert.Equal("CARD_FAULT", (string?)Eval("LIN-1", "--raw", raw)["status"]);

    [Theory]
    [InlineData("1", 4.0, 0.0)] // common practice: 250 ohm turns 4 mA into 1 V
    [InlineData("3", 12.0, 50.0)] // common practice: 12 mA gives 3 V
    [InlineData("5", 20.0, 100.0)] // common practice: 20 mA gives 5 V
    public void Voltage_card_with_a_250_ohm_shunt(string volts, double ma, double percent)
    {
        var reading = Eval("VOLT-1", "--volts", volts);
        Assert.Equal(ma, D(reading, "ma"), 9); // common practice (Ohm's law across 250 ohm)
        Assert.Equal(percent, D(reading, "percent"), 9); // IEC 60381-1; common practice
        Assert.Equal(percent, D(reading, "value"), 9);
        Assert.Equal("OK", (string?)reading["status"]);
    }

    [Theory]
    [InlineData("4", 100.0)]
    [InlineData("8", 75.0)] // 25 % of the signal span on a reversed range
    [InlineData("12", 50.0)] // IEC 60381-1; common practice: 12 mA is mid-span either way round
    [InlineData("20", 0.0)]
    public void Reverse_action(string ma, double value) =>
        Assert.Equal(value, D(Eval("REV-1", "--ma", ma), "value"), 9); // IEC 60381-1; common practice

    [Fact]
    public void Zero_to_20_mA_card_reading_a_4_to_20_mA_transmitter()
    {
        // The card's counts stand for 0..20 mA; the transmitter's live zero sits at 5529.6 counts.
        var mid = Eval("ZERO-1", "--ma", "12");
        var oneCount = 20.0 / 27648;
        Assert.Equal(12.0, D(mid, "ma"), oneCount); // within one count of the card
        Assert.Equal(50.0, D(mid, "percent"), 100 * oneCount / 16); // IEC 60381-1; common practice: 12 mA = 50 %
        Assert.Equal(7.0, D(mid, "value"), 14 * oneCount / 16);
        var top = Eval("ZERO-1", "--raw", "27648");
        Assert.Equal(20.0, D(top, "ma"), 12);
        Assert.Equal(100.0, D(top, "percent"), 9); // IEC 60381-1; common practice: 20 mA = 100 %
        // A broken wire reads 0 mA on this card: below the live zero, so NE 43 calls it a failure.
        Assert.Equal("FAULT_LOW", (string?)Eval("ZERO-1", "--raw", "0")["status"]); // common practice; NAMUR NE 43
    }

    [Theory]
    [InlineData("--ma", "12", "--raw", "100")]
    [InlineData("--ma", "12", "--volts", "3")]
    [InlineData("--raw", "13824", "--volts", "3")]
    public void Inputs_are_exclusive(params string[] input)
    {
        var result = TestInputs.RunCli(["eval", _file, "--point", "LIN-1", .. input]);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("exactly one of --ma, --raw or --volts", result.Error);
        Assert.Equal("", result.Out);
    }

    [Fact]
    public void An_input_is_required()
    {
        var result = TestInputs.RunCli("eval", _file, "--point", "LIN-1");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("exactly one of", result.Error);
    }

    [Theory]
    [InlineData("--ma", "12,5")]
    [InlineData("--ma", "abc")]
    [InlineData("--ma", "NaN")]
    [InlineData("--ma", "Infinity")]
    [InlineData("--volts", "3,0")]
    [InlineData("--raw", "1.5")]
    [InlineData("--raw", "99999")] // beyond what the card's INT can hold
    public void Bad_numbers_are_usage_errors(string option, string value)
    {
        var result = TestInputs.RunCli("eval", _file, "--point", "LIN-1", option, value);
        Assert.Equal(2, result.ExitCode);
        Assert.Equal("", result.Out);
        Assert.StartsWith("scalegen: ", result.Error);
        Assert.DoesNotContain("   at ", result.Error); // no stack trace
    }

    [Fact]
    public void Bad_numbers_are_usage_errors_under_de_DE_too()
    {
        // A German machine would write 12,5; the tool reads numbers one way everywhere.
        var result = TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli("eval", _file, "--point", "LIN-1", "--ma", "12,5"));
        Assert.Equal(2, result.ExitCode);
    }

    [Fact]
    public void Unknown_point_is_a_usage_error()
    {
        var result = TestInputs.RunCli("eval", _file, "--point", "LIN-9", "--ma", "12");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("LIN-1", result.Error); // suggests the near miss
    }

    [Fact]
    public void Output_is_the_same_under_de_DE()
    {
        string[] args = ["eval", _file, "--point", "DP-1", "--ma", "12.5", "--json"];
        var invariant = TestInputs.RunCli(args);
        var german = TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli(args));
        Assert.Equal(0, german.ExitCode);
        Assert.Equal(invariant.Out, german.Out);
        SchemaFiles.AssertValid(SchemaFiles.Eval, german.Out);
        Assert.Contains("\"percent\": 53.125", german.Out); // (12.5 - 4) / 16, with a decimal point

        var text = TestInputs.UnderCulture("de-DE", () => TestInputs.RunCli("eval", _file, "--point", "DP-1", "--ma", "16"));
        Assert.Contains("value    86.603 %", text.Out); // ISO 5167-1
    }
}
