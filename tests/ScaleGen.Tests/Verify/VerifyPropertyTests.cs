using System.Globalization;
using System.Text;
using CsCheck;
using ScaleGen.Tests.Support;
using ScaleGen.Verify;

namespace ScaleGen.Tests.Verify;

/// <summary>
/// Random plants, written as .scale text and taken through the whole tool: the generated
/// Structured Text must agree with the reference on every point. Cards cover rising and
/// falling counts, 0-20 mA, voltage cards with a shunt, DINT counts beyond 2^24 and UINT;
/// points cover reverse ranges, square root with and without cutoff, NE 43, custom and no
/// fault bands, every fault action, filters, alarms with deadbands, delays and clear delays.
/// </summary>
public class VerifyPropertyTests
{
    private static readonly string[] Cards =
    [
        "card c_int {\n  counts 0 .. 27648 at 4 .. 20 mA\n  limits -4864 .. 32511\n  fault-code 32767\n  type INT\n}",
        "card c_020 {\n  counts 0 .. 27648 at 0 .. 20 mA\n  limits 0 .. 32511\n  fault-code 32767\n  type INT\n  input 50 ohm\n}",
        "card c_fall {\n  counts 30000 .. 2000 at 4 .. 20 mA\n  limits -1000 .. 32767\n  type INT\n}",
        "card c_volt {\n  counts 0 .. 4000 at 1 .. 5 V\n  limits -500 .. 4500\n  fault-code -32768, 32767\n  type INT\n}",
        "card c_10v {\n  counts 0 .. 27648 at 0 .. 10 V\n  limits -2000 .. 32511\n  type INT\n}",
        "card c_dint {\n  counts 0 .. 100000000 at 4 .. 20 mA\n  limits -25000000 .. 125000000\n  fault-code 2147483647\n  type DINT\n}",
        "card c_uint {\n  counts 6400 .. 32000 at 4 .. 20 mA\n  limits 0 .. 65535\n  fault-code 65535\n  type UINT\n}",
        "card c_small {\n  counts 0 .. 1000 at 4 .. 20 mA\n  limits -100 .. 1300\n  type INT\n}",
    ];

    private static readonly string[] CardNames = ["c_int", "c_020", "c_fall", "c_volt", "c_10v", "c_dint", "c_uint", "c_small"];

    private sealed record AlarmSpec(bool On, double Fraction, double Deadband, bool DeadbandInUnits, double Delay, double Clear);

    private sealed record PointSpec(int Card, bool ZeroBasedSignal, double Lrv, double Span, bool Reverse, int Sqrt, int Health,
        int OnFault, double OnFaultValue, double Filter, AlarmSpec[] Alarms);

    private static readonly Gen<AlarmSpec> AlarmGen = Gen.Select(
        Gen.Bool,
        Gen.Double[-0.05, 1.05],
        Gen.OneOfConst(0.0, 0.0, 0.25, 1.0, 2.0, 5.0, 10.0),
        Gen.Bool,
        Gen.OneOfConst(0.0, 0.0, 0.3, 1.0, 2.5),
        Gen.OneOfConst(0.0, 0.0, 0.2, 1.0, 3.0),
        (on, fraction, deadband, units, delay, clear) => new AlarmSpec(on, fraction, deadband, units, delay, clear));

    private static readonly Gen<PointSpec> PointGen = Gen.Select(
        Gen.Select(Gen.Int[0, CardNames.Length - 1], Gen.Bool, Gen.Double[-500, 500], Gen.Double[0.5, 2000], Gen.Int[0, 9],
            (card, zero, lrv, span, reverse) => (card, zero, lrv, span, reverse: reverse < 3)),
        Gen.Select(Gen.Int[0, 9], Gen.Int[0, 9], Gen.Int[0, 3], Gen.Double[0, 1], Gen.OneOfConst(0.0, 0.0, 0.0, 0.5, 1.0, 2.0, 5.0, 10.0),
            (sqrt, health, onFault, faultValue, filter) => (sqrt, health, onFault, faultValue, filter)),
        AlarmGen.Array[4],
        (a, b, alarms) => new PointSpec(a.card, a.zero, a.lrv, a.span, a.reverse, b.sqrt, b.health, b.onFault, b.faultValue, b.filter, alarms));

    private static readonly Gen<(string Cycle, PointSpec[] Points)> PlantGen =
        Gen.Select(Gen.OneOfConst("100 ms", "50 ms", "250 ms", "20 ms", "1 s"), PointGen.Array[40, 60]);

    private static string N(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);

    private static string PlantText((string Cycle, PointSpec[] Points) plant)
    {
        var text = new StringBuilder();
        text.Append("plant \"Random property plant\"\ncycle ").Append(plant.Cycle).Append('\n');
        foreach (var card in Cards) text.Append(card).Append('\n');
        for (var i = 0; i < plant.Points.Length; i++)
        {
            var p = plant.Points[i];
            var card = CardNames[p.Card];
            var zero = card == "c_020" && p.ZeroBasedSignal;
            var lrv = Math.Round(p.Lrv, 3);
            var urv = Math.Round(lrv + (p.Reverse ? -1 : 1) * Math.Max(0.5, Math.Round(p.Span, 3)), 3);
            text.Append(CultureInfo.InvariantCulture, $"point P-{i:000} {{\n  card {card} at \"S{i}\"\n");
            if (zero) text.Append("  signal 0 .. 20 mA\n");
            if (card == "c_volt") text.Append("  shunt 250 ohm\n");
            if (card == "c_10v") text.Append("  shunt 500 ohm\n");
            text.Append($"  range {N(lrv)} .. {N(urv)} kPa\n");
            if (p.Sqrt >= 7) text.Append(p.Sqrt switch { 7 => "  sqrt\n", 8 => "  sqrt cutoff 1 %\n", _ => "  sqrt cutoff 7.5 %\n" });
            text.Append(zero
                ? (p.Health < 5 ? "  health none\n" : "  health above 21 mA\n")
                : p.Health switch { < 6 => "  health ne43\n", < 8 => "  health below 3.8 mA above 20.5 mA\n", _ => "  health none\n" });
            text.Append(p.OnFault switch
            {
                0 => "  on-fault hold\n",
                1 => "  on-fault low\n",
                2 => "  on-fault high\n",
                _ => $"  on-fault value {N(lrv + p.OnFaultValue * (urv - lrv))}\n",
            });
            if (p.Filter > 0) text.Append($"  filter {N(p.Filter)} s\n");

            // Setpoints in value order: LL <= L <= H <= HH.
            var values = p.Alarms.Select(a => lrv + a.Fraction * (urv - lrv)).Order().ToArray();
            string[] kinds = ["LL", "L", "H", "HH"];
            for (var k = 0; k < 4; k++)
            {
                var a = p.Alarms[k];
                if (!a.On) continue;
                text.Append($"  alarm {kinds[k]} {N(values[k])}");
                if (a.Deadband > 0) text.Append(a.DeadbandInUnits ? $" deadband {N(a.Deadband / 100 * Math.Abs(urv - lrv))} kPa" : $" deadband {N(a.Deadband)} %");
                if (a.Delay > 0) text.Append($" delay {N(a.Delay)} s");
                if (a.Clear > 0) text.Append($" clear {N(a.Clear)} s");
                text.Append('\n');
            }
            text.Append("}\n");
        }
        return text.ToString();
    }

    /// <summary>Plants per run: 6 (about 300 points); set SCALEGEN_VERIFY_PLANTS for a longer soak.</summary>
    private static long Plants =>
        long.TryParse(Environment.GetEnvironmentVariable("SCALEGEN_VERIFY_PLANTS"), NumberStyles.None, CultureInfo.InvariantCulture, out var n) && n > 0 ? n : 6;

    [Fact]
    public void Random_plants_verify_against_the_reference()
    {
        var points = 0;
        PlantGen.Sample(plant =>
        {
            var text = PlantText(plant);
            var compilation = TestInputs.Compile(text, "random.scale");
            Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics.Where(d => d.IsError)) + "\n" + text);
            var result = PlantVerifier.Verify(compilation.Plant, PlantVerifier.GenerateStructuredText(compilation));
            Assert.Null(result.Problem);
            var failures = result.Points.Where(p => !p.Ok).Select(p => $"{p.Point}: {p.FirstFailure}").ToList();
            Assert.True(failures.Count == 0, string.Join("\n", failures) + "\n" + text);
            Interlocked.Add(ref points, result.Points.Length);
        }, iter: Plants, threads: 1, print: PlantText);
        Assert.True(points >= 240, $"only {points} random points were verified");
    }
}
