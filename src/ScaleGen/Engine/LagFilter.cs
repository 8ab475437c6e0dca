namespace ScaleGen.Engine;

/// <summary>
/// First-order lag, exact discrete form (textbook control theory):
/// y += (x - y) * (1 - exp(-dt / tau)) each scan. The first good sample initialises y;
/// until then the output passes the input through without initialising.
/// A time constant of zero or less means no filter: y = x.
/// </summary>
public sealed class LagFilter
{
    public LagFilter(double timeConstantSeconds, double cycleSeconds)
    {
        TimeConstantSeconds = timeConstantSeconds;
        Alpha = AlphaFor(timeConstantSeconds, cycleSeconds);
    }

    public double TimeConstantSeconds { get; }

    /// <summary>The fraction of the remaining step taken per scan: 1 - exp(-dt / tau); 1 with no filter.</summary>
    public double Alpha { get; }

    public bool IsInitialised { get; private set; }

    public double Output { get; private set; }

    public static double AlphaFor(double timeConstantSeconds, double cycleSeconds) =>
        timeConstantSeconds > 0 ? 1.0 - Math.Exp(-cycleSeconds / timeConstantSeconds) : 1.0;

    /// <param name="input">This scan's value (after the fault action).</param>
    /// <param name="good">Whether the input is a good (not faulted) sample.</param>
    public double Step(double input, bool good)
    {
        if (!(TimeConstantSeconds > 0))
            Output = input;
        else if (!IsInitialised)
        {
            Output = input;
            IsInitialised = good;
        }
        else
            Output += (input - Output) * Alpha;
        return Output;
    }

    public void Reset()
    {
        IsInitialised = false;
        Output = 0;
    }
}
