using System.Diagnostics;
using System.Globalization;

namespace ScaleGen.Cli.Commands;

/// <summary>
/// One line of progress on stderr for a long run, rewritten in place ('\r'), and cleared
/// before the command's own messages. Only when stderr is a terminal and the input is large:
/// a CI log or a redirected stream gets nothing but the command's usual output.
/// </summary>
internal sealed class ProgressLine
{
    /// <summary>Input this large (about 3,000 points) takes long enough to be worth watching.</summary>
    public const long LargeInputChars = 1_000_000;

    private readonly TextWriter? _error;
    private readonly Stopwatch _clock = Stopwatch.StartNew();
    private int _shown;

    private ProgressLine(TextWriter? error) => _error = error;

    /// <summary>verify sweeps every point for tens of milliseconds: a few hundred points take long enough to watch.</summary>
    public const int LargeVerifyPoints = 200;

    public static ProgressLine For(ConsoleIo io, long inputChars) => When(io, inputChars >= LargeInputChars);

    /// <summary>A progress line shown when stderr is a terminal and the command judged the run long.</summary>
    public static ProgressLine When(ConsoleIo io, bool longRun) => new(io.ErrorIsTerminal && longRun ? io.Error : null);

    /// <summary>Replaces the line with <paramref name="text"/> and the time since the start; safe from any thread.</summary>
    public void Show(string text)
    {
        if (_error is null) return;
        var line = string.Create(CultureInfo.InvariantCulture, $"scalegen: {text} ({_clock.Elapsed.TotalSeconds:0.0} s)");
        lock (this)
        {
            _error.Write("\r" + line.PadRight(_shown));
            _error.Flush();
            _shown = line.Length;
        }
    }

    /// <summary>Blanks the line, so what the command prints next starts clean.</summary>
    public void Clear()
    {
        if (_error is null || _shown == 0) return;
        lock (this)
        {
            _error.Write("\r" + new string(' ', _shown) + "\r");
            _error.Flush();
            _shown = 0;
        }
    }
}
