using System.Globalization;
using System.Text;
using ScaleGen.Samples;
using ScaleGen.Tests.Support;
using ScaleGen.Text;
using Xunit.Abstractions;

namespace ScaleGen.Tests.Syntax;

/// <summary>
/// Fuzzing the front end with mutated example files, the way a bad merge or a bad editor
/// mangles a real file: byte flips, token swaps, truncations, duplicated and deleted lines,
/// huge exponents, random Unicode, deep brace nesting. Whatever comes in, compiling never
/// throws, every diagnostic points inside the file, and `scalegen check` exits 1 when there
/// are errors and 0 when the mutation happens to leave a valid plant.
/// </summary>
/// <remarks>
/// Seeded, so a failure can be replayed: the message names the seed and the case. The
/// number of cases comes from SCALEGEN_FUZZ_ITERATIONS (default <see cref="DefaultIterations"/>,
/// about a minute); SCALEGEN_FUZZ_SEED picks another seed. See docs/fuzzing.md.
/// </remarks>
public sealed class FuzzTests(ITestOutputHelper output)
{
    private const int DefaultIterations = 6000;
    private const int DefaultSeed = 20260815;

    private static int Setting(string name, int fallback) =>
        int.TryParse(Environment.GetEnvironmentVariable(name), NumberStyles.Integer, CultureInfo.InvariantCulture, out var value) ? value : fallback;

    /// <summary>What gets mutated: each example file alone, the example plant as one file, and an invented site.</summary>
    private static readonly Lazy<IReadOnlyList<(string Name, string Text, string? Companion)>> Originals = new(() =>
    {
        var list = new List<(string, string, string?)>();
        var cards = File.ReadAllText(TestInputs.ExampleFiles.Single(f => Path.GetFileName(f) == "cards.scale"));
        foreach (var path in TestInputs.ExampleFiles)
        {
            var name = Path.GetFileName(path);
            // An area file is mutated beside the intact cards file, so its points still bind.
            list.Add((name, File.ReadAllText(path), name == "cards.scale" ? null : cards));
        }
        list.Add(("whole example", string.Join("\n", TestInputs.ExampleFiles.Select(File.ReadAllText)), null));
        var site = PlantGenerator.Site(60, seed: 3);
        list.Add(("invented site", site[1].Text, site[0].Text));
        return list;
    });

    [Fact]
    public void Mutated_example_files_never_crash_and_always_get_placed_diagnostics()
    {
        var iterations = Setting("SCALEGEN_FUZZ_ITERATIONS", DefaultIterations);
        var seed = Setting("SCALEGEN_FUZZ_SEED", DefaultSeed);
        var random = new Random(seed);
        using var folder = new TempFolder();
        var kinds = new Dictionary<string, int>(StringComparer.Ordinal);
        var withErrors = 0;

        for (var i = 0; i < iterations; i++)
        {
            var (name, original, companion) = Originals.Value[random.Next(Originals.Value.Count)];
            var text = original;
            var applied = new List<string>();
            for (var m = random.Next(1, 4); m > 0; m--)
            {
                var (kind, mutated) = Mutations.Apply(text, random);
                text = mutated;
                applied.Add(kind);
                kinds[kind] = kinds.GetValueOrDefault(kind) + 1;
            }
            var where = $"seed {seed}, case {i} ({name}: {string.Join(", ", applied)})";

            var sources = companion is null
                ? new[] { new SourceText("fuzz.scale", text) }
                : new[] { new SourceText("cards.scale", companion), new SourceText("fuzz.scale", text) };
            Compilation compilation;
            try
            {
                compilation = Compilation.Compile(sources);
            }
            catch (Exception e)
            {
                throw new Xunit.Sdk.XunitException($"{where}: the compiler threw {e}");
            }
            foreach (var diagnostic in compilation.Diagnostics) AssertPlaced(diagnostic, where);
            if (compilation.HasErrors) withErrors++;

            // The command a CI job runs: exit 1 on errors, 0 on a plant that is still valid. On
            // disk the text is UTF-8, where a lone surrogate becomes U+FFFD: judge what the file holds.
            if (i % 4 == 0)
            {
                var bytes = Encoding.UTF8.GetBytes(text);
                var path = folder.Combine("fuzz.scale");
                File.WriteAllBytes(path, bytes);
                string[] args = companion is null ? ["check", path] : ["check", folder.Write("cards.scale", companion), path];
                var onDisk = Encoding.UTF8.GetString(bytes);
                var expectErrors = onDisk == text ? compilation.HasErrors
                    : Compilation.Compile(companion is null ? [new SourceText("fuzz.scale", onDisk)] : [new SourceText("cards.scale", companion), new SourceText("fuzz.scale", onDisk)]).HasErrors;
                var result = TestInputs.RunCli(args);
                Assert.True(result.ExitCode == (expectErrors ? 1 : 0),
                    $"{where}: check exited {result.ExitCode}\n{result.Error}");
                Assert.DoesNotContain("internal error", result.Error, StringComparison.Ordinal);
            }
        }

        output.WriteLine($"{iterations} cases from seed {seed}: {withErrors} with errors; mutations: " +
                         string.Join(", ", kinds.OrderBy(k => k.Key, StringComparer.Ordinal).Select(k => $"{k.Key} {k.Value}")));
        Assert.True(withErrors > iterations / 2, "most mutations should break the plant; the mutator may have stopped mutating");
    }

    /// <summary>The diagnostic names a real place: a line of the file, a column of that line, a span inside the text.</summary>
    private static void AssertPlaced(Diagnostic d, string where)
    {
        var source = d.Location.Source;
        var line = d.Location.Line;
        var column = d.Location.Column;
        Assert.True(line >= 1 && line <= source.LineCount, $"{where}: {d} has line {line} of {source.LineCount}");
        var lineStart = source.GetLineStart(line);
        var lineEnd = line < source.LineCount ? source.GetLineStart(line + 1) : source.Length;
        Assert.True(column >= 1 && column <= lineEnd - lineStart + 1, $"{where}: {d} has column {column} on a line of {lineEnd - lineStart} characters");
        Assert.True(d.Location.Span.Start >= 0 && d.Location.Span.End <= source.Length, $"{where}: {d} has span {d.Location.Span} in {source.Length} characters");
        Assert.False(string.IsNullOrWhiteSpace(d.Message), $"{where}: {d.Code} has no message");
        Assert.Contains(DiagnosticCatalog.All, c => c.Code == d.Code && c.Severity == d.Severity);
    }

    [Fact]
    public void Deep_brace_nesting_is_reported_not_a_stack_overflow()
    {
        foreach (var depth in new[] { 1_000, 100_000 })
        {
            var opened = TestInputs.StandardCard + "\npoint FT-1 {\n" + new string('{', depth) + "\n";
            var nested = string.Concat(Enumerable.Repeat("point P {\n", depth)) + string.Concat(Enumerable.Repeat("}\n", depth));
            var closed = new string('}', depth);
            foreach (var text in new[] { opened, nested, closed })
            {
                var compilation = TestInputs.Compile(text);
                Assert.True(compilation.HasErrors);
                foreach (var d in compilation.Diagnostics) AssertPlaced(d, $"depth {depth}");
            }
        }
    }

    [Fact]
    public void The_mutations_change_the_text_and_each_kind_is_used()
    {
        var random = new Random(DefaultSeed);
        var original = Originals.Value[0].Text;
        var seen = new HashSet<string>(StringComparer.Ordinal);
        var changed = 0;
        for (var i = 0; i < 500; i++)
        {
            var (kind, text) = Mutations.Apply(original, random);
            seen.Add(kind);
            if (text != original) changed++;
        }
        Assert.Equal(Mutations.Kinds.OrderBy(k => k, StringComparer.Ordinal), seen.OrderBy(k => k, StringComparer.Ordinal));
        Assert.True(changed > 450, $"only {changed} of 500 mutations changed the text");
    }

    /// <summary>The ways a file gets mangled. Each takes the text and returns it changed.</summary>
    internal static class Mutations
    {
        private static readonly (string Kind, Func<string, Random, string> Mutate)[] All =
        [
            ("byte flip", FlipBytes),
            ("token swap", SwapTokens),
            ("truncation", (text, random) => text[..random.Next(text.Length)]),
            ("duplicated line", DuplicateLine),
            ("deleted line", DeleteLine),
            ("huge exponent", HugeNumber),
            ("random unicode", InsertUnicode),
            ("brace nesting", NestBraces),
            ("token insertion", InsertToken),
            ("line ends", ChangeLineEnds),
        ];

        public static IEnumerable<string> Kinds => All.Select(m => m.Kind);

        public static (string Kind, string Text) Apply(string text, Random random)
        {
            var (kind, mutate) = All[random.Next(All.Length)];
            return (kind, text.Length == 0 ? "point" : mutate(text, random));
        }

        /// <summary>Flips bits in the UTF-8 bytes; what is no longer UTF-8 reads as U+FFFD, as from a file on disk.</summary>
        private static string FlipBytes(string text, Random random)
        {
            var bytes = Encoding.UTF8.GetBytes(text);
            for (var n = random.Next(1, 6); n > 0; n--) bytes[random.Next(bytes.Length)] ^= (byte)(1 << random.Next(8));
            return Encoding.UTF8.GetString(bytes);
        }

        private static string[] Tokens(string text) => text.Split(' ');

        private static string SwapTokens(string text, Random random)
        {
            var tokens = Tokens(text);
            for (var n = random.Next(1, 4); n > 0; n--)
            {
                var (a, b) = (random.Next(tokens.Length), random.Next(tokens.Length));
                (tokens[a], tokens[b]) = (tokens[b], tokens[a]);
            }
            return string.Join(' ', tokens);
        }

        private static List<string> Lines(string text) => text.Split('\n').ToList();

        private static string DuplicateLine(string text, Random random)
        {
            var lines = Lines(text);
            lines.Insert(random.Next(lines.Count + 1), lines[random.Next(lines.Count)]);
            return string.Join('\n', lines);
        }

        private static string DeleteLine(string text, Random random)
        {
            var lines = Lines(text);
            lines.RemoveAt(random.Next(lines.Count));
            return string.Join('\n', lines);
        }

        private static readonly string[] HugeNumbers =
        [
            "1e999", "-1e999", "1e309", "9e307", "1e-999", "123456789012345678901234567890", "-0", "0x7FFF",
            "1.7976931348623157e308", "2e2147483648", "4.9e-324", "99999999999999999999", "1e", "1e+", "..", "-",
        ];

        /// <summary>Replaces a number with one far too large, too small, or malformed.</summary>
        private static string HugeNumber(string text, Random random)
        {
            var digits = Enumerable.Range(0, text.Length).Where(i => char.IsAsciiDigit(text[i]) && (i == 0 || !char.IsAsciiDigit(text[i - 1]))).ToList();
            var huge = HugeNumbers[random.Next(HugeNumbers.Length)];
            if (digits.Count == 0) return text + " " + huge;
            var start = digits[random.Next(digits.Count)];
            var end = start;
            while (end < text.Length && (char.IsAsciiDigit(text[end]) || text[end] == '.')) end++;
            return text[..start] + huge + text[end..];
        }

        private static readonly string[] Strange =
        [
            "\0", "\u0001", "\u007f", "\u00a0", "\u00ad", "\u200b", "\u200e", "\u202e", "\u2028", "\u2029", "\ufeff", "\ufffd",
            "\ud83d", "\ude00", "\ud83d\ude00", "\u0301", "é", "µ", "Ω", "水", "\u0130", "\r", "\t", "\"", "\\", "#", ";", "{", "}",
        ];

        private static string InsertUnicode(string text, Random random)
        {
            for (var n = random.Next(1, 5); n > 0; n--)
            {
                var at = random.Next(text.Length + 1);
                text = text[..at] + Strange[random.Next(Strange.Length)] + text[at..];
            }
            return text;
        }

        private static string NestBraces(string text, Random random)
        {
            var depth = random.Next(1, 3000);
            var at = random.Next(text.Length + 1);
            var nesting = random.Next(3) switch
            {
                0 => new string('{', depth),
                1 => new string('}', depth),
                _ => string.Concat(Enumerable.Repeat("loop {", depth)),
            };
            return text[..at] + nesting + text[at..];
        }

        private static readonly string[] LanguageTokens =
        [
            "card", "point", "profile", "uses", "counts", "at", "range", "signal", "alarm", "HH", "LL", "loop", "cable",
            "health", "ne43", "sqrt", "cutoff", "deadband", "priority", "..", "mA", "%", "1,5", "NaN", "\"x\"", "\"",
            "{", "}", ";", "\n", "#", "-", "4mA", "0..20", "mm2", "AWG", "TON", "FT-1", "FT_1",
        ];

        private static string InsertToken(string text, Random random)
        {
            var at = random.Next(text.Length + 1);
            return text[..at] + " " + LanguageTokens[random.Next(LanguageTokens.Length)] + " " + text[at..];
        }

        private static string ChangeLineEnds(string text, Random random) => random.Next(3) switch
        {
            0 => text.Replace("\n", "\r\n", StringComparison.Ordinal),
            1 => text.Replace("\n", "\r", StringComparison.Ordinal),
            _ => text.Replace("\n", "\n\r", StringComparison.Ordinal),
        };
    }
}
