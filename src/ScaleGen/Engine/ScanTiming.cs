namespace ScaleGen.Engine;

/// <summary>
/// Time inside the scan-by-scan reference is counted in whole PLC cycles, so the reference
/// and generated code agree exactly (no accumulated floating-point time).
/// </summary>
public static class ScanTiming
{
    /// <summary>
    /// The number of cycles a delay lasts: seconds / cycle, rounded up, except that a
    /// quotient within 1e-9 (relative) of a whole number counts as that number (5 s at 0.1 s
    /// is 50 cycles, not 51 through binary rounding). Zero or negative delays are 0.
    /// </summary>
    public static int DelayScans(double seconds, double cycleSeconds)
    {
        if (!(seconds > 0)) return 0;
        if (!(cycleSeconds > 0)) throw new ArgumentOutOfRangeException(nameof(cycleSeconds), "The cycle time must be positive.");
        var quotient = seconds / cycleSeconds;
        var nearest = Math.Round(quotient);
        var scans = Math.Abs(quotient - nearest) <= 1e-9 * Math.Max(1.0, quotient) ? nearest : Math.Ceiling(quotient);
        return scans >= int.MaxValue ? int.MaxValue : (int)scans;
    }
}
