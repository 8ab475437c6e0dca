using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>
/// The signal path of one point, in both directions, in double precision:
/// raw counts &lt;-&gt; card electrical value (mA or V, the card's straight line) &lt;-&gt;
/// loop current in mA (through the shunt on a voltage card) &lt;-&gt; fraction of the signal
/// span &lt;-&gt; extracted fraction (square root and cutoff) &lt;-&gt; engineering value.
/// This is the only place in ScaleGen where that arithmetic is written; every emitter,
/// report and the verifier call it instead of re-deriving it.
/// </summary>
/// <remarks>
/// The model is assumed bound and valid (the binder rejects equal counts, equal electrical
/// values, LRV = URV, a voltage card without a shunt). Nothing here is clamped: UNDER and
/// OVER readings follow the line beyond the range, as the language says.
/// </remarks>
public static class SignalPath
{
    // ---- card line -------------------------------------------------------------------

    /// <summary>Card electrical value (mA or V) per raw count; negative on a card whose counts fall as the signal rises.</summary>
    public static double ElectricalPerCount(Card card) =>
        (card.ElectricalHigh - card.ElectricalLow) / (card.RawHigh - card.RawLow);

    /// <summary>The card's straight line through its two <c>counts</c> points.</summary>
    /// <remarks>
    /// Multiply before dividing: with integer counts and round electrical values this is
    /// exact at the round points (raw 29376 on 0..27648 = 4..20 mA is exactly 21 mA), and it
    /// stays monotone in raw, which the raw-threshold search relies on.
    /// </remarks>
    public static double RawToElectrical(Card card, double raw) =>
        card.ElectricalLow + (raw - card.RawLow) * (card.ElectricalHigh - card.ElectricalLow) / (card.RawHigh - card.RawLow);

    public static double ElectricalToRaw(Card card, double electrical) =>
        card.RawLow + (electrical - card.ElectricalLow) * (card.RawHigh - card.RawLow) / (card.ElectricalHigh - card.ElectricalLow);

    // ---- electrical <-> loop current -----------------------------------------------

    /// <summary>
    /// The shunt that turns loop current into volts on a voltage card. The binder requires
    /// one; reaching here without it is a programming error, not bad input.
    /// </summary>
    public static double ShuntOf(Point point) =>
        point.ShuntOhms is { } ohms && ohms > 0
            ? ohms
            : throw new InvalidOperationException($"Point '{point.Tag}' is on a voltage card but has no shunt (the binder must reject this).");

    /// <summary>Card electrical value to loop current: identity on a mA card; V / shunt on a voltage card.</summary>
    public static double ElectricalToMa(Point point, double electrical) =>
        point.Card.IsVoltage ? electrical * 1000.0 / ShuntOf(point) : electrical;

    public static double MaToElectrical(Point point, double ma) =>
        point.Card.IsVoltage ? ma * ShuntOf(point) / 1000.0 : ma;

    /// <summary>Loop current (mA) that a raw count stands for.</summary>
    public static double RawToMa(Point point, double raw) =>
        ElectricalToMa(point, RawToElectrical(point.Card, raw));

    /// <summary>Raw count (not rounded) that a loop current produces.</summary>
    public static double MaToRaw(Point point, double ma) =>
        ElectricalToRaw(point.Card, MaToElectrical(point, ma));

    /// <summary>
    /// The integer count the card delivers for a loop current: rounded half away from zero,
    /// then held inside what the card's raw type can hold (a card cannot report more).
    /// </summary>
    public static long NearestRaw(Point point, double ma)
    {
        var raw = MaToRaw(point, ma);
        if (double.IsNaN(raw))
            throw new ArgumentOutOfRangeException(nameof(ma), "The loop current must be a number.");
        var (min, max) = Card.RangeOf(point.Card.RawType);
        if (raw <= min) return min;
        if (raw >= max) return max;
        return (long)Math.Round(raw, MidpointRounding.AwayFromZero);
    }

    /// <summary>
    /// The resistance the loop current flows through at the card terminals: the card input on
    /// a mA card, the shunt on a voltage card. Null when a mA card declares no input resistance
    /// (no terminal voltage to speak of).
    /// </summary>
    public static double? TerminalOhms(Point point)
    {
        if (point.Card.IsVoltage) return ShuntOf(point);
        return point.Card.InputOhms > 0 ? point.Card.InputOhms : null;
    }

    /// <summary>Voltage across the card input (mA card) or the shunt (voltage card) at a loop current.</summary>
    public static double MaToTerminalVolts(Point point, double ma) =>
        ma * (TerminalOhms(point) ?? 0.0) / 1000.0;

    /// <summary>
    /// Loop current from the voltage measured across the card input or shunt (for
    /// <c>eval --volts</c>). Null when the point has no terminal resistance to divide by.
    /// </summary>
    public static double? VoltsToMa(Point point, double volts) =>
        TerminalOhms(point) is { } ohms ? volts * 1000.0 / ohms : null;

    // ---- loop current <-> fraction <-> value ----------------------------------------

    /// <summary>Position of a loop current in the signal span: 0 at signal low, 1 at signal high (not clamped).</summary>
    public static double Fraction(Point point, double ma) =>
        (ma - point.SignalLowMa) / (point.SignalHighMa - point.SignalLowMa);

    public static double FractionToMa(Point point, double fraction) =>
        point.SignalLowMa + fraction * (point.SignalHighMa - point.SignalLowMa);

    /// <summary>The cutoff as a fraction of the flow (extracted) span; 0 on a linear point.</summary>
    public static double CutoffFraction(Point point) =>
        point.SquareRoot ? point.CutoffPercent / 100.0 : 0.0;

    /// <summary>
    /// Square-root extraction (ISO 5167-1: flow is proportional to the square root of the
    /// differential pressure): f = sqrt(max(f, 0)), and an extracted fraction below the
    /// cutoff (% of flow span) becomes 0. A linear point returns f unchanged.
    /// </summary>
    public static double ExtractedFraction(Point point, double fraction)
    {
        if (!point.SquareRoot) return fraction;
        return IsBelowCutoff(point, fraction) ? 0.0 : ExtractedIgnoringCutoff(point, fraction);
    }

    /// <summary>True when a square-root point's extracted flow at this signal fraction is below the cutoff (the value reads LRV).</summary>
    public static bool IsBelowCutoff(Point point, double fraction) =>
        point.SquareRoot && ExtractedIgnoringCutoff(point, fraction) < CutoffFraction(point);

    /// <summary>
    /// Exactly which raw counts inside the card limits the cutoff sends to LRV, so generated
    /// code can decide the cutoff on integers and agree with <see cref="RawToValue"/> at the
    /// jump. Never on a linear point or with no cutoff.
    /// </summary>
    public static RawCondition CutoffCondition(Point point)
    {
        if (!point.SquareRoot || !(CutoffFraction(point) > 0)) return RawCondition.Never;
        // The fraction rises with the current, so the cutoff holds on the low-current end.
        return RawSearch.Boundary(point.Card.LimitLow, point.Card.LimitHigh, holdsOnLowRaws: MaRisesWithRaw(point),
            raw => IsBelowCutoff(point, Fraction(point, RawToMa(point, raw))));
    }

    /// <summary>Square-root extraction without the cutoff (for resolution estimates near a value).</summary>
    internal static double ExtractedIgnoringCutoff(Point point, double fraction) =>
        point.SquareRoot ? Math.Sqrt(Math.Max(fraction, 0.0)) : fraction;

    /// <summary>Engineering value: LRV + extracted * (URV - LRV). Not clamped; reverse action works by sign.</summary>
    public static double ExtractedToValue(Point point, double extracted) =>
        point.Lrv + extracted * point.Span;

    public static double MaToValue(Point point, double ma) =>
        ExtractedToValue(point, ExtractedFraction(point, Fraction(point, ma)));

    /// <summary>The engineering value a raw count stands for, before any fault action or filter.</summary>
    public static double RawToValue(Point point, double raw) =>
        MaToValue(point, RawToMa(point, raw));

    // ---- inverse: value -> loop current -> raw ---------------------------------------

    /// <summary>
    /// The signal fraction at which the point shows a value. Linear: (v - LRV) / span.
    /// Square root: the extracted fraction e = (v - LRV) / span, squared. Values that the
    /// square-root point can never show on their own (between LRV and the cutoff, or
    /// beyond LRV on the wrong side) map to the cutoff edge, e = cutoff: that is the
    /// current at which the shown value crosses them (it jumps from LRV to the cutoff value
    /// there). With no cutoff they map to signal low.
    /// </summary>
    public static double ValueToFraction(Point point, double value)
    {
        var extracted = (value - point.Lrv) / point.Span;
        if (!point.SquareRoot) return extracted;
        var edge = CutoffFraction(point);
        if (extracted < edge) extracted = edge;
        return extracted * extracted;
    }

    /// <summary>Loop current at which the point shows a value (see <see cref="ValueToFraction"/> for square root).</summary>
    public static double ValueToMa(Point point, double value) =>
        FractionToMa(point, ValueToFraction(point, value));

    /// <summary>Raw count (not rounded) at which the point shows a value.</summary>
    public static double ValueToRaw(Point point, double value) =>
        MaToRaw(point, ValueToMa(point, value));

    // ---- directions --------------------------------------------------------------------

    /// <summary>True when the loop current rises as the raw count rises.</summary>
    public static bool MaRisesWithRaw(Point point) =>
        ElectricalPerCount(point.Card) > 0; // a shunt is always positive

    /// <summary>True when the engineering value rises (or stays) as the raw count rises.</summary>
    public static bool ValueRisesWithRaw(Point point) =>
        MaRisesWithRaw(point) == (point.Span > 0);

    // ---- coefficients for generated code ---------------------------------------------

    /// <summary>raw -&gt; mA as one multiply and one add.</summary>
    public static Affine RawToMaCoefficients(Point point)
    {
        // From the definition rather than from differences of RawToMa, so no cancellation.
        var perCount = ElectricalPerCount(point.Card);
        var toMa = point.Card.IsVoltage ? 1000.0 / ShuntOf(point) : 1.0;
        var gain = perCount * toMa;
        var offset = (point.Card.ElectricalLow - point.Card.RawLow * perCount) * toMa;
        return new Affine(gain, offset);
    }

    /// <summary>raw -&gt; signal fraction (before extraction) as one multiply and one add.</summary>
    public static Affine RawToFractionCoefficients(Point point)
    {
        var ma = RawToMaCoefficients(point);
        var width = point.SignalHighMa - point.SignalLowMa;
        return new Affine(ma.Gain / width, (ma.Offset - point.SignalLowMa) / width);
    }

    /// <summary>
    /// The coefficients the generated PLC code uses each scan, with no division:
    /// for a linear point value = raw * Gain + Offset; for a square-root point the signal
    /// fraction f = raw * Gain + Offset, after which the code extracts, applies the cutoff
    /// and scales by LRV and span (<see cref="ExtractedToValue"/>).
    /// </summary>
    public static Affine LinearCoefficients(Point point)
    {
        var fraction = RawToFractionCoefficients(point);
        if (point.SquareRoot) return fraction;
        return new Affine(fraction.Gain * point.Span, point.Lrv + fraction.Offset * point.Span);
    }
}

/// <summary>y = x * Gain + Offset.</summary>
public readonly record struct Affine(double Gain, double Offset)
{
    public double Apply(double x) => x * Gain + Offset;
}
