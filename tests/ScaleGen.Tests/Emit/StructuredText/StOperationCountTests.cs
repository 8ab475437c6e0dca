using System.Text.RegularExpressions;
using ScaleGen.Emit.StructuredText;

namespace ScaleGen.Tests.Emit.StructuredText;

/// <summary>Counts the operations in the emitted per-scan code.</summary>
public class StOperationCountTests
{
    /// <summary>The code (comments and strings removed) of every POU body: after its last END_VAR, up to its END_ keyword.</summary>
    private static IEnumerable<(string Name, string Body)> Bodies(string text)
    {
        var code = StTextChecker.Analyse(text).Code;
        foreach (Match pou in Regex.Matches(code, @"\b(FUNCTION_BLOCK|PROGRAM)\s+(\w+)(.*?)\bEND_\1\b", RegexOptions.Singleline))
        {
            var inner = pou.Groups[3].Value;
            var lastVar = inner.LastIndexOf("END_VAR", StringComparison.Ordinal);
            yield return (pou.Groups[2].Value, inner[(lastVar + "END_VAR".Length)..]);
        }
    }

    private static int Count(string code, string op) => Regex.Matches(code, Regex.Escape(op)).Count;

    /// <summary>Arithmetic operators in a piece of code: + - * / and the division-like MOD, DIV, EXPT.</summary>
    private static Dictionary<string, int> Operators(string code) => new()
    {
        ["*"] = Count(code, "*"),
        ["+"] = Count(code, "+"),
        ["-"] = Count(code, "-"),
        ["/"] = Count(code, "/"),
        ["MOD"] = Regex.Matches(code, @"\bMOD\b").Count,
        ["DIV"] = Regex.Matches(code, @"\bDIV\b").Count,
        ["EXPT"] = Regex.Matches(code, @"\bEXPT\b").Count,
    };

    [Fact]
    public void No_per_scan_code_divides()
    {
        var files = StSnapshotTests.EmitExample();
        var bodies = files.SelectMany(f => Bodies(f.Content)).ToList();
        Assert.Equal([StNames.AlarmBlock, StNames.PointBlock, StNames.Program], bodies.Select(b => b.Name));
        foreach (var (name, body) in bodies)
        {
            var ops = Operators(body);
            Assert.True(ops["/"] == 0 && ops["MOD"] == 0 && ops["DIV"] == 0 && ops["EXPT"] == 0, $"{name} divides");
        }
        // Not even the constants need a division: the generator wrote them all as numbers.
        foreach (var file in files)
            Assert.DoesNotContain("/", StTextChecker.Analyse(file.Content).Code);
    }

    [Fact]
    public void Linear_value_is_one_multiply_and_one_add()
    {
        var library = StSnapshotTests.FileText(StSnapshotTests.EmitExample(), StNames.LibraryFile);
        var body = Bodies(library).Single(b => b.Name == StNames.PointBlock).Body;
        var statements = body.Split(';').Select(s => Regex.Replace(s, @"\s+", " ").Trim()).ToList();

        // Step 2, the linear branch: the statement right after "IF NOT Par.SquareRoot THEN".
        var branch = statements.Single(s => s.StartsWith("IF NOT Par.SquareRoot THEN", StringComparison.Ordinal));
        var linear = branch["IF NOT Par.SquareRoot THEN".Length..].Trim();
        Assert.Equal(StLibrary.LinearValueStatement.TrimEnd(';'), linear);
        var ops = Operators(linear);
        Assert.Equal(1, ops["*"]);
        Assert.Equal(1, ops["+"]);
        Assert.Equal(0, ops.Where(o => o.Key is not "*" and not "+").Sum(o => o.Value));

        // Steps 3 and 4 on a good scan of an unfiltered linear point only copy the value:
        // "LastGood := Reading", "Value := Reading". No further arithmetic on the path.
        Assert.Contains(statements, s => s.EndsWith("ELSE LastGood := Reading", StringComparison.Ordinal));
        Assert.Contains(statements, s => s == "IF NOT Par.FilterOn THEN Value := Reading");
    }

    [Fact]
    public void Square_root_path_is_multiply_add_root_multiply_add()
    {
        var library = StSnapshotTests.FileText(StSnapshotTests.EmitExample(), StNames.LibraryFile);
        var body = Bodies(library).Single(b => b.Name == StNames.PointBlock).Body;
        var statements = body.Split(';').Select(s => Regex.Replace(s, @"\s+", " ").Trim()).ToList();
        var fraction = statements.Single(s => s.EndsWith("Fraction := DINT_TO_REAL(Raw) * Par.Gain + Par.Offset", StringComparison.Ordinal));
        var value = statements.Single(s => s.StartsWith("Reading := SQRT(", StringComparison.Ordinal));
        Assert.Equal((1, 1), (Count(fraction, "*"), Count(fraction, "+")));
        Assert.Equal((1, 1), (Count(value, "*"), Count(value, "+")));
    }
}
