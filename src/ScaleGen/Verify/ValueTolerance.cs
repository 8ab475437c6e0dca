using ScaleGen.Engine;
using ScaleGen.Model;

namespace ScaleGen.Verify;

/// <summary>
/// A running bound on how far a correct REAL (IEEE 754 binary32) implementation of the
/// point's per-scan arithmetic may lie from the double-precision reference, scan by scan.
/// Derived from the operations the generated block is specified to do (docs/verify.md):
/// every REAL constant and every REAL operation rounds once, with relative error at most
/// u = 2^-24; n such roundings in a chain give at most γn = n·u / (1 − n·u) (the standard
/// bound for floating-point error analysis). The reference's own double-precision rounding
/// is added on top (a few units of 2^-53), so the bound never assumes the reference exact.
/// </summary>
/// <remarks>
/// Per scan, x is the reading before the filter and y the value shown:
/// <list type="bullet">
/// <item>Linear, good: Reading = fl(fl(fl(raw) · fl(Gain)) + fl(Offset)), so
/// e_x = γ4·|raw·Gain| + γ2·|Offset|.</item>
/// <item>Square root, good, outside the cutoff: the fraction has e_f as above; the square
/// root of max(f, 0) for a value known to ±e_f lies within Δs = √max(f + e_f, 0) − √max(f − e_f, 0)
/// of √f⁺ (f⁺ = max(f, 0)); then Value = fl(fl(fl(√) · fl(Span)) + fl(Lrv)):
/// e_x = (|Span|·Δs·(1 + γ3) + γ3·|√f⁺·Span| + u·|Lrv|)·(1 + u) + u·|x|.
/// Inside the cutoff: u·|Lrv|.</item>
/// <item>Faulted: u·|FaultValue|, or with hold the bound of the value held.</item>
/// <item>Filter, y' = y + (x − y)·α with each step rounded:
/// e_y' = (e_y·((1 − α) + α·γ3) + α·(1 + γ3)·e_x + α·γ3·|x − y|)·(1 + u) + u·|y'|.
/// It accumulates; a REAL filter with a small α stalls up to about u·|y| / α from the
/// exact value, and the bound grows to that.</item>
/// </list>
/// </remarks>
internal sealed class ValueTolerance
{
    /// <summary>Unit roundoff of REAL (binary32): half an ulp of 1.</summary>
    public const double U = 1.0 / (1 << 24);

    /// <summary>Allowance for the reference's own double arithmetic: 32 units of 2^-53 of the magnitudes involved.</summary>
    private const double ReferenceRoundoff = 32.0 / (1L << 53);

    private readonly Point _point;
    private readonly Affine _coefficients;
    private readonly RawCondition _cutoff;
    private readonly double _alpha;
    private readonly bool _filterOn;
    private readonly double _faultValue;
    private readonly double _signalWidth;
    private readonly double _signalScale;

    private bool _ready;
    private bool _haveGood;
    private double _lastGoodBound;
    private double _shownBound;
    private double _shown;

    public ValueTolerance(Point point, double cycleSeconds)
    {
        _point = point;
        _coefficients = SignalPath.LinearCoefficients(point);
        _cutoff = SignalPath.CutoffCondition(point);
        _filterOn = point.FilterSeconds > 0;
        _alpha = new LagFilter(point.FilterSeconds, cycleSeconds).Alpha;
        _faultValue = FaultActions.Substitute(point, lastGood: null);
        // The reference subtracts signal low from the current and divides by the signal
        // width: its rounding there scales with the currents over the width.
        _signalWidth = Math.Abs(point.SignalHighMa - point.SignalLowMa);
        _signalScale = (Math.Abs(point.SignalHighMa) + Math.Abs(point.SignalLowMa)) / _signalWidth;
    }

    public static double Gamma(int n) => n * U / (1 - n * U);

    public void Reset()
    {
        _ready = false;
        _haveGood = false;
        _lastGoodBound = 0;
        _shownBound = 0;
        _shown = 0;
    }

    /// <summary>The bound for this scan's shown value.</summary>
    /// <param name="raw">The raw count.</param>
    /// <param name="faulted">Whether the reference judged the scan faulted.</param>
    /// <param name="reading">The reference's value before the filter (after the fault action).</param>
    /// <param name="shown">The reference's value shown (after the filter).</param>
    public double Step(long raw, bool faulted, double reading, double shown)
    {
        double readingBound;
        if (faulted)
            readingBound = _point.OnFault.Kind == FaultActionKind.Hold && _haveGood ? _lastGoodBound : U * Math.Abs(_faultValue);
        else
        {
            readingBound = GoodReadingBound(raw, reading);
            _lastGoodBound = readingBound;
            _haveGood = true;
        }

        double bound;
        if (!_filterOn || !_ready)
        {
            bound = readingBound;
            if (_filterOn) _ready = !faulted;
        }
        else
        {
            var alpha = _alpha;
            var gamma3 = Gamma(3);
            var difference = Math.Abs(reading - _shown);
            bound = (_shownBound * ((1 - alpha) + alpha * gamma3) + alpha * (1 + gamma3) * readingBound + alpha * gamma3 * difference) * (1 + U)
                + U * Math.Abs(shown)
                + ReferenceRoundoff * (Math.Abs(shown) + alpha * difference);
        }
        _shownBound = bound;
        _shown = shown;
        return bound;
    }

    private double GoodReadingBound(long raw, double reading)
    {
        var (gain, offset) = (_coefficients.Gain, _coefficients.Offset);
        var product = Math.Abs(raw * gain);
        var span = Math.Abs(_point.Span);
        var lrv = Math.Abs(_point.Lrv);
        var current = Math.Abs(SignalPath.RawToMa(_point, raw)) / _signalWidth;
        var reference = ReferenceRoundoff * (product + Math.Abs(offset) + lrv + span * (1 + _signalScale + current) + Math.Abs(reading));

        if (!_point.SquareRoot)
            return Gamma(4) * product + Gamma(2) * Math.Abs(offset) + reference;
        if (_cutoff.IsMet(raw))
            return U * lrv + reference;

        var fractionBound = Gamma(4) * product + Gamma(2) * Math.Abs(offset) + ReferenceRoundoff * (product + Math.Abs(offset) + 1 + _signalScale + current);
        var fraction = SignalPath.Fraction(_point, SignalPath.RawToMa(_point, raw));
        var root = Math.Sqrt(Math.Max(fraction, 0));
        // The block's fraction lies within ±fractionBound of this one, so its square root
        // (of the fraction or 0, whichever is larger) lies between these two.
        var rootSpread = Math.Sqrt(Math.Max(fraction + fractionBound, 0)) - Math.Sqrt(Math.Max(fraction - fractionBound, 0));
        var gamma3 = Gamma(3);
        return (span * rootSpread * (1 + gamma3) + gamma3 * root * span + U * lrv) * (1 + U) + U * Math.Abs(reading) + reference;
    }
}
