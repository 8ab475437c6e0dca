using System.Collections.Immutable;
using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>
/// One step of the five-point test: the current a technician injects and what the card and
/// the PLC must then show.
/// </summary>
/// <param name="Percent">Position in the signal span (0, 25, 50, 75, 100). On a square-root point this is % of the differential-pressure signal, not of flow.</param>
/// <param name="Ma">Loop current to inject.</param>
/// <param name="Volts">Voltage across the card input (current card) or the shunt (voltage card); null when the card declares no input resistance.</param>
/// <param name="Raw">The count the card should deliver (nearest integer).</param>
/// <param name="Value">The engineering value the PLC must show at exactly <paramref name="Ma"/> (after square-root extraction and cutoff).</param>
/// <param name="Tolerance">Allowed error of the shown value, in engineering units (the point's tolerance, % of span).</param>
public sealed record SheetStep(double Percent, double Ma, double? Volts, long Raw, double Value, double Tolerance);

/// <summary>
/// A current to inject that must put the point into one status band (FAULT_LOW, UNDER,
/// OVER or FAULT_HIGH), and what the PLC then shows.
/// </summary>
/// <param name="Status">The status the point must report.</param>
/// <param name="Ma">Loop current to inject: inside the band, away from its edges.</param>
/// <param name="Volts">Voltage across the card input or shunt; null with no input resistance.</param>
/// <param name="Raw">The count the card should deliver.</param>
/// <param name="Value">The value shown: on UNDER/OVER the line beyond the range; while faulted the fault action's value, or null when the point holds its last good value.</param>
/// <param name="HoldsLastGood">True while faulted with <c>on-fault hold</c>: the value must not move.</param>
public sealed record FaultTest(PointStatus Status, double Ma, double? Volts, long Raw, double? Value, bool HoldsLastGood);

/// <summary>A status band the card cannot reach: no current it can read falls in it, so there is nothing to test.</summary>
public sealed record UntestableBand(PointStatus Status, string Reason);

/// <summary>Where one alarm trips and resets, as a technician tests it with a current source.</summary>
/// <param name="CurrentRisesToTrip">True when the loop current must rise to trip the alarm (a high alarm on a direct-acting point, a low alarm on a reverse-acting one).</param>
/// <param name="TripRaw">First raw count at which the alarm trips; null when the card limits never (or always) reach it.</param>
/// <param name="ResetRaw">First raw count, coming back, at which an active alarm clears; null likewise.</param>
public sealed record TripTest(
    Alarm Alarm,
    double Setpoint,
    double ResetValue,
    double TripMa,
    double ResetMa,
    double? TripVolts,
    double? ResetVolts,
    long? TripRaw,
    long? ResetRaw,
    bool CurrentRisesToTrip);

/// <summary>Everything the commissioning check sheet of one point lists.</summary>
public sealed record PointSheet(
    Point Point,
    ImmutableArray<SheetStep> Steps,
    ImmutableArray<FaultTest> FaultTests,
    ImmutableArray<UntestableBand> Untestable,
    ImmutableArray<TripTest> Trips)
{
    /// <summary>The point's tolerance in engineering units.</summary>
    public double Tolerance => Steps.IsDefaultOrEmpty ? 0 : Steps[0].Tolerance;

    /// <summary>The status bands outside the signal span, from the lowest current to the highest.</summary>
    public static readonly ImmutableArray<PointStatus> BandOrder =
        [PointStatus.FAULT_LOW, PointStatus.UNDER, PointStatus.OVER, PointStatus.FAULT_HIGH];

    /// <summary>Each band the point has, in <see cref="BandOrder"/>: its test, or why it has none.</summary>
    public IEnumerable<(PointStatus Status, FaultTest? Test, UntestableBand? Untestable)> Bands =>
        BandOrder
            .Select(status => (status, FaultTests.FirstOrDefault(t => t.Status == status), Untestable.FirstOrDefault(u => u.Status == status)))
            .Where(band => band.Item2 is not null || band.Item3 is not null);
}

/// <summary>
/// The numbers on commissioning check sheets: the five-point test, the status band tests
/// and the alarm trip and reset currents. All of it comes from <see cref="SignalPath"/>,
/// <see cref="StatusBands"/>, <see cref="Evaluator"/> and <see cref="AlarmMath"/>, so a
/// sheet shows exactly what the generated code does.
/// </summary>
public static class CheckSheets
{
    /// <summary>The five-point test positions, % of the signal span.</summary>
    public static readonly ImmutableArray<double> StepPercents = [0, 25, 50, 75, 100];

    /// <summary>
    /// How far beyond a band's inner edge a band test injects, at most, mA. A band test
    /// current sits this far past the threshold (or halfway across a narrower band) so a
    /// calibrator's own error cannot land it in the neighbouring band, while staying near
    /// the currents a transmitter really drives on a fault (NAMUR NE 43: 3.6 mA and below,
    /// 21.0 mA and above).
    /// </summary>
    public const double BandTestOffsetMa = 0.5;

    /// <summary>Bands narrower than this (mA) are not worth a test: no calibrator hits them reliably.</summary>
    public const double NarrowestTestableBandMa = 0.02;

    public static ImmutableArray<PointSheet> For(Plant plant) =>
        plant.Points.Select(For).ToImmutableArray();

    public static PointSheet For(Point point)
    {
        var (faultTests, untestable) = BandTests(point);
        return new PointSheet(point, Steps(point), faultTests, untestable, Trips(point));
    }

    public static ImmutableArray<SheetStep> Steps(Point point)
    {
        var tolerance = Deadbands.PercentOfSpanToEu(point, point.TolerancePercent);
        return StepPercents.Select(percent =>
        {
            var ma = SignalPath.FractionToMa(point, percent / 100.0);
            return new SheetStep(percent, ma, Volts(point, ma), SignalPath.NearestRaw(point, ma),
                SignalPath.MaToValue(point, ma), tolerance);
        }).ToImmutableArray();
    }

    /// <summary>The currents (mA) the card can deliver a good reading for: its limits, in current.</summary>
    public static (double Low, double High) ReadableMa(Point point)
    {
        var a = SignalPath.RawToMa(point, point.Card.LimitLow);
        var b = SignalPath.RawToMa(point, point.Card.LimitHigh);
        return (Math.Min(a, b), Math.Max(a, b));
    }

    /// <summary>
    /// One test current per status band outside the signal span, in the order FAULT_LOW,
    /// UNDER, OVER, FAULT_HIGH. Each band is the current interval where
    /// <see cref="StatusBands.StatusOfMa"/> gives that status, cut to what the card can
    /// read; the test current sits <see cref="BandTestOffsetMa"/> beyond the band's inner
    /// edge (the edge facing the signal span), or halfway across the band when it is
    /// narrower. Each current is checked through <see cref="Evaluator.EvaluateMa"/> (the
    /// nearest raw count, as the card delivers it) before it is listed.
    /// </summary>
    public static (ImmutableArray<FaultTest> Tests, ImmutableArray<UntestableBand> Untestable) BandTests(Point point)
    {
        var (readLow, readHigh) = ReadableMa(point);
        var faultLow = point.Health.FaultLowMa;
        var faultHigh = point.Health.FaultHighMa;
        var tests = ImmutableArray.CreateBuilder<FaultTest>();
        var untestable = ImmutableArray.CreateBuilder<UntestableBand>();

        // (status, inner edge, outer edge) with outer beyond inner in the direction away from the span.
        var bands = new List<(PointStatus Status, double Inner, double Outer)>();
        if (faultLow is { } fl) bands.Add((PointStatus.FAULT_LOW, fl, readLow));
        bands.Add((PointStatus.UNDER, point.SignalLowMa, faultLow is { } fl2 ? Math.Max(fl2, readLow) : readLow));
        bands.Add((PointStatus.OVER, point.SignalHighMa, faultHigh is { } fh2 ? Math.Min(fh2, readHigh) : readHigh));
        if (faultHigh is { } fh) bands.Add((PointStatus.FAULT_HIGH, fh, readHigh));

        foreach (var (status, inner, outerRaw) in bands)
        {
            var downward = status is PointStatus.FAULT_LOW or PointStatus.UNDER;
            // The card cannot read beyond its limits: the band ends there.
            var outer = downward ? Math.Max(outerRaw, readLow) : Math.Min(outerRaw, readHigh);
            var width = downward ? inner - outer : outer - inner;
            if (width < NarrowestTestableBandMa)
            {
                untestable.Add(new UntestableBand(status, width <= 0
                    ? $"the card reads no current {(downward ? "below" : "above")} {Format(inner)} mA"
                    : $"the band is only {Format(width)} mA wide on this card"));
                continue;
            }
            var offset = Math.Min(BandTestOffsetMa, width / 2.0);
            var ma = downward ? inner - offset : inner + offset;
            var reading = Evaluator.EvaluateMa(point, ma);
            if (reading.Status != status)
            {
                untestable.Add(new UntestableBand(status,
                    $"{Format(ma)} mA reads as {reading.Status} on this card (raw {reading.Raw})"));
                continue;
            }
            var holds = reading.IsFault && point.OnFault.Kind == FaultActionKind.Hold;
            // Outside a fault the value follows the line at the injected current, as on the steps.
            double? value = holds ? null : reading.IsFault ? reading.Value : SignalPath.MaToValue(point, ma);
            tests.Add(new FaultTest(status, ma, Volts(point, ma), reading.Raw, value, holds));
        }
        return (tests.ToImmutable(), untestable.ToImmutable());
    }

    public static ImmutableArray<TripTest> Trips(Point point) =>
        AlarmMath.AlarmPoints(point).Select(a => new TripTest(
            a.Alarm,
            a.TripValue,
            a.ResetValue,
            a.TripMa,
            a.ResetMa,
            Volts(point, a.TripMa),
            Volts(point, a.ResetMa),
            a.TripRaw,
            a.ResetRaw,
            CurrentRisesToTrip: a.Alarm.IsHigh == (point.Span > 0))).ToImmutableArray();

    private static double? Volts(Point point, double ma) =>
        SignalPath.TerminalOhms(point) is null ? null : SignalPath.MaToTerminalVolts(point, ma);

    private static string Format(double value) =>
        Math.Round(value, 3).ToString("0.###", System.Globalization.CultureInfo.InvariantCulture);
}
