using System.Globalization;
using System.Text.RegularExpressions;
using Newtonsoft.Json.Linq;
using ScaleGen.Tests.Support;
using ScaleGen.Text;
using ScaleGen.Verify;

namespace ScaleGen.Tests.Verify;

/// <summary>
/// Hand edits of the .st text that change what the code does must fail verify, naming the
/// point and the first failing case; a construct outside the subset must fail, not be skipped.
/// </summary>
public class VerifyTamperTests
{
    /// <summary>A plant with unfiltered points, whose alarms are decided on raw counts.</summary>
    private const string UnfilteredPlant = TestInputs.StandardCard + """

        point PT-1 {
          card AI16 at "A1"
          range 0 .. 10 bar
          health ne43
          alarm H 8 deadband 0.5 bar
          alarm L 2 deadband 0.5 bar delay 2 s clear 1 s
        }
        point PT-2 {
          card AI16 at "A2"
          range 0 .. 10 bar
          health ne43
        }
        """;

    private static (Compilation Compilation, string Library, string Plant) Generate(Compilation compilation)
    {
        var st = PlantVerifier.GenerateStructuredText(compilation);
        return (compilation, st.Single(s => s.Path == "library.st").Text, st.Single(s => s.Path == "plant.st").Text);
    }

    private static VerifyResult Run(Compilation compilation, string library, string plant) =>
        PlantVerifier.Verify(compilation.Plant, [new SourceText("library.st", library), new SourceText("plant.st", plant)]);

    /// <summary>Replaces the first match of a pattern after a point's parameter record starts.</summary>
    private static string EditParameters(string plant, string parameters, string pattern, Func<Match, string> replace)
    {
        var start = plant.IndexOf(parameters + " : SG_PointParams", StringComparison.Ordinal);
        Assert.True(start >= 0, parameters);
        var regex = new Regex(pattern);
        var match = regex.Match(plant, start);
        Assert.True(match.Success, pattern);
        return plant[..match.Index] + replace(match) + plant[(match.Index + match.Length)..];
    }

    private static int Field(string plant, string parameters, string field) =>
        int.Parse(Regex.Match(plant[plant.IndexOf(parameters + " : SG_PointParams", StringComparison.Ordinal)..], field + @" := (-?\d+)").Groups[1].Value, CultureInfo.InvariantCulture);

    [Fact]
    public void A_changed_gain_and_a_removed_deadband_in_plant_st_fail_their_points()
    {
        var (compilation, library, plant) = Generate(TestInputs.CompileExample());
        // ZT-110: its gain one part in 10^5 off. LT-101 (filtered): its H reset value set to the setpoint.
        plant = EditParameters(plant, "ZT_110_Par", @"Gain := ([-0-9.E]+)", m =>
            "Gain := " + (float.Parse(m.Groups[1].Value, CultureInfo.InvariantCulture) * 1.00001f).ToString("R", CultureInfo.InvariantCulture));
        plant = EditParameters(plant, "LT_101_Par", @"ResetValue := 12\.75", _ => "ResetValue := 13.5");

        var result = Run(compilation, library, plant);
        Assert.Null(result.Problem);
        Assert.False(result.Ok);
        Assert.Equal(["LT-101", "ZT-110"], result.Points.Where(p => !p.Ok).Select(p => p.Point).Order());

        var gain = result.Points.Single(p => p.Point == "ZT-110").FirstFailure!;
        Assert.Equal("Value", gain.What);
        Assert.Equal(VerifySweep.OneScan, gain.CaseName);
        Assert.Equal(1, gain.Scan);

        var deadband = result.Points.Single(p => p.Point == "LT-101").FirstFailure!;
        Assert.Equal("AlarmH", deadband.What);
        Assert.StartsWith("H deadband", deadband.CaseName);
        Assert.Equal("TRUE", deadband.Expected);
        Assert.Equal("FALSE", deadband.Got);
    }

    [Fact]
    public void A_flipped_status_comparison_in_library_st_fails_at_the_band_edge()
    {
        var (compilation, library, plant) = Generate(TestInputs.CompileExample());
        const string original = "ELSIF (Raw >= Par.FaultHighMin) AND";
        Assert.Contains(original, library);
        library = library.Replace(original, "ELSIF (Raw > Par.FaultHighMin) AND", StringComparison.Ordinal);

        var result = Run(compilation, library, plant);
        Assert.False(result.Ok);
        var first = result.Points[0];
        Assert.Equal("LT-101", first.Point);
        var failure = first.FirstFailure!;
        Assert.Equal("Status", failure.What);
        Assert.Equal(Field(plant, "LT_101_Par", "FaultHighMin"), failure.Raw); // 21 mA, NAMUR NE 43
        Assert.Equal("SG_FAULT_HIGH", failure.Expected);
        Assert.Equal("SG_OVER", failure.Got);
    }

    [Fact]
    public void A_flipped_alarm_comparison_fails_an_unfiltered_point_at_its_trip_count()
    {
        var (compilation, library, plant) = Generate(TestInputs.Compile(UnfilteredPlant));
        const string original = "Condition := (Raw >= Par.TripRawMin) AND (Raw <= Par.TripRawMax);";
        Assert.Contains(original, library);
        library = library.Replace(original, "Condition := (Raw > Par.TripRawMin) AND (Raw <= Par.TripRawMax);", StringComparison.Ordinal);

        var result = Run(compilation, library, plant);
        var point = result.Points.Single(p => p.Point == "PT-1");
        Assert.False(point.Ok);
        Assert.Equal("AlarmH", point.FirstFailure!.What);
        Assert.Equal(Field(plant, "PT_1_Par", "TripRawMin"), point.FirstFailure.Raw);
        Assert.True(result.Points.Single(p => p.Point == "PT-2").Ok);
    }

    [Fact]
    public void A_removed_deadband_fails_an_unfiltered_point()
    {
        var (compilation, library, plant) = Generate(TestInputs.Compile(UnfilteredPlant));
        // H clears as soon as the value is below the setpoint: the clear range reaches up to the trip count.
        var trip = Field(plant, "PT_1_Par", "TripRawMin");
        plant = EditParameters(plant, "PT_1_Par", @"ClearRawMax := -?\d+", _ => $"ClearRawMax := {trip - 1}");

        var result = Run(compilation, library, plant);
        var point = result.Points.Single(p => p.Point == "PT-1");
        Assert.False(point.Ok);
        Assert.Equal("AlarmH", point.FirstFailure!.What);
        Assert.StartsWith("H deadband", point.FirstFailure.CaseName);
        Assert.True(result.Points.Single(p => p.Point == "PT-2").Ok);
    }

    [Fact]
    public void A_program_that_does_not_split_by_point_runs_in_lockstep()
    {
        var (compilation, library, plant) = Generate(TestInputs.CompileExample());
        // A statement that reads two points: each point can no longer run alone.
        plant = plant.Replace("\nEND_PROGRAM", "\nAnyFault := LT_101.Fault OR LT_102.Fault;\nEND_PROGRAM", StringComparison.Ordinal)
            .Replace("PROGRAM SG_Plant\n", "PROGRAM SG_Plant\nVAR\n    AnyFault : BOOL;\nEND_VAR\n", StringComparison.Ordinal);

        var result = Run(compilation, library, plant);
        Assert.False(result.PerPoint);
        Assert.True(result.Ok, string.Join("\n", result.Points.Where(p => !p.Ok).Select(p => $"{p.Point}: {p.FirstFailure}")));
    }

    [Fact]
    public void A_call_with_another_points_parameters_fails_that_point()
    {
        var (compilation, library, plant) = Generate(TestInputs.CompileExample());
        const string call = "PT_112(Raw := INT_TO_DINT(PT_112_Raw), Par := PT_112_Par);";
        Assert.Contains(call, plant);
        // PT-301 has the same range as PT-112 but other alarm setpoints and an L and LL alarm.
        plant = plant.Replace(call, "PT_112(Raw := INT_TO_DINT(PT_112_Raw), Par := PT_301_Par);", StringComparison.Ordinal);

        var result = Run(compilation, library, plant);
        Assert.False(result.PerPoint);
        Assert.Equal(["PT-112"], result.Points.Where(p => !p.Ok).Select(p => p.Point));
    }

    [Theory]
    [InlineData("x := y MOD 3;\n", "'MOD' is not in the Structured Text subset", 8)]
    [InlineData("FOR i := 1 TO 3 DO Reading := Reading; END_FOR;\n", "'FOR' is not in the Structured Text subset", 1)]
    public void An_unknown_construct_fails_verify_at_its_position(string injected, string message, int column)
    {
        var (compilation, library, plant) = Generate(TestInputs.CompileExample());
        const string anchor = "(* 3. Fault action";
        var at = library.IndexOf(anchor, StringComparison.Ordinal);
        library = library[..at] + injected + library[at..];
        var line = library[..at].Count(c => c == '\n') + 1;

        var result = Run(compilation, library, plant);
        Assert.False(result.Ok);
        Assert.Empty(result.Points);
        var problem = result.Problem!;
        Assert.Equal("library.st", problem.Path);
        Assert.Equal(line, problem.Line);
        Assert.Equal(column, problem.Column);
        Assert.Contains(message, problem.Message);
    }

    /// <summary>As a new user would: write the Structured Text, edit a constant by hand, run verify on the files.</summary>
    [Fact]
    public void A_hand_edited_file_fails_the_command_with_the_point_and_case()
    {
        var (_, library, plant) = Generate(TestInputs.CompileExample());
        var folder = Directory.CreateTempSubdirectory("scalegen-verify-").FullName;
        try
        {
            plant = EditParameters(plant, "FIT_101_Par", @"Offset := ([-0-9.E]+)", _ => "Offset := 0.001");
            var libraryPath = Path.Combine(folder, "library.st");
            var plantPath = Path.Combine(folder, "plant.st");
            File.WriteAllText(libraryPath, library);
            File.WriteAllText(plantPath, plant);

            var args = new List<string> { "verify" };
            args.AddRange(TestInputs.ExampleFiles);
            args.AddRange(["--st", libraryPath, plantPath]);
            var text = TestInputs.RunCli(args.ToArray());
            Assert.Equal(1, text.ExitCode);
            Assert.Matches(@"(?m)^FIT-101\s.*FAIL$", text.Out);
            Assert.Matches(@"(?m)^FIT-101: first failure in case \d+ \(.+\), scan \d+, raw -?\d+: Value expected .+, got .+$", text.Out);
            Assert.Contains("verify: FAILED: 1 of 27 points disagree with the reference", text.Out);

            args.Add("--json");
            var json = TestInputs.RunCli(args.ToArray());
            Assert.Equal(1, json.ExitCode);
            VerifySchema.AssertValid(json.Out);
            var parsed = JObject.Parse(json.Out);
            Assert.False((bool)parsed["ok"]!);
            var failed = ((JArray)parsed["points"]!).Single(p => !(bool)p["ok"]!);
            Assert.Equal("FIT-101", (string)failed["point"]!);
            Assert.Equal("Value", (string)failed["first_failure"]!["what"]!);
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    public void Unreadable_text_fails_the_command_with_its_position()
    {
        var (_, library, plant) = Generate(TestInputs.CompileExample());
        var folder = Directory.CreateTempSubdirectory("scalegen-verify-").FullName;
        try
        {
            var plantPath = Path.Combine(folder, "plant.st");
            var libraryPath = Path.Combine(folder, "library.st");
            File.WriteAllText(libraryPath, library);
            File.WriteAllText(plantPath, plant.Replace("END_PROGRAM", "WHILE TRUE DO END_WHILE;\nEND_PROGRAM", StringComparison.Ordinal));
            var args = new List<string> { "verify" };
            args.AddRange(TestInputs.ExampleFiles);
            args.AddRange(["--st", libraryPath, plantPath, "--json"]);
            var run = TestInputs.RunCli(args.ToArray());
            Assert.Equal(1, run.ExitCode);
            VerifySchema.AssertValid(run.Out);
            var error = JObject.Parse(run.Out)["error"]!;
            Assert.Equal(plantPath, (string)error["file"]!);
            Assert.Equal(plant.Count(c => c == '\n'), (int)error["line"]!);
            Assert.Equal(1, (int)error["column"]!);
            Assert.Contains("'WHILE' is not in the Structured Text subset", run.Error);
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }
}
