using System.Globalization;
using System.Text;
using CsCheck;

namespace ScaleGen.Samples;

/// <summary>
/// Random valid plants as <c>.scale</c> text, for property tests and benchmarks. Two steps: what the plant
/// says (cards, profiles with <c>uses</c> chains, points with every attribute) as a tree of
/// statements, then how it is written (spacing, quantities with and without a space, quoted
/// units, comments, blank lines, <c>;</c>-separated statements, one-line blocks).
/// Every choice keeps the plant free of errors; warnings are allowed.
/// This file is shared: the test project and the benchmark project both compile it (linked
/// from tests/Shared), so benchmarks measure the same kind of plant the tests check.
/// </summary>
internal static class PlantGenerator
{
    /// <summary>A statement: its words, and its block's statements if it has one.</summary>
    public sealed record Node(string[] Words, Node[]? Block = null)
    {
        public override string ToString() => string.Join(" ", Words);
    }

    private static string Num(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    private static Gen<T[]> Sequence<T>(IEnumerable<Gen<T>> gens) =>
        gens.Aggregate(Gen.Const(Array.Empty<T>()), (all, next) => all.SelectMany(a => next.Select(x => a.Append(x).ToArray())));

    private static Gen<T[]> Maybe<T>(Gen<T> gen, int percent = 50) =>
        Gen.Int[0, 99].SelectMany(r => r < percent ? gen.Select(x => new[] { x }) : Gen.Const(Array.Empty<T>()));

    private static Gen<string[]> Maybe(params string[] words) => Maybe(Gen.Const(words)).Select(a => a.Length == 0 ? Array.Empty<string>() : a[0]);

    /// <summary>A number and a fixed unit, written "4 mA" or "4mA" (the formatter puts the space back).</summary>
    private static Gen<string[]> Quantity(string number, string unit) =>
        Gen.Bool.Select(spaced => spaced ? new[] { number, unit } : new[] { number + unit });

    private static Gen<string[]> Quantity(Gen<string> number, params string[] units) =>
        from n in number
        from u in Gen.OneOfConst(units)
        from q in Quantity(n, u)
        select q;

    /// <summary>"lo .. hi unit" with the dots spaced or not.</summary>
    private static Gen<string[]> Range(string low, string high, string unit) =>
        from layout in Gen.Int[0, 3]
        from spacedUnit in Gen.Bool
        let range = layout switch
        {
            0 => new[] { low, "..", high },
            1 => new[] { low + ".." + high },
            2 => new[] { low + "..", high },
            _ => new[] { low, ".." + high },
        }
        select spacedUnit || unit.StartsWith('"') ? range.Append(unit).ToArray() : range[..^1].Append(range[^1] + unit).ToArray();

    // ---- Text pieces ------------------------------------------------------------------

    private static readonly Gen<string> FreeText = Gen.OneOfConst(
        "Raw water inlet flow", "Level; wet well {north}", "Say \"high\" twice", @"Path C:\panel\R1", "ΔP across screen #2",
        "Clear-well level", "", "   spaced   ", "m³/h out", "tab\there");

    /// <summary>A string literal with the only escapes the language knows.</summary>
    public static string Quote(string value) => "\"" + value.Replace("\\", "\\\\").Replace("\"", "\\\"") + "\"";

    private static readonly Gen<string> Comment = Gen.OneOfConst(
        "# note", "#no space", "# braces { } and ; inside", "# \"quotes\" too", "# ---------------- section", "#", "# 4 .. 20 mA, NE 43");

    // ---- Cards --------------------------------------------------------------------------

    public enum CardKind { Current4To20, Current0To20, Volt1To5, MilliVolt0To10000, Dint, Uint }

    public sealed record CardSpec(string Name, CardKind Kind, Node Node);

    private static Gen<CardSpec> Card(int index) =>
        from kind in Gen.Enum<CardKind>()
        from prefix in Gen.OneOfConst("AI", "ai_", "Card", "in", "AV")
        let name = prefix + index.ToString(CultureInfo.InvariantCulture)
        from settings in CardSettings(kind)
        from order in Gen.Shuffle(settings)
        select new CardSpec(name, kind, new Node(new[] { "card", name }, order.Select(w => new Node(w)).ToArray()));

    private static Gen<string[][]> CardSettings(CardKind kind)
    {
        // Each kind's counts and limits leave room for the signals the points give it.
        var (counts, limits, faults, type, input) = kind switch
        {
            CardKind.Current4To20 => ("0 .. 27648 at 4 .. 20 mA", "-4864 .. 32511", "32767", "INT", "250 ohm"),
            CardKind.Current0To20 => ("0 .. 27648 at 0 .. 20 mA", "0 .. 32511", "32767, -32768", "INT", "50 ohm"),
            CardKind.Volt1To5 => ("0 .. 4000 at 1 .. 5 V", "-500 .. 4500", "-32768, 32767", "INT", "0 ohm"),
            CardKind.MilliVolt0To10000 => ("0 .. 10000 at 0 .. 10000 mV", "0 .. 11000", "32767", "INT", "0.1 kohm"),
            CardKind.Dint => ("0 .. 1000000 at 4 .. 20 mA", "-300000 .. 1200000", "2147483647", "DINT", "250 ohm"),
            _ => ("6400 .. 32000 at 4 .. 20 mA", "0 .. 65535", "65535", "UINT", "250ohm"),
        };
        var words = (string s) => s.Split(' ');
        return Sequence(new[]
        {
            Gen.Const(new[] { words("counts " + counts) }),
            Maybe(words("limits " + limits)).Select(w => w.Length == 0 ? Array.Empty<string[]>() : new[] { w }),
            Maybe(words("fault-code " + faults)).Select(w => w.Length == 0 ? Array.Empty<string[]>() : new[] { w }),
            kind is CardKind.Dint or CardKind.Uint ? Gen.Const(new[] { words("type " + type) })
                : Maybe(words("type INT")).Select(w => w.Length == 0 ? Array.Empty<string[]>() : new[] { w }),
            Maybe(words("input " + input)).Select(w => w.Length == 0 ? Array.Empty<string[]>() : new[] { w }),
        }).Select(groups => groups.SelectMany(g => g).ToArray());
    }

    // ---- Point settings shared with profiles ---------------------------------------------

    private static Gen<string[]> OnFault =>
        Gen.OneOf(Gen.OneOfConst(new[] { "on-fault", "hold" }, new[] { "on-fault", "low" }, new[] { "on-fault", "high" }),
            Gen.OneOfConst("0", "-1", "12.5", "0.0", "1e3").Select(v => new[] { "on-fault", "value", v }));

    private static Gen<string[]> Filter =>
        Quantity(Gen.OneOfConst("2", "0.5", "500", "1", "0", "10"), "s", "ms", "min").Select(q => q.Prepend("filter").ToArray());

    private static Gen<string[]> Measure =>
        Gen.OneOfConst("flow", "level", "pressure", "temperature", "analysis", "other").Select(m => new[] { "measure", m });

    private static Gen<string[]> Tolerance =>
        Gen.OneOf(Quantity(Gen.OneOfConst("0.5", "1", "0.25", "2"), "%"), Gen.OneOfConst(new[] { "0.5" }, new[] { "1" }))
            .Select(q => q.Prepend("tolerance").ToArray());

    /// <summary>Health for a 4 .. 20 mA signal: fault bands outside the span.</summary>
    private static Gen<string[]> LiveZeroHealth =>
        Gen.OneOf(
            Gen.OneOfConst(new[] { "health", "ne43" }, new[] { "health", "none" }),
            from below in Quantity(Gen.OneOfConst("3.6", "3.8", "2"), "mA")
            from above in Maybe(Quantity(Gen.OneOfConst("21", "20.5", "22"), "mA"))
            select new[] { "health", "below" }.Concat(below).Concat(above.SelectMany(a => a.Prepend("above"))).ToArray(),
            Quantity(Gen.OneOfConst("21", "20.5"), "mA").Select(q => new[] { "health", "above" }.Concat(q).ToArray()));

    // ---- Profiles -------------------------------------------------------------------------

    public sealed record ProfileSpec(string Name, Node Node);

    /// <summary>Profile number <paramref name="index"/>; it may use one declared before it, so there is never a cycle.</summary>
    private static Gen<ProfileSpec> Profile(int index, string prefix) =>
        from uses in index == 0 ? Gen.Const(-1) : Gen.Int[-1, index - 1]
        let name = ProfileName(prefix, index)
        from settings in Sequence(new[] { Maybe(LiveZeroHealth), Maybe(OnFault), Maybe(Filter), Maybe(Measure), Maybe(Tolerance) })
        from order in Gen.Shuffle(settings.SelectMany(s => s).ToArray())
        let header = uses < 0 ? new[] { "profile", name } : new[] { "profile", name, "uses", ProfileName(prefix, uses) }
        select new ProfileSpec(name, new Node(header, order.Select(w => new Node(w)).ToArray()));

    private static string ProfileName(string prefix, int index) => prefix + index.ToString(CultureInfo.InvariantCulture);

    // ---- Points ---------------------------------------------------------------------------

    private static Gen<Node> Point(int index, CardSpec[] cards, ProfileSpec[] profiles) =>
        from prefix in Gen.OneOfConst("FT", "LT", "PT", "TT", "AT", "FIT", "LIT", "ZT", "ft", "Lt")
        from separator in Gen.OneOfConst("-", "_", "")
        from suffix in Gen.OneOfConst("", "A", "B")
        let tag = prefix + separator + (100 + index).ToString(CultureInfo.InvariantCulture) + suffix
        from card in Gen.OneOfConst(cards)
        from profile in profiles.Length == 0 ? Gen.Const(-1) : Gen.Int[-1, profiles.Length - 1]
        from settings in PointSettings(card)
        from order in Gen.Shuffle(settings)
        let header = profile < 0 ? new[] { "point", tag } : new[] { "point", tag, "uses", profiles[profile].Name }
        select new Node(header, order);

    private static Gen<Node[]> PointSettings(CardSpec card) =>
        from address in Maybe(Gen.OneOfConst("R1.S2.C0", "", "rack 3 / slot 4", "#7"))
        let cardWords = address.Length == 0 ? new[] { "card", card.Name } : new[] { "card", card.Name, "at", Quote(address[0]) }
        from zeroBased in Gen.Bool
        // A 0 .. 20 mA signal only on the 0 .. 20 mA card, which can read it, and with its own health.
        let noLiveZero = zeroBased && card.Kind == CardKind.Current0To20
        from signal in noLiveZero
            ? Range("0", "20", "mA")
            : Gen.OneOf(Range("4", "20", "mA"), Range("0.004", "0.02", "A"))
        from giveSignal in Gen.Bool
        let signalWords = noLiveZero || giveSignal ? new[] { signal.Prepend("signal").ToArray() } : Array.Empty<string[]>()
        from shunt in card.Kind switch
        {
            CardKind.Volt1To5 => Gen.OneOf(Quantity("250", "ohm"), Quantity("0.25", "kohm")).Select(q => new[] { q.Prepend("shunt").ToArray() }),
            CardKind.MilliVolt0To10000 => Quantity("500", "ohm").Select(q => new[] { q.Prepend("shunt").ToArray() }),
            _ => Gen.Const(Array.Empty<string[]>()),
        }
        from low in Gen.OneOfConst(0.0, -10, 5.5, 100, -0.5)
        from span in Gen.OneOfConst(10.0, 100, 450, 0.5, 1000, 16)
        from reverse in Gen.Int[0, 4]
        from unit in Gen.OneOfConst("m3/h", "kPa", "degC", "%", "mg/L", "m", "bar", "\"deg C\"", "\"m3/h\"", "l/s")
        let lrv = reverse == 0 ? low + span : low
        let urv = reverse == 0 ? low : low + span
        from range in Range(LowText(lrv), Num(urv), unit)
        from sqrt in Maybe(Gen.OneOf(
            Gen.Const(new[] { "sqrt" }),
            Quantity(Gen.OneOfConst("1", "3", "0.5"), "%").Select(q => new[] { "sqrt", "cutoff" }.Concat(q).ToArray()),
            Gen.OneOfConst("2", "0").Select(n => new[] { "sqrt", "cutoff", n })), 30)
        from health in noLiveZero
            ? Gen.OneOf(Gen.Const(new[] { "health", "none" }), Quantity("21", "mA").Select(q => new[] { "health", "above" }.Concat(q).ToArray())).Select(h => new[] { h })
            : Maybe(LiveZeroHealth, 70)
        from desc in Maybe(FreeText.Select(t => new[] { "desc", Quote(t) }), 60)
        from rest in Sequence(new[] { Maybe(OnFault, 40), Maybe(Filter, 40), Maybe(Measure, 50), Maybe(Tolerance, 30) })
        from alarms in Alarms(Math.Min(lrv, urv), Math.Max(lrv, urv), unit)
        from loop in Maybe(Loop(), 40)
        select new[] { cardWords }.Concat(signalWords).Concat(shunt).Append(range.Prepend("range").ToArray())
            .Concat(sqrt).Concat(health).Concat(desc).Concat(rest.SelectMany(r => r)).Concat(alarms)
            .Select(w => new Node(w)).Concat(loop).ToArray();

    /// <summary>The low end in a few spellings the language allows for the same kind of number.</summary>
    private static string LowText(double value) => value switch
    {
        100 => "1e2",
        1000 => "1E+3",
        _ => Num(value),
    };

    private static Gen<string[][]> Alarms(double min, double max, string unit)
    {
        // Fractions of the range keep HH >= H and LL <= L whatever the direction of the range.
        Gen<string[]> Alarm(string kind, double[] fractions) =>
            from f in Gen.OneOfConst(fractions)
            from options in AlarmOptions(unit, max - min)
            select new[] { "alarm", kind, Num(min + f * (max - min)) }.Concat(options).ToArray();
        return Sequence(new[]
        {
            Maybe(Alarm("HH", new[] { 0.9, 0.95 }), 40),
            Maybe(Alarm("H", new[] { 0.8, 0.9 }), 50),
            Maybe(Alarm("L", new[] { 0.1, 0.2 }), 50),
            Maybe(Alarm("LL", new[] { 0.05, 0.1 }), 40),
        }).Select(groups => groups.SelectMany(g => g).ToArray());
    }

    private static Gen<string[]> AlarmOptions(string unit, double span) =>
        from options in Sequence(new[]
        {
            Maybe(Gen.Int[1, 4].Select(p => new[] { "priority", p.ToString(CultureInfo.InvariantCulture) })),
            Maybe(Gen.OneOf(
                Quantity(Gen.OneOfConst("2", "5", "0.5", "0"), "%"),
                Gen.OneOfConst(0.01, 0.05).Select(f => new[] { Num(f * span), unit }))
                .Select(q => q.Prepend("deadband").ToArray())),
            Maybe(Quantity(Gen.OneOfConst("5", "15", "60", "0.5"), "s").Select(q => q.Prepend("delay").ToArray())),
            Maybe(Quantity(Gen.OneOfConst("10", "2"), "s", "min").Select(q => q.Prepend("clear").ToArray())),
            Maybe(FreeText.Select(t => new[] { "text", Quote(t) })),
        })
        from order in Gen.Shuffle(options.SelectMany(o => o).ToArray())
        select order.SelectMany(o => o).ToArray();

    private static Gen<Node> Loop() =>
        from supply in Quantity(Gen.OneOfConst("24", "26.4", "20"), "V")
        from device in Quantity(Gen.OneOfConst("10.5", "12", "9"), "V")
        from cable in Maybe(
            from length in Quantity(Gen.OneOfConst("450", "60", "1.2", "100"), "m", "km", "ft")
            from size in Gen.OneOf(Quantity(Gen.OneOfConst("0.5", "0.75", "1.0", "1.5", "2.5"), "mm2"),
                Gen.OneOfConst("14", "16", "18", "20", "22").Select(n => new[] { n, "AWG" }))
            select new[] { "cable" }.Concat(length).Concat(size).ToArray())
        from barrier in Maybe(Quantity(Gen.OneOfConst("280", "0.3"), "ohm", "kohm").Select(q => q.Prepend("barrier").ToArray()), 30)
        from extra in Maybe(Quantity("0", "ohm").Select(q => q.Prepend("extra").ToArray()), 20)
        from hart in Maybe(new[] { "hart" })
        from current in Maybe(Gen.OneOf(Quantity(Gen.OneOfConst("20", "22", "21.5"), "mA"), Quantity("0.02", "A"))
            .Select(q => q.Prepend("current").ToArray()), 30)
        let settings = new[] { supply.Prepend("supply").ToArray(), device.Prepend("device").ToArray() }
            .Concat(cable).Concat(barrier).Concat(extra).Concat(hart.Length == 0 ? Array.Empty<string[]>() : new[] { hart }).Concat(current)
            .ToArray()
        from order in Gen.Shuffle(settings)
        select new Node(new[] { "loop" }, order.Select(w => new Node(w)).ToArray());

    // ---- The plant --------------------------------------------------------------------------

    /// <summary>What a plant says, before it is laid out as text.</summary>
    public static readonly Gen<Node[]> Plant =
        from cardCount in Gen.Int[1, 3]
        from cards in Sequence(Enumerable.Range(0, cardCount).Select(Card))
        from profileCount in Gen.Int[0, 3]
        from profilePrefix in Gen.OneOfConst("p_", "profile", "Std")
        from profiles in Sequence(Enumerable.Range(0, profileCount).Select(i => Profile(i, profilePrefix)))
        from pointCount in Gen.Int[1, 5]
        from points in Sequence(Enumerable.Range(0, pointCount).Select(i => Point(i, cards, profiles)))
        from title in Maybe(FreeText.Select(t => new Node(new[] { "plant", Quote(t) })), 50)
        from cycle in Maybe(Quantity(Gen.OneOfConst("100", "50", "0.2", "250"), "ms", "s").Select(q => new Node(q.Prepend("cycle").ToArray())), 50)
        from order in Gen.Shuffle(title.Concat(cycle).Concat(cards.Select(c => c.Node)).Concat(profiles.Select(p => p.Node)).Concat(points).ToArray())
        select order;

    // ---- Layout ---------------------------------------------------------------------------

    private static readonly Gen<string> Space = Gen.FrequencyConst((8, " "), (1, "  "), (1, "\t"), (1, " \t "));

    private static Gen<string> Join(string[] words) =>
        Space.Array[Math.Max(0, words.Length - 1)].Select(spaces =>
            string.Concat(words.Select((w, i) => i == 0 ? w : spaces[i - 1] + w)));

    private static readonly Gen<string> Indent = Gen.OneOfConst("", " ", "  ", "    ", "\t");

    private static readonly Gen<string> Separator = Gen.OneOfConst("; ", ";", " ; ", ";\t");

    private static Gen<string> LeadingComments => Maybe(Comment.Array[1, 2], 20)
        .SelectMany(c => c.Length == 0 ? Gen.Const("") : Indent.Select(i => string.Concat(c[0].Select(line => i + line + "\n"))));

    private static Gen<string> BlankLines => Gen.FrequencyConst((6, ""), (2, "\n"), (1, "\n\n"));

    private static Gen<string> TrailingComment => Maybe(Comment, 15).Select(c => c.Length == 0 ? "" : " " + c[0]);

    /// <summary>Lays out the statements of one block (or the file), each on a line or a few joined by ';'.</summary>
    private static Gen<string> Lines(Node[] nodes) =>
        Gen.Int[1, 3].Array[nodes.Length].SelectMany(groupSizes =>
        {
            var lines = new List<Gen<string>>();
            for (var i = 0; i < nodes.Length;)
            {
                // Only statements without a block share a line.
                var size = 1;
                while (size < groupSizes[i] && i + size < nodes.Length && nodes[i].Block is null && nodes[i + size].Block is null) size++;
                lines.Add(Line(nodes.Skip(i).Take(size).ToArray()));
                i += size;
            }
            return Sequence(lines).Select(string.Concat);
        });

    private static Gen<string> Line(Node[] shared) =>
        from blank in BlankLines
        from comments in LeadingComments
        from indent in Indent
        from parts in Sequence(shared.Select(Statement))
        from separators in Separator.Array[shared.Length]
        from finalSeparator in Gen.FrequencyConst((5, false), (1, true))
        from trailing in TrailingComment
        let body = string.Concat(parts.Select((p, i) => i == 0 ? p : separators[i] + p)) + (finalSeparator && shared[^1].Block is null ? ";" : "")
        select blank + comments + indent + body + trailing + "\n";

    private static Gen<string> Statement(Node node) =>
        node.Block is null ? Join(node.Words) : Block(node);

    private static Gen<string> Block(Node node) =>
        from header in Join(node.Words)
        from oneLine in Gen.Int[0, 3]
        from headerComment in Maybe(Comment, 10)
        from inner in oneLine == 0 && node.Block!.Length <= 3 && node.Block.All(b => b.Block is null)
            ? from parts in Sequence(node.Block.Select(Statement))
              from separators in Separator.Array[Math.Max(1, node.Block.Length)]
              select " { " + string.Concat(parts.Select((p, i) => i == 0 ? p : separators[i] + p)) + " }"
            : from lines in Lines(node.Block!)
              from endComments in Maybe(Comment, 10)
              from closeIndent in Indent
              select " {" + (headerComment.Length > 0 ? " " + headerComment[0] : "") + "\n" + lines
                   + (endComments.Length > 0 ? "  " + endComments[0] + "\n" : "") + closeIndent + "}"
        select header + inner;

    /// <summary>A whole file: the plant laid out, with comments before and after.</summary>
    public static readonly Gen<string> Text =
        from plant in Plant
        from header in Maybe(Comment.Array[1, 3], 40)
        from body in Lines(plant)
        from footer in Maybe(Comment, 20)
        from lineEnd in Gen.FrequencyConst((5, "\n"), (1, "\r\n"))
        let text = (header.Length > 0 ? string.Concat(header[0].Select(c => c + "\n")) + "\n" : "") + body + (footer.Length > 0 ? "\n" + footer[0] + "\n" : "")
        select lineEnd == "\n" ? text : text.Replace("\n", "\r\n");

    // ---- Large sites, for benchmarks and scale tests ---------------------------------------

    /// <summary>One file of a generated site.</summary>
    public sealed record SiteFile(string Name, string Text);

    /// <summary>The cards and profiles every generated site uses (invented, in the example plant's style).</summary>
    private const string SiteCards = """
        # Invented site for benchmarks and scale tests: cards and shared profiles.
        # Caution: generated test data, not a design; alarms here are no safety functions.

        plant "Invented site for scale tests"
        cycle 100 ms

        card ai_4_20 {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511
          fault-code 32767
          type INT
          input 250 ohm
        }

        card ai_0_20 {
          counts 0 .. 27648 at 0 .. 20 mA
          limits 0 .. 32511
          fault-code 32767
          input 50 ohm
        }

        card av_1_5 {
          counts 0 .. 4000 at 1 .. 5 V
          limits -500 .. 4500
          fault-code -32768, 32767
        }

        profile live_zero {
          health ne43
          on-fault hold
          tolerance 0.5 %
        }

        profile flow_meter uses live_zero {
          measure flow
          filter 1 s
        }

        profile dp_flow uses flow_meter {
          sqrt cutoff 3 %
        }

        profile mag_flow uses flow_meter {
          filter 2 s
        }

        profile level uses live_zero {
          measure level
          filter 5 s
        }

        profile pressure uses live_zero {
          measure pressure
          filter 0.5 s
          tolerance 0.25 %
        }

        profile temperature uses live_zero {
          measure temperature
          filter 10 s
        }

        profile analyser uses live_zero {
          measure analysis
          filter 10 s
          tolerance 1 %
        }

        """;

    /// <summary>
    /// An invented site of <paramref name="points"/> points shaped like the example plant: a
    /// file of cards and profiles with <c>uses</c> chains, then area files of up to
    /// <paramref name="pointsPerFile"/> points each: flows, levels, pressures, temperatures,
    /// analysers and valve positions with descriptions, alarms with texts, and loops. The
    /// plant checks without errors or warnings; the same seed gives the same text everywhere.
    /// </summary>
    public static IReadOnlyList<SiteFile> Site(int points, int seed = 1, int pointsPerFile = 1000)
    {
        var random = new PCG(7, (ulong)seed);
        int Pick(int low, int high) => Gen.Int[low, high].Generate(random, null, out _);
        T OneOf<T>(params T[] choices) => choices[Pick(0, choices.Length - 1)];

        var files = new List<SiteFile> { new("cards.scale", SiteCards) };
        for (var first = 0; first < points; first += pointsPerFile)
        {
            var area = files.Count.ToString("000", CultureInfo.InvariantCulture);
            var text = new StringBuilder();
            text.Append("# Invented site: area ").Append(area).Append(". Generated test data.\n");
            for (var i = first; i < Math.Min(points, first + pointsPerFile); i++)
            {
                if ((i - first) % 128 == 0) text.Append("\n# ---------------------------------------------------------------- rack ").Append((i - first) / 128 + 1).Append('\n');
                text.Append('\n');
                WritePlain(text, SitePoint(i, area, Pick, OneOf), 0);
            }
            files.Add(new SiteFile($"area-{area}.scale", text.ToString()));
        }
        return files;
    }

    private static Node SitePoint(int index, string area, Func<int, int, int> pick, Func<string[], string> oneOf)
    {
        var number = (index + 1).ToString("00000", CultureInfo.InvariantCulture);
        var address = string.Create(CultureInfo.InvariantCulture, $"A{area}.R{index / 128 % 8}.S{index / 16 % 8}.C{index % 16}");
        var settings = new List<Node>();
        void Add(params string[] words) => settings.Add(new Node(words));
        Node Loop(bool hart)
        {
            var loop = new List<Node>
            {
                new(new[] { "supply", "24", "V" }),
                new(new[] { "device", oneOf(new[] { "10.5", "12" }), "V" }),
                new(new[] { "cable", Num(pick(2, 80) * 5), "m", oneOf(new[] { "0.75", "1.0", "1.5" }), "mm2" }),
            };
            if (hart) loop.Add(new Node(new[] { "hart" }));
            return new Node(new[] { "loop" }, loop.ToArray());
        }
        string At(double span, double fraction) => Num(Math.Round(span * fraction, 3));
        string[] header;

        switch (pick(0, 19))
        {
            case < 4: // flow, differential pressure with square root
            {
                var span = (double)pick(1, 24) * 50;
                header = new[] { "point", "FIT-" + number, "uses", "dp_flow" };
                Add("desc", Quote($"Area {area} flow {number} (orifice)"));
                Add("card", "ai_4_20", "at", Quote(address));
                Add("range", "0", "..", Num(span), "m3/h");
                Add("alarm", "H", At(span, 0.9), "deadband", "5", "%", "delay", "15", "s", "text", Quote($"Flow {number} above design: check the control valve"));
                Add("alarm", "L", At(span, 0.15), "deadband", "5", "%", "delay", "15", "s", "clear", "10", "s", "text", Quote($"Flow {number} low: check the duty pump"));
                settings.Add(Loop(hart: true));
                break;
            }
            case < 6: // flow, magnetic
            {
                var span = (double)pick(1, 40) * 5;
                header = new[] { "point", "FT-" + number, "uses", "mag_flow" };
                Add("desc", Quote($"Area {area} dosing flow {number}"));
                Add("card", "ai_4_20", "at", Quote(address));
                Add("range", "0", "..", Num(span), "l/s");
                Add("alarm", "H", At(span, 0.85), "deadband", "5", "%", "delay", "30", "s");
                Add("alarm", "LL", At(span, 0.05), "deadband", "5", "%", "priority", "2", "delay", "30", "s", "text", Quote($"Dosing flow {number} lost"));
                settings.Add(Loop(hart: false));
                break;
            }
            case < 10: // level
            {
                var span = (double)pick(2, 30);
                header = new[] { "point", "LIT-" + number, "uses", "level" };
                Add("desc", Quote($"Area {area} tank {number} level"));
                Add("card", "ai_4_20", "at", Quote(address));
                Add("range", "0", "..", Num(span), "m");
                Add("alarm", "HH", At(span, 0.95), "deadband", "5", "%", "priority", "2", "delay", "10", "s", "text", Quote($"Tank {number} very high: overflow risk"));
                Add("alarm", "H", At(span, 0.85), "deadband", "5", "%", "delay", "60", "s");
                Add("alarm", "L", At(span, 0.15), "deadband", "5", "%", "delay", "60", "s");
                Add("alarm", "LL", At(span, 0.05), "deadband", "5", "%", "priority", "2", "delay", "10", "s", "text", Quote($"Tank {number} very low: pumps at dry-run risk"));
                settings.Add(Loop(hart: pick(0, 1) == 1));
                break;
            }
            case < 15: // pressure
            {
                var span = (double)pick(1, 40);
                header = new[] { "point", "PT-" + number, "uses", "pressure" };
                Add("desc", Quote($"Area {area} pump {number} discharge pressure"));
                Add("card", "ai_4_20", "at", Quote(address));
                Add("range", "0", "..", Num(span), "bar");
                Add("alarm", "HH", At(span, 0.9), "deadband", "2", "%", "delay", "5", "s", "text", Quote($"Pump {number} discharge very high: check the discharge valve is open"));
                Add("alarm", "H", At(span, 0.8), "deadband", "2", "%", "delay", "15", "s");
                settings.Add(Loop(hart: false));
                break;
            }
            case < 17: // temperature
            {
                var span = (double)pick(4, 30) * 5;
                header = new[] { "point", "TT-" + number, "uses", "temperature" };
                Add("desc", Quote($"Area {area} bearing {number} temperature"));
                Add("card", "ai_4_20", "at", Quote(address));
                Add("range", "0", "..", Num(span), "degC");
                Add("on-fault", "value", Num(span / 4));
                Add("alarm", "H", At(span, 0.7), "deadband", "1", "%", "delay", "60", "s", "text", Quote($"Bearing {number} hot"));
                settings.Add(Loop(hart: false));
                break;
            }
            case 17: // analyser with its own 0-20 mA output: no live zero, no loop budget
                header = new[] { "point", "AIT-" + number, "uses", "analyser" };
                Add("desc", Quote($"Area {area} turbidity {number}"));
                Add("card", "ai_0_20", "at", Quote(address));
                Add("signal", "0", "..", "20", "mA");
                Add("range", "0", "..", "1000", "NTU");
                Add("health", "none");
                Add("alarm", "H", Num(pick(10, 40) * 10), "deadband", "2", "%", "delay", "60", "s", "text", Quote($"Turbidity {number} high: raise the coagulant dose"));
                break;
            case 18: // level on the 1-5 V outstation card, through a shunt
            {
                var span = (double)pick(2, 12) * 100;
                header = new[] { "point", "LDIT-" + number, "uses", "level" };
                Add("desc", Quote($"Area {area} screen {number} differential level"));
                Add("card", "av_1_5", "at", Quote(address));
                Add("shunt", "250", "ohm");
                Add("range", "0", "..", Num(span), "mm");
                Add("alarm", "H", At(span, 0.6), "deadband", "5", "%", "delay", "60", "s", "text", Quote($"Screen {number} blinding: start the screen wash"));
                settings.Add(Loop(hart: false));
                break;
            }
            default: // valve position, no profile
                header = new[] { "point", "ZT-" + number };
                Add("desc", Quote($"Area {area} valve {number} position"));
                Add("card", "ai_4_20", "at", Quote(address));
                Add("range", "0", "..", "100", "%");
                Add("health", "ne43");
                Add("tolerance", "1", "%");
                settings.Add(Loop(hart: false));
                break;
        }
        return new Node(header, settings.ToArray());
    }

    /// <summary>One statement per line, two spaces per level: the layout <c>fmt</c> writes.</summary>
    private static void WritePlain(StringBuilder text, Node node, int depth)
    {
        text.Append(' ', 2 * depth).AppendJoin(' ', node.Words);
        if (node.Block is null)
        {
            text.Append('\n');
            return;
        }
        text.Append(" {\n");
        foreach (var child in node.Block) WritePlain(text, child, depth + 1);
        text.Append(' ', 2 * depth).Append("}\n");
    }
}
