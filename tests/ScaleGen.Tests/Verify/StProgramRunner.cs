using ScaleGen.Text;
using ScaleGen.Verify;
using ScaleGen.Verify.Runtime;

namespace ScaleGen.Tests.Verify;

/// <summary>Translates, compiles and runs a small Structured Text program, scan by scan, for tests of the reader's semantics.</summary>
internal sealed class StProgramRunner : IDisposable
{
    private readonly StAssembly _assembly;
    private readonly object _program;
    private readonly Type _type;

    public StProgramRunner(string text, string program = "P", long cycleMicroseconds = 100_000)
    {
        var translation = StTranslator.Translate([new SourceText("test.st", text)]);
        _assembly = StAssembly.Compile([translation.Code], out var errors)
            ?? throw new InvalidOperationException("translation did not compile: " + string.Join("\n", errors) + "\n" + translation.Code);
        _type = _assembly.Assembly.GetType(StTranslator.Namespace + ".P_" + program)!;
        Clock = new StClock();
        CycleMicroseconds = cycleMicroseconds;
        _program = Activator.CreateInstance(_type, Clock)!;
        Translation = translation;
    }

    public StTranslation Translation { get; }

    public StClock Clock { get; }

    public long CycleMicroseconds { get; }

    /// <summary>One scan: the body once, then the clock one cycle on.</summary>
    public void Scan()
    {
        try
        {
            _type.GetMethod("Body")!.Invoke(_program, null);
        }
        catch (System.Reflection.TargetInvocationException e) when (e.InnerException is not null)
        {
            System.Runtime.ExceptionServices.ExceptionDispatchInfo.Throw(e.InnerException);
        }
        Clock.NowMicroseconds += CycleMicroseconds;
    }

    public object Get(string variable) => _type.GetField("v_" + variable)!.GetValue(_program)!;

    public void Set(string variable, object value) => _type.GetField("v_" + variable)!.SetValue(_program, value);

    public void Dispose() => _assembly.Dispose();

    /// <summary>The error the reader gives for a text, or a failed assertion when it reads it.</summary>
    public static StReadException ReadError(string text)
    {
        var error = Assert.Throws<StReadException>(() => StTranslator.Translate([new SourceText("test.st", text)]));
        return error;
    }
}
