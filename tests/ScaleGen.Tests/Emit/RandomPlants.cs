using System.Globalization;
using System.Text;
using CsCheck;

namespace ScaleGen.Tests.Emit;

/// <summary>
/// Random valid .scale plants, as text, for properties of the emitters: every card kind,
/// reverse action, square root, every health and fault action, alarms of every kind, and
/// descriptions and alarm texts full of characters that could break an output format.
/// Invented test data, not check values.
/// </summary>
public static class RandomPlants
{
    private const string Cards = """
        card ma_card {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511
          fault-code 32767
        }
        card zero_card {
          counts 0 .. 27648 at 0 .. 20 mA
          limits 0 .. 32511
          fault-code 32767
        }
        card volt_card {
          counts 0 .. 4000 at 1 .. 5 V
          limits -500 .. 4500
          fault-code -32768, 32767
        }
        card down_card {
          counts 30000 .. 2000 at 4 .. 20 mA
          limits -4000 .. 32000
          type DINT
        }
        """;

    /// <summary>Pieces that have broken comments, strings or markup somewhere.</summary>
    private static readonly string[] HostilePieces =
    [
        "*)", "(*", "'", "\"", "\\", "$", "$N", "$'", "{", "}", "#", ";", "<!--", "-->", "]]>", "<b>", "&amp;", "%s",
        "\t", "\u0001", "\u001f", "\u007f", "\u2028", "é", "µ", "Ω", "😀", " ", "Pump", "flow", "high",
    ];

    private static readonly Gen<string> Text =
        Gen.OneOfConst(HostilePieces).Array[0, 8].Select(parts => string.Concat(parts));

    private static string Quote(string text) => "\"" + text.Replace("\\", "\\\\").Replace("\"", "\\\"") + "\"";

    private static string N(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);

    private sealed record AlarmSpec(string Kind, double Fraction, int DeadbandTenths, bool DeadbandInPercent, int Delay, int Clear, int Priority, string? Message);

    private static readonly Gen<string?> MaybeText = Gen.Frequency((1, Gen.Const((string?)null)), (2, Text.Select(t => (string?)t)));

    private static readonly Gen<AlarmSpec> Alarm =
        Gen.Select(Gen.Double[0.0, 1.0], Gen.Int[0, 50], Gen.Bool, Gen.Int[0, 60], Gen.Int[0, 30], Gen.Int[1, 4], MaybeText)
            .Select((f, db, pct, delay, clear, prio, text) => new AlarmSpec("", f, db, pct, delay, clear, prio, text));

    private static readonly Gen<string> Point =
        Gen.Select(
            Gen.Select(Text, Gen.Int[0, 3], Gen.Int[-500, 500], Gen.Int[1, 2000], Gen.Bool, Gen.Bool, Gen.Int[0, 10]),
            Gen.Select(Gen.Int[0, 2], Gen.Int[0, 3], Gen.Int[-100, 100], Gen.Int[0, 20], Gen.Int[0, 5], Gen.Bool),
            Gen.Select(Alarm, Alarm, Alarm, Alarm, Gen.Bool, Gen.Bool, Gen.Bool, Gen.Bool))
        .Select((a, b, c) =>
        {
            var (desc, card, lrv, span, reverse, sqrt, cutoff) = a;
            var (health, onFault, faultValue, filter, measure, customBandsTight) = b;
            var (hh, h, l, ll, useHh, useH, useL, useLl) = c;
            var text = new StringBuilder();
            text.Append("  desc ").Append(Quote(desc)).Append('\n');
            var cardName = new[] { "ma_card", "zero_card", "volt_card", "down_card" }[card];
            text.Append($"  card {cardName} at {Quote("R1.S" + card)}\n");
            if (cardName == "volt_card") text.Append("  shunt 250 ohm\n");
            var zeroSignal = cardName == "zero_card" && health == 0 && customBandsTight;
            if (zeroSignal) text.Append("  signal 0 .. 20 mA\n");
            double low = lrv, high = lrv + span;
            if (reverse) (low, high) = (high, low);
            text.Append($"  range {N(low)} .. {N(high)} kPa\n");
            if (sqrt) text.Append($"  sqrt cutoff {cutoff} %\n");
            text.Append(health switch
            {
                0 => "  health none\n",
                1 when !zeroSignal => "  health ne43\n",
                _ when !zeroSignal => "  health below 3.7 mA above 21.2 mA\n",
                _ => "  health none\n",
            });
            text.Append(onFault switch
            {
                0 => "  on-fault hold\n",
                1 => "  on-fault low\n",
                2 => "  on-fault high\n",
                _ => $"  on-fault value {faultValue}\n",
            });
            if (filter > 0) text.Append($"  filter {filter} s\n");
            text.Append($"  measure {new[] { "flow", "level", "pressure", "temperature", "analysis", "other" }[measure]}\n");

            // Setpoints in range order: LL <= L <= H <= HH, as the language requires.
            double At(double f) => Math.Min(lrv, lrv + span) + f * span;
            var fractions = new[] { ll.Fraction, l.Fraction, h.Fraction, hh.Fraction }.Order().ToArray();
            var chosen = new (bool Use, string Kind, AlarmSpec Spec, double Fraction)[]
            {
                (useLl, "LL", ll, fractions[0]), (useL, "L", l, fractions[1]), (useH, "H", h, fractions[2]), (useHh, "HH", hh, fractions[3]),
            };
            foreach (var (use, kind, spec, fraction) in chosen)
            {
                if (!use) continue;
                text.Append($"  alarm {kind} {N(Math.Round(At(fraction), 2))}");
                text.Append(spec.DeadbandInPercent ? $" deadband {N(spec.DeadbandTenths / 10.0)} %" : $" deadband {N(spec.DeadbandTenths * span / 1000.0)} kPa");
                text.Append($" priority {spec.Priority} delay {spec.Delay} s clear {spec.Clear} s");
                if (spec.Message is { } message) text.Append(" text ").Append(Quote(message));
                text.Append('\n');
            }
            return text.ToString();
        });

    /// <summary>A whole plant: the cards and one to six points.</summary>
    public static readonly Gen<string> Plant =
        Gen.Select(Text, Gen.Int[1, 500], Point.Array[1, 6]).Select((title, cycleMs, points) =>
        {
            var text = new StringBuilder();
            text.Append("plant ").Append(Quote(title)).Append('\n');
            text.Append($"cycle {cycleMs} ms\n");
            text.Append(Cards).Append('\n');
            for (var i = 0; i < points.Length; i++)
                text.Append($"point P-{i + 1} {{\n").Append(points[i]).Append("}\n");
            return text.ToString();
        });
}
