using ScaleGen.Verify.Runtime;

namespace ScaleGen.Tests.Verify;

/// <summary>
/// The Structured Text reader and translator on small programs: literals, IEC precedence,
/// REAL kept in 32 bits, conversions, TON on simulated time, block inputs that keep their
/// values, structures and enumerations; and positioned errors for every construct outside
/// the subset.
/// </summary>
public class StReaderTests
{
    private static string Program(string variables, string body) =>
        "PROGRAM P\nVAR\n" + variables + "\nEND_VAR\n" + body + "\nEND_PROGRAM\n";

    [Fact]
    public void Literals_read_as_IEC_61131_3_writes_them()
    {
        using var run = new StProgramRunner(Program(
            "r1 : REAL; r2 : LREAL; r3 : REAL; i1 : DINT; i2 : DINT; i3 : INT; i4 : DINT; t1 : TIME; t2 : TIME; t3 : TIME; t4 : TIME; s : STRING[20]; b : BOOL;",
            """
            (* a comment (with brackets) *) // and a line comment
            r1 := 1.0E-5; r2 := 1.5e3; r3 := REAL#2;
            i1 := 16#FF; i2 := 2#1010; i3 := INT#-5; i4 := 1_000_000;
            t1 := T#5s; t2 := T#150ms; t3 := TIME#1m30s; t4 := t#1.5s;
            s := 'It$'s $$5$21';
            b := BOOL#1;
            """));
        run.Scan();
        Assert.Equal(1.0E-5f, (float)run.Get("r1"));
        Assert.Equal(1500.0, (double)run.Get("r2"));
        Assert.Equal(2f, (float)run.Get("r3"));
        Assert.Equal(255, (int)run.Get("i1"));
        Assert.Equal(10, (int)run.Get("i2"));
        Assert.Equal((short)-5, (short)run.Get("i3"));
        Assert.Equal(1_000_000, (int)run.Get("i4"));
        Assert.Equal(5_000_000L, (long)run.Get("t1"));
        Assert.Equal(150_000L, (long)run.Get("t2"));
        Assert.Equal(90_000_000L, (long)run.Get("t3"));
        Assert.Equal(1_500_000L, (long)run.Get("t4"));
        Assert.Equal("It's $5!", (string)run.Get("s"));
        Assert.True((bool)run.Get("b"));
    }

    [Fact]
    public void Operators_follow_IEC_61131_3_precedence()
    {
        using var run = new StProgramRunner(Program(
            "i : DINT; j : DINT; b1 : BOOL; b2 : BOOL; b3 : BOOL; b4 : BOOL; b5 : BOOL;",
            """
            i := 2 + 3 * 4 - 6 / 2;
            j := -2 * -3;
            b1 := NOT TRUE AND FALSE;
            b2 := TRUE OR FALSE AND FALSE;
            b3 := 1 < 2 = TRUE;
            b4 := FALSE XOR TRUE AND FALSE;
            b5 := TRUE XOR TRUE OR TRUE;
            """));
        run.Scan();
        Assert.Equal(11, (int)run.Get("i"));
        Assert.Equal(6, (int)run.Get("j"));
        Assert.False((bool)run.Get("b1"));
        Assert.True((bool)run.Get("b2"));
        Assert.True((bool)run.Get("b3"));
        Assert.False((bool)run.Get("b4"));
        Assert.True((bool)run.Get("b5"));
    }

    [Fact]
    public void REAL_arithmetic_rounds_every_intermediate_to_32_bits()
    {
        // (1 + 2^-12)^2 = 1 + 2^-11 + 2^-24 exactly: a REAL product rounds the 2^-24 away
        // (a tie, to even), an LREAL one keeps it. IEC 61131-3: REAL is binary32, LREAL binary64.
        using var run = new StProgramRunner(Program(
            "a : REAL := 1.000244140625; c : REAL := 1.00048828125; r : REAL; la : LREAL := 1.000244140625; lc : LREAL := 1.00048828125; lr : LREAL; root : REAL;",
            "r := a * a - c; lr := la * la - lc; root := SQRT(2.0);"));
        run.Scan();
        Assert.Equal(0f, (float)run.Get("r"));
        Assert.Equal(Math.Pow(2, -24), (double)run.Get("lr"));
        Assert.Equal(MathF.Sqrt(2f), (float)run.Get("root"));
    }

    [Fact]
    public void Conversions_round_to_nearest_and_check_ranges()
    {
        using var run = new StProgramRunner(Program(
            "a : DINT; b : DINT; c : DINT; d : DINT; big : REAL; n : DINT; w : DINT; u : DINT; x : REAL := 2.5; y : REAL := -2.5; z : REAL := 1.4; q : REAL := -1.6; m : INT := -32768; v : UINT := 65535;",
            """
            a := REAL_TO_DINT(x); b := REAL_TO_DINT(y); c := REAL_TO_DINT(z); d := REAL_TO_DINT(q);
            n := 16777217; big := DINT_TO_REAL(n);
            w := INT_TO_DINT(m); u := UINT_TO_DINT(v);
            """));
        run.Scan();
        // Halves away from zero (docs/verify.md); nearest otherwise.
        Assert.Equal(3, (int)run.Get("a"));
        Assert.Equal(-3, (int)run.Get("b"));
        Assert.Equal(1, (int)run.Get("c"));
        Assert.Equal(-2, (int)run.Get("d"));
        Assert.Equal(16777216f, (float)run.Get("big")); // REAL has a 24-bit significand (IEC 61131-3)
        Assert.Equal(-32768, (int)run.Get("w"));
        Assert.Equal(65535, (int)run.Get("u"));
    }

    [Fact]
    public void A_conversion_out_of_range_is_a_run_time_error_at_its_position()
    {
        using var run = new StProgramRunner(Program("big : DINT := 40000; small : INT;", "small := DINT_TO_INT(big);"));
        var error = Assert.Throws<StRuntimeException>(run.Scan);
        var at = run.Translation.Locations[error.Location];
        Assert.Equal((5, 10), (at.Line, at.Column));
        Assert.Contains("INT", error.Message);
    }

    [Fact]
    public void TON_turns_on_once_IN_has_held_for_PT_on_simulated_time()
    {
        using var run = new StProgramRunner(Program(
            "t : TON; z : TON; go : BOOL; q : BOOL; e : TIME; q0 : BOOL;",
            "t(IN := go, PT := T#300ms); q := t.Q; e := t.ET; z(IN := go, PT := T#0s); q0 := z.Q;"));
        run.Set("go", true);
        var seen = new List<(bool Q, long Et)>();
        for (var scan = 0; scan < 5; scan++)
        {
            run.Scan();
            seen.Add(((bool)run.Get("q"), (long)run.Get("e")));
            Assert.True((bool)run.Get("q0")); // PT = T#0s: Q in the call in which IN rises
        }
        // ET is 0 in the call in which IN rises, then one cycle (100 ms) per call, held at PT.
        Assert.Equal([(false, 0L), (false, 100_000L), (false, 200_000L), (true, 300_000L), (true, 300_000L)], seen);
        run.Set("go", false);
        run.Scan();
        Assert.False((bool)run.Get("q"));
        Assert.Equal(0L, (long)run.Get("e"));
    }

    [Fact]
    public void Block_inputs_not_given_in_a_call_keep_their_values()
    {
        using var run = new StProgramRunner("""
            FUNCTION_BLOCK F
            VAR_INPUT a : INT := 7; END_VAR
            VAR_OUTPUT y : INT; END_VAR
            y := a;
            END_FUNCTION_BLOCK
            PROGRAM P
            VAR inst : F; r1 : INT; r2 : INT; r3 : INT; END_VAR
            inst(); r1 := inst.y;
            inst(a := 3); inst(); r2 := inst.y;
            inst.a := 5; inst(); r3 := inst.y;
            END_PROGRAM
            """);
        run.Scan();
        Assert.Equal((short)7, (short)run.Get("r1"));
        Assert.Equal((short)3, (short)run.Get("r2"));
        Assert.Equal((short)5, (short)run.Get("r3"));
    }

    [Fact]
    public void Structures_and_enumerations_take_their_declared_initial_values()
    {
        using var run = new StProgramRunner("""
            TYPE Color : (Red, Green, Blue) := Green; END_TYPE
            TYPE Inner : STRUCT x : REAL := 1.5; c : Color; flag : BOOL := TRUE; END_STRUCT; END_TYPE
            TYPE Outer : STRUCT i : Inner; n : DINT := 4; END_STRUCT; END_TYPE
            PROGRAM P
            VAR CONSTANT k : Outer := (i := (x := 2.5), n := 9); END_VAR
            VAR r : REAL; c1 : Color; c2 : Color; n : DINT; isBlue : BOOL; flag : BOOL; copy : Outer; END_VAR
            r := k.i.x; c1 := k.i.c; c2 := Color#Blue; n := k.n; isBlue := c2 = Blue; flag := k.i.flag;
            copy := k; copy.i.x := 7.0;
            END_PROGRAM
            """);
        run.Scan();
        Assert.Equal(2.5f, (float)run.Get("r"));
        Assert.Equal(1, (int)run.Get("c1")); // Green, the type's initial value
        Assert.Equal(2, (int)run.Get("c2"));
        Assert.Equal(9, (int)run.Get("n"));
        Assert.True((bool)run.Get("isBlue"));
        Assert.True((bool)run.Get("flag"));
    }

    /// <summary>Statements inserted at line 5, column 1 of a program (line 3 holds the variables).</summary>
    [Theory]
    [InlineData("x := y MOD 3;", 5, 8, "'MOD' is not in the Structured Text subset")]
    [InlineData("FOR x := 1 TO 3 DO y := x; END_FOR;", 5, 1, "'FOR' is not in the Structured Text subset")]
    [InlineData("WHILE x < 3 DO x := x + 1; END_WHILE;", 5, 1, "'WHILE'")]
    [InlineData("REPEAT x := x + 1; UNTIL x > 3 END_REPEAT;", 5, 1, "'REPEAT'")]
    [InlineData("CASE x OF 1: y := 2; END_CASE;", 5, 1, "'CASE'")]
    [InlineData("RETURN;", 5, 1, "'RETURN'")]
    [InlineData("x := y ** 2;", 5, 8, "the ** operator")]
    [InlineData("x := FOO(y);", 5, 6, "function 'FOO' is not in the Structured Text subset")]
    [InlineData("x := LIMIT(MN := 0, IN := y, MX := 9);", 5, 12, "named arguments")]
    [InlineData("x := zz;", 5, 6, "unknown name 'zz'")]
    [InlineData("r := x;", 5, 6, "conversion function")]
    [InlineData("x := 1.5;", 5, 6, "a REAL literal cannot be given")]
    [InlineData("s := 40000;", 5, 6, "40000 does not fit INT")]
    [InlineData("k := 1;", 5, 1, "'k' is a constant")]
    [InlineData("x := y", 6, 1, "expected ';'")]
    [InlineData("x := 1E5;", 5, 6, "is not a Structured Text number")]
    [InlineData("x := 'abc;", 5, 6, "string literal is not closed")]
    [InlineData("x := 'a$Qb';", 5, 8, "unknown '$' escape")]
    [InlineData("(* never closed", 5, 1, "never closed")]
    [InlineData("x := %IW3;", 5, 6, "direct addresses")]
    [InlineData("{attribute 'x'}", 5, 1, "pragmas")]
    [InlineData("x := y[1];", 5, 7, "arrays")]
    [InlineData("t(IN := TRUE, Q => b);", 5, 17, "output bindings")]
    [InlineData("t(TRUE, T#1s);", 5, 3, "a block call names each input")]
    [InlineData("t(IN := TRUE, XX := 1);", 5, 15, "TON has no input 'XX'")]
    [InlineData("b := t.Running;", 5, 8, "TON has no member 'Running'")]
    [InlineData("t.Q := TRUE;", 5, 3, "only inputs of an instance can be assigned")]
    [InlineData("x := T#s;", 5, 6, "a TIME literal needs a number and a unit")]
    [InlineData("x := T#1h30;", 5, 12, "needs a unit")]
    public void Constructs_outside_the_subset_fail_at_their_position(string statement, int line, int column, string message)
    {
        var text = "PROGRAM P VAR CONSTANT k : DINT := 1; END_VAR\n"
            + "VAR\n"
            + "    x : DINT; y : DINT; r : REAL; s : INT; b : BOOL; t : TON;\n"
            + "END_VAR\n"
            + statement + "\n"
            + "END_PROGRAM\n";
        var error = StProgramRunner.ReadError(text);
        Assert.Contains(message, error.Message);
        Assert.Equal((line, column), (error.Location.Line, error.Location.Column));
        Assert.StartsWith($"test.st({line},{column}): error: ", error.Describe());
    }

    [Theory]
    [InlineData("TYPE A : ARRAY[1..3] OF INT; END_TYPE", "'ARRAY'")]
    [InlineData("FUNCTION F : INT VAR_INPUT a : INT; END_VAR F := a; END_FUNCTION", "'FUNCTION'")]
    [InlineData("PROGRAM P VAR_IN_OUT a : INT; END_VAR END_PROGRAM", "'VAR_IN_OUT'")]
    [InlineData("PROGRAM P VAR_TEMP a : INT; END_VAR END_PROGRAM", "'VAR_TEMP'")]
    [InlineData("PROGRAM P VAR RETAIN a : INT; END_VAR END_PROGRAM", "'RETAIN'")]
    [InlineData("PROGRAM P VAR a AT %IW0 : INT; END_VAR END_PROGRAM", "direct addresses")]
    [InlineData("PROGRAM P VAR a AT b : INT; END_VAR END_PROGRAM", "'AT'")]
    [InlineData("FUNCTION_BLOCK F END_FUNCTION_BLOCK PROGRAM P VAR f : F; END_VAR END_PROGRAM", "'f' is already the name of a type or block")]
    [InlineData("PROGRAM P VAR a : LINT; END_VAR END_PROGRAM", "LINT is not in the Structured Text subset")]
    [InlineData("PROGRAM P VAR a : Missing; END_VAR END_PROGRAM", "unknown type 'Missing'")]
    [InlineData("PROGRAM P VAR a : INT; A : REAL; END_VAR END_PROGRAM", "declared twice")]
    [InlineData("TYPE S : STRUCT a : S; END_STRUCT; END_TYPE", "contains itself")]
    [InlineData("FUNCTION_BLOCK F VAR inner : F; END_VAR END_FUNCTION_BLOCK", "contains an instance of itself")]
    [InlineData("PROGRAM P VAR p : POINTER TO INT; END_VAR END_PROGRAM", "'POINTER'")]
    [InlineData("FUNCTION_BLOCK F EXTENDS G END_FUNCTION_BLOCK", "'EXTENDS'")]
    [InlineData("PROGRAM P VAR s : STRING[3] := 'long'; END_VAR END_PROGRAM", "does not fit STRING[3]")]
    [InlineData("TYPE E : (A, B); F : (A, C); END_TYPE PROGRAM P VAR v : E; END_VAR v := A; END_PROGRAM", "write Type#A")]
    public void Declarations_outside_the_subset_fail(string text, string message)
    {
        var error = StProgramRunner.ReadError(text);
        Assert.Contains(message, error.Message);
        Assert.True(error.Location.Line >= 1 && error.Location.Column >= 1);
    }
}
