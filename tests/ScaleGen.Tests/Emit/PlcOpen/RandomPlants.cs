using System.Globalization;
using System.Text;

namespace ScaleGen.Tests.Emit.PlcOpen;

/// <summary>
/// Invented plants from a seed: every card direction and raw type, linear and square-root
/// points, reverse ranges, every health and fault action, filters, alarms with deadbands and
/// delays that are not whole cycles, and descriptions full of characters that XML and
/// Structured Text must keep in their place.
/// </summary>
internal static class RandomPlants
{
    private static readonly string[] Cards =
    [
        """
        card AI16 {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511
          fault-code 32767
        }
        """,
        """
        card DOWN {
          counts 30000 .. 2000 at 4 .. 20 mA
          limits -4000 .. 32000
          fault-code 31000, 15000
        }
        """,
        """
        card AV {
          counts 0 .. 4000 at 1 .. 5 V
          limits 0 .. 4500
          fault-code 100
          type UINT
        }
        """,
        """
        card WIDE {
          counts -2000000 .. 2000000 at 0 .. 20 mA
          type DINT
        }
        """,
    ];

    private static readonly string[] CardNames = ["AI16", "DOWN", "AV", "WIDE"];

    private static readonly string[] Texts =
    [
        "Inlet *) (* flow -- <b>&amp;</b> ]]> 'q' $N",
        "Niveau Becken \u00FCber \u00B0C \u20AC",
        "plain description",
        "ends in a dash -",
        "quote \\\" and backslash \\\\ and <!-- comment -->",
    ];

    private static readonly string[] Cycles = ["10 ms", "50 ms", "100 ms", "250 ms", "1 s"];

    public static string Text(int seed, int points = 12)
    {
        var random = new Random(seed);
        string Number(double value) => Math.Round(value, 3).ToString("0.###", CultureInfo.InvariantCulture);
        string Pick(string[] items) => items[random.Next(items.Length)];

        var text = new StringBuilder();
        text.Append($"plant \"Random plant {seed}: {Pick(Texts)}\"\n");
        text.Append($"cycle {Pick(Cycles)}\n");
        foreach (var card in Cards) text.Append(card).Append('\n');
        for (var i = 0; i < points; i++)
        {
            var card = random.Next(CardNames.Length);
            var low = Math.Round(random.NextDouble() * 200 - 100, 1);
            var span = Math.Round(1 + random.NextDouble() * 999, 1);
            var reverse = random.Next(4) == 0;
            var (lrv, urv) = reverse ? (low + span, low) : (low, low + span);
            text.Append($"point P{i}-{random.Next(1000)} {{\n");
            text.Append($"  desc \"{Pick(Texts)}\"\n");
            text.Append($"  card {CardNames[card]} at \"R{random.Next(9)}.S{i} {Pick(Texts)}\"\n");
            if (CardNames[card] == "AV") text.Append("  shunt 250 ohm\n");
            text.Append($"  range {Number(lrv)} .. {Number(urv)} unit{i % 3}\n");
            if (random.Next(3) == 0) text.Append($"  sqrt cutoff {random.Next(1, 6)} %\n");
            text.Append(random.Next(3) switch
            {
                0 => "  health ne43\n",
                1 => "  health below 3.7 mA above 21.2 mA\n",
                _ => "  health none\n",
            });
            text.Append(random.Next(4) switch
            {
                0 => "  on-fault hold\n",
                1 => "  on-fault low\n",
                2 => "  on-fault high\n",
                _ => $"  on-fault value {Number(low + span / 2)}\n",
            });
            if (random.Next(2) == 0) text.Append($"  filter {Number(0.1 + random.NextDouble() * 5)} s\n");
            // Setpoints in order inside the range: LL < L < H < HH.
            var fractions = new (string Kind, double Fraction)[] { ("HH", 0.95), ("H", 0.85), ("L", 0.15), ("LL", 0.05) };
            foreach (var (kind, fraction) in fractions)
            {
                if (random.Next(3) == 0) continue;
                text.Append($"  alarm {kind} {Number(low + span * fraction)} deadband {Number(random.NextDouble() * 3)} %");
                if (random.Next(2) == 0) text.Append($" delay {Number(random.NextDouble() * 20)} s");
                if (random.Next(2) == 0) text.Append($" clear {Number(random.NextDouble() * 5)} s");
                if (random.Next(2) == 0) text.Append($" text \"{Pick(Texts)}\"");
                text.Append('\n');
            }
            text.Append("}\n");
        }
        return text.ToString();
    }
}
