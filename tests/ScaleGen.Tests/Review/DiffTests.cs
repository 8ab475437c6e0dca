using System.Text.RegularExpressions;
using ScaleGen.Review;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Review;

/// <summary>The semantic diff: every kind of field, matched by tag, with consequences from the engine.</summary>
public class DiffTests
{
    /// <summary>A small plant that sets every field, so each test changes one thing in it.</summary>
    internal const string BasePlant = """
        plant "Diff test plant"
        cycle 100 ms

        card AI16 {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511
          fault-code 32767
          type INT
          input 250 ohm
        }

        card AI16B {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511
          fault-code 32767, -32768
          type INT
          input 250 ohm
        }

        card AV15 {
          counts 0 .. 4000 at 1 .. 5 V
          limits -500 .. 4500
        }

        point FT-1 {
          desc "Test flow"
          card AI16 at "R1.S1.C0"
          signal 4 .. 20 mA
          range 0 .. 100 m3/h
          health ne43
          on-fault hold
          filter 1 s
          measure flow
          tolerance 0.5 %
          alarm HH 90 deadband 5 m3/h priority 1 delay 5 s clear 2 s text "Flow very high"
          alarm H 80 deadband 5 m3/h
          alarm L 20 deadband 5 m3/h
          loop {
            supply 24 V
            device 10.5 V
            cable 100 m 1.0 mm2
            barrier 0 ohm
            extra 0 ohm
            current 20 mA
          }
        }

        point PT-2 {
          card AI16 at "R1.S1.C1"
          range 0 .. 10 bar
          health ne43
          measure pressure
          alarm H 8 deadband 0.2 bar
        }

        point FT-3 {
          card AI16 at "R1.S1.C2"
          range 0 .. 100 m3/h
          sqrt cutoff 3 %
          health ne43
          measure flow
        }

        point PT-4 {
          card AV15 at "R2.S1.C0"
          shunt 250 ohm
          range 0 .. 6 bar
          health ne43
          measure pressure
        }
        """;

    private static PlantDiffResult DiffAgainstBase(string newText)
    {
        var before = TestInputs.Compile(BasePlant);
        var after = TestInputs.Compile(newText);
        Assert.False(before.HasErrors, string.Join("\n", before.Diagnostics));
        Assert.False(after.HasErrors, string.Join("\n", after.Diagnostics));
        return PlantDiff.Compare(before.Plant, after.Plant);
    }

    private static string Replace(string text, string old, string @new)
    {
        Assert.Contains(old, text);
        return text.Replace(old, @new);
    }

    /// <summary>Changes one thing in the base plant and checks exactly which fields the diff reports.</summary>
    [Theory]
    // point fields
    [InlineData("desc \"Test flow\"", "desc \"Raw water flow\"", "FT-1 desc")]
    [InlineData("card AI16 at \"R1.S1.C0\"", "card AI16 at \"R1.S1.C7\"", "FT-1 address")]
    [InlineData("card AI16 at \"R1.S1.C0\"", "card AI16B at \"R1.S1.C0\"", "FT-1 card, FT-1 card.fault_codes")]
    [InlineData("signal 4 .. 20 mA", "signal 5 .. 20 mA", "FT-1 signal.low_ma")]
    [InlineData("range 0 .. 100 m3/h\n  health", "range 0 .. 120 m3/h\n  health", "FT-1 range.urv")]
    [InlineData("range 0 .. 100 m3/h\n  health", "range 10 .. 100 m3/h\n  health", "FT-1 range.lrv")]
    [InlineData("range 0 .. 6 bar", "range 0 .. 6 \"bar g\"", "PT-4 range.unit")]
    [InlineData("range 0 .. 100 m3/h\n  health", "range 0 .. 100 m3/h\n  sqrt cutoff 2 %\n  health", "FT-1 sqrt, FT-1 sqrt.cutoff_pct")]
    [InlineData("sqrt cutoff 3 %", "sqrt cutoff 5 %", "FT-3 sqrt.cutoff_pct")]
    [InlineData("health ne43\n  on-fault", "health below 3.8 mA above 20.8 mA\n  on-fault", "FT-1 health")]
    [InlineData("on-fault hold", "on-fault value 42", "FT-1 on_fault")]
    [InlineData("filter 1 s", "filter 3 s", "FT-1 filter_s")]
    [InlineData("measure flow\n  tolerance", "measure level\n  tolerance", "FT-1 measure")]
    [InlineData("tolerance 0.5 %", "tolerance 1 %", "FT-1 tolerance_pct")]
    [InlineData("shunt 250 ohm", "shunt 200 ohm", "PT-4 shunt_ohm")]
    // card fields, as every point on the card sees them
    [InlineData("counts 0 .. 27648 at 4 .. 20 mA\n  limits -4864 .. 32511\n  fault-code 32767\n", "counts 0 .. 30000 at 4 .. 20 mA\n  limits -4864 .. 32511\n  fault-code 32767\n", "FT-1 card.counts.raw_high, PT-2 card.counts.raw_high, FT-3 card.counts.raw_high")]
    [InlineData("counts 0 .. 27648 at 4 .. 20 mA\n  limits -4864 .. 32511\n  fault-code 32767\n", "counts 0 .. 27648 at 0 .. 20 mA\n  limits -4864 .. 32511\n  fault-code 32767\n", "FT-1 card.counts.signal_low, PT-2 card.counts.signal_low, FT-3 card.counts.signal_low")]
    [InlineData("limits -4864 .. 32511\n  fault-code 32767\n", "limits -4864 .. 32000\n  fault-code 32767\n", "FT-1 card.limits.high, PT-2 card.limits.high, FT-3 card.limits.high")]
    [InlineData("  fault-code 32767\n  type INT\n  input 250 ohm\n}\n\ncard AI16B", "  fault-code 32767\n  type DINT\n  input 250 ohm\n}\n\ncard AI16B", "FT-1 card.type, PT-2 card.type, FT-3 card.type")]
    [InlineData("  input 250 ohm\n}\n\ncard AI16B", "  input 100 ohm\n}\n\ncard AI16B", "FT-1 card.input_ohm, PT-2 card.input_ohm, FT-3 card.input_ohm")]
    // every alarm option
    [InlineData("alarm HH 90 ", "alarm HH 95 ", "FT-1 alarm.HH.setpoint")]
    [InlineData("alarm H 80 deadband 5 m3/h", "alarm H 80 deadband 8 m3/h", "FT-1 alarm.H.deadband")]
    [InlineData("delay 5 s", "delay 8 s", "FT-1 alarm.HH.delay_s")]
    [InlineData("clear 2 s", "clear 4 s", "FT-1 alarm.HH.clear_s")]
    [InlineData("priority 1", "priority 2", "FT-1 alarm.HH.priority")]
    [InlineData("text \"Flow very high\"", "text \"Flow very high: check FV-1\"", "FT-1 alarm.HH.text")]
    [InlineData("  alarm L 20 deadband 5 m3/h\n", "  alarm L 20 deadband 5 m3/h\n  alarm LL 10 deadband 5 m3/h\n", "FT-1 alarm.LL")]
    [InlineData("  alarm L 20 deadband 5 m3/h\n", "", "FT-1 alarm.L")]
    // loop fields
    [InlineData("supply 24 V", "supply 26 V", "FT-1 loop.supply_v")]
    [InlineData("device 10.5 V", "device 12 V", "FT-1 loop.device_v")]
    [InlineData("cable 100 m 1.0 mm2", "cable 300 m 1.0 mm2", "FT-1 loop.cable_m")]
    [InlineData("cable 100 m 1.0 mm2", "cable 100 m 0.5 mm2", "FT-1 loop.conductor")]
    [InlineData("barrier 0 ohm", "barrier 280 ohm", "FT-1 loop.barrier_ohm")]
    [InlineData("extra 0 ohm", "extra 50 ohm", "FT-1 loop.extra_ohm")]
    [InlineData("    current 20 mA\n", "    hart\n    current 20 mA\n", "FT-1 loop.hart")]
    [InlineData("current 20 mA", "current 22 mA", "FT-1 loop.current_ma")]
    [InlineData("  alarm H 8 deadband 0.2 bar\n", "  alarm H 8 deadband 0.2 bar\n  loop {\n    supply 24 V\n    device 10.5 V\n  }\n", "PT-2 loop")]
    [InlineData("  loop {\n    supply 24 V\n    device 10.5 V\n    cable 100 m 1.0 mm2\n    barrier 0 ohm\n    extra 0 ohm\n    current 20 mA\n  }\n", "", "FT-1 loop")]
    // plant-wide
    [InlineData("cycle 100 ms", "cycle 200 ms", "plant cycle_s")]
    [InlineData("plant \"Diff test plant\"", "plant \"Diff test plant, rev B\"", "plant title")]
    public void Each_kind_of_field_is_reported_alone(string old, string @new, string expected)
    {
        var diff = DiffAgainstBase(Replace(BasePlant, old, @new));
        var reported = diff.PlantChanges.Select(c => "plant " + c.Field).Concat(diff.Changed.Select(c => $"{c.Point} {c.Field}"));
        Assert.Equal(expected.Split(", ").Order(StringComparer.Ordinal), reported.Order(StringComparer.Ordinal));
        Assert.Empty(diff.Added);
        Assert.Empty(diff.Removed);
        Assert.All(diff.Changed.Concat(diff.PlantChanges), c => Assert.False(string.IsNullOrWhiteSpace(c.Summary)));
    }

    [Fact]
    public void Points_added_and_removed_are_matched_by_tag()
    {
        var diff = DiffAgainstBase(BasePlant.Replace("point PT-2 {", "point PT-9 {"));
        Assert.Equal(new[] { "PT-9" }, diff.Added.Select(p => p.Tag));
        Assert.Equal(new[] { "PT-2" }, diff.Removed.Select(p => p.Tag));
        Assert.Empty(diff.Changed);
    }

    [Fact]
    public void A_plant_against_itself_has_no_changes()
    {
        var diff = DiffAgainstBase(BasePlant);
        Assert.True(diff.IsEmpty);
        Assert.Equal("", DiffReport.Text(diff));
    }

    [Fact]
    public void Reordering_points_and_writing_a_deadband_in_percent_is_no_change()
    {
        // 5 m3/h on a 0..100 m3/h span is 5 %: the bound model is the same.
        var moved = BasePlant.Replace("alarm H 80 deadband 5 m3/h", "alarm H 80 deadband 5 %");
        var ft3 = moved.IndexOf("point FT-3", StringComparison.Ordinal);
        var pt4 = moved.IndexOf("point PT-4", StringComparison.Ordinal);
        var reordered = moved[..ft3] + moved[pt4..] + "\n" + moved[ft3..pt4];
        Assert.True(DiffAgainstBase(reordered).IsEmpty);
    }

    [Fact]
    public void A_setpoint_change_says_where_the_alarm_now_trips()
    {
        var change = Assert.Single(DiffAgainstBase(BasePlant.Replace("alarm HH 90 ", "alarm HH 95 ")).Changed);
        Assert.Equal(90.0, change.Old.ToJson().ToObject<double>());
        Assert.Equal(95.0, change.New.ToJson().ToObject<double>());
        Assert.Equal("HH setpoint moved from 90 to 95 m3/h", change.Summary);
        // 90 % of a 4-20 mA span is 4 + 0.9 * 16 = 18.4 mA, 95 % is 19.2 mA; 27648 counts span it (common practice)
        Assert.Equal("trips at 19.20 mA (raw 26266) instead of 18.40 mA (raw 24884)", change.Consequence);
    }

    [Fact]
    public void A_deadband_change_says_where_the_alarm_now_resets()
    {
        var change = Assert.Single(DiffAgainstBase(BasePlant.Replace("alarm H 80 deadband 5 m3/h", "alarm H 80 deadband 10 m3/h")).Changed);
        // resets below 70 % instead of 75 %: 15.20 mA instead of 16.00 mA (common practice: 4 + f * 16 mA)
        Assert.StartsWith("resets at 15.20 mA (raw ", change.Consequence);
        Assert.Contains("instead of 16.00 mA (raw ", change.Consequence);
    }

    [Fact]
    public void A_range_change_says_what_mid_signal_now_reads()
    {
        var change = Assert.Single(DiffAgainstBase(BasePlant.Replace("range 0 .. 100 m3/h\n  health", "range 0 .. 200 m3/h\n  health")).Changed);
        // 12 mA is 50 % of a 4-20 mA signal (common practice)
        Assert.Equal("12 mA reads 100 m3/h instead of 50 m3/h", change.Consequence);
    }

    [Fact]
    public void Turning_on_square_root_changes_what_mid_signal_reads()
    {
        var diff = DiffAgainstBase(BasePlant.Replace("range 0 .. 100 m3/h\n  health", "range 0 .. 100 m3/h\n  sqrt cutoff 2 %\n  health"));
        var sqrt = diff.Changed.Single(c => c.Field == "sqrt");
        // Q / Q_max = sqrt(0.5) = 70.711 % at 12 mA (ISO 5167-1)
        Assert.Equal("12 mA reads 70.7107 m3/h instead of 50 m3/h", sqrt.Consequence);
        var cutoff = diff.Changed.Single(c => c.Field == "sqrt.cutoff_pct");
        Assert.True(cutoff.Old.IsNone);
        Assert.Equal("low-flow cutoff changed from none to 2 %", cutoff.Summary);
    }

    [Fact]
    public void A_cutoff_change_says_below_which_current_the_value_is_lrv()
    {
        var change = Assert.Single(DiffAgainstBase(BasePlant.Replace("sqrt cutoff 3 %", "sqrt cutoff 5 %")).Changed);
        // a flow fraction of 0.05 is a DP fraction of 0.0025 (ISO 5167-1): 4 + 0.0025 * 16 = 4.04 mA; 0.03 -> 4.0144 mA
        Assert.Equal("reads LRV (0 m3/h) below 4.04 mA instead of below 4.01 mA", change.Consequence);
    }

    [Fact]
    public void A_card_change_says_which_raw_counts_the_signal_arrives_as()
    {
        var diff = DiffAgainstBase(BasePlant.Replace("counts 0 .. 27648 at 4 .. 20 mA\n  limits -4864 .. 32511\n  fault-code 32767\n", "counts 0 .. 27648 at 0 .. 20 mA\n  limits -4864 .. 32511\n  fault-code 32767\n"));
        var change = diff.Changed.First(c => c.Point == "FT-1");
        // a 0-20 mA card puts 4 mA at 4/20 of 27648 = 5529.6 counts (common practice: the card's straight line)
        Assert.Equal("4 .. 20 mA arrive as raw 5530 .. 27648 instead of raw 0 .. 27648", change.Consequence);
    }

    [Fact]
    public void A_shunt_change_says_which_raw_counts_the_signal_arrives_as()
    {
        var change = Assert.Single(DiffAgainstBase(BasePlant.Replace("shunt 250 ohm", "shunt 200 ohm")).Changed);
        // 250 ohm: 4 mA -> 1 V -> raw 0, 20 mA -> 5 V -> raw 4000; 200 ohm: 0.8 V -> raw -200, 4 V -> raw 3000 (common practice: Ohm's law)
        Assert.Equal("4 .. 20 mA arrive as raw -200 .. 3000 instead of raw 0 .. 4000", change.Consequence);
    }

    [Fact]
    public void Health_on_fault_and_tolerance_changes_have_consequences()
    {
        var health = Assert.Single(DiffAgainstBase(BasePlant.Replace("health ne43\n  on-fault", "health none\n  on-fault")).Changed);
        Assert.StartsWith("no fault band instead of FAULT_LOW at raw <= ", health.Consequence);

        var onFault = Assert.Single(DiffAgainstBase(BasePlant.Replace("on-fault hold", "on-fault value 42")).Changed);
        Assert.Equal("a faulted point shows 42 m3/h instead of its last good value", onFault.Consequence);

        var tolerance = Assert.Single(DiffAgainstBase(BasePlant.Replace("tolerance 0.5 %", "tolerance 1 %")).Changed);
        Assert.Equal("+/- 1 m3/h instead of +/- 0.5 m3/h", tolerance.Consequence);
    }

    [Fact]
    public void Delay_changes_are_counted_in_scans()
    {
        var change = Assert.Single(DiffAgainstBase(BasePlant.Replace("delay 5 s", "delay 8 s")).Changed);
        Assert.Equal("80 scans of 0.1 s instead of 50", change.Consequence);
    }

    [Fact]
    public void A_loop_change_gives_the_budget_before_and_after()
    {
        var change = Assert.Single(DiffAgainstBase(BasePlant.Replace("barrier 0 ohm", "barrier 280 ohm")).Changed);
        // 250 ohm card + 2 x 0.1 km x 18.1 ohm/km (IEC 60228, from memory) = 253.62 ohm; 10.5 V + 20 mA x 253.62 ohm = 15.57 V (common practice)
        // with 280 ohm more: 533.62 ohm -> 21.17 V
        Assert.Equal("needs 21.17 V of 24 V at 20 mA (margin 2.83 V) instead of 15.57 V of 24 V (margin 8.43 V)", change.Consequence);
    }

    [Fact]
    public void Alarms_added_and_removed_carry_the_setpoint()
    {
        var added = Assert.Single(DiffAgainstBase(BasePlant.Replace("  alarm L 20 deadband 5 m3/h\n", "  alarm L 20 deadband 5 m3/h\n  alarm LL 10 deadband 5 m3/h\n")).Changed);
        Assert.True(added.Old.IsNone);
        Assert.Equal(10.0, added.New.ToJson().ToObject<double>());
        Assert.StartsWith("LL alarm added at 10 m3/h", added.Summary);
        // 10 % of the span: 4 + 0.1 * 16 = 5.6 mA (common practice)
        Assert.StartsWith("trips at 5.60 mA (raw ", added.Consequence);

        var removed = Assert.Single(DiffAgainstBase(BasePlant.Replace("  alarm L 20 deadband 5 m3/h\n", "")).Changed);
        Assert.True(removed.New.IsNone);
        Assert.Equal("L alarm removed (was at 20 m3/h)", removed.Summary);
        // 20 % of the span: 4 + 0.2 * 16 = 7.2 mA (common practice)
        Assert.StartsWith("no longer trips at 7.20 mA", removed.Consequence);
    }

    [Fact]
    public void Every_field_name_is_documented()
    {
        var doc = File.ReadAllText(Path.Combine(TestInputs.RepositoryRoot, "docs", "diff.md"));
        // docs/diff.md writes the alarm kind as KIND: `alarm.KIND.setpoint` stands for alarm.HH.setpoint and the rest.
        foreach (var name in DiffFields.AllNames.Select(n => Regex.Replace(n, "^alarm\\.(HH|H|LL|L)(?=\\.|$)", "alarm.KIND")).Distinct())
            Assert.Contains($"`{name}`", doc);
    }

    /// <summary>
    /// Every property of the bound model records, and the diff field that compares it. A
    /// property added to the model fails this test until the diff compares it (or it is
    /// listed here as not a setting).
    /// </summary>
    [Theory]
    [InlineData(typeof(ScaleGen.Model.Point), "Tag:(matched by tag); Identifier:(follows the tag); Description:desc; Card:card; Address:address; SignalLowMa:signal.low_ma; SignalHighMa:signal.high_ma; ShuntOhms:shunt_ohm; Lrv:range.lrv; Urv:range.urv; Unit:range.unit; SquareRoot:sqrt; CutoffPercent:sqrt.cutoff_pct; Health:health; OnFault:on_fault; FilterSeconds:filter_s; Measure:measure; TolerancePercent:tolerance_pct; Alarms:alarm.KIND; Loop:loop; Location:(source position); Span:(from range); IsReverse:(from range); ValueMin:(from range); ValueMax:(from range)")]
    [InlineData(typeof(ScaleGen.Model.Alarm), "Kind:alarm.KIND; Setpoint:alarm.KIND.setpoint; Deadband:alarm.KIND.deadband; OnDelaySeconds:alarm.KIND.delay_s; OffDelaySeconds:alarm.KIND.clear_s; Priority:alarm.KIND.priority; Message:alarm.KIND.text; Location:(source position); IsHigh:(from kind); ResetValue:(from setpoint and deadband)")]
    [InlineData(typeof(ScaleGen.Model.LoopSpec), "SupplyVolts:loop.supply_v; DeviceVolts:loop.device_v; CableLengthMetres:loop.cable_m; Conductor:loop.conductor; BarrierOhms:loop.barrier_ohm; ExtraOhms:loop.extra_ohm; Hart:loop.hart; CurrentMa:loop.current_ma; Location:(source position)")]
    [InlineData(typeof(ScaleGen.Model.Card), "Name:card; RawLow:card.counts.raw_low; RawHigh:card.counts.raw_high; ElectricalLow:card.counts.signal_low; ElectricalHigh:card.counts.signal_high; Unit:card.counts.unit; LimitLow:card.limits.low; LimitHigh:card.limits.high; FaultCodes:card.fault_codes; RawType:card.type; InputOhms:card.input_ohm; Location:(source position); IsVoltage:(from unit)")]
    [InlineData(typeof(ScaleGen.Model.Plant), "Title:title; CycleSeconds:cycle_s; Cards:(as each point sees its card); Points:(added, removed, changed); Sources:(not a setting)")]
    public void Every_model_property_is_compared(Type record, string coverage)
    {
        var map = coverage.Split("; ").Select(e => e.Split(':', 2)).ToDictionary(e => e[0], e => e[1]);
        var names = DiffFields.AllNames.Select(n => Regex.Replace(n, "^alarm\\.(HH|H|LL|L)(?=\\.|$)", "alarm.KIND")).ToHashSet();
        foreach (var property in record.GetProperties().Where(p => p.Name != "EqualityContract"))
        {
            Assert.True(map.TryGetValue(property.Name, out var field), $"{record.Name}.{property.Name} is not compared by diff: add a field to DiffFields");
            if (!field!.StartsWith('(')) Assert.Contains(field, names);
        }
    }

    [Fact]
    public void Field_names_are_unique_and_stable_in_form()
    {
        var names = DiffFields.AllNames.ToList();
        Assert.Equal(names.Count, names.Distinct(StringComparer.Ordinal).Count());
        Assert.All(names, n => Assert.Matches("^[a-z_]+(\\.(HH|H|L|LL|[a-z_]+))*$", n));
    }
}
