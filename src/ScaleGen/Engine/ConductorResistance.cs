using ScaleGen.Model;

namespace ScaleGen.Engine;

/// <summary>D.c. resistance of one plain copper conductor at 20 degC.</summary>
public static class ConductorResistance
{
    /// <summary>Resistivity of annealed copper (IACS), ohm*m.</summary>
    public const double AnnealedCopperOhmMetre = 1.7241e-8;

    /// <summary>The AWG numbers accepted (0 to 40: every size an instrument loop could use).</summary>
    public const int AwgMin = 0, AwgMax = 40;

    // IEC 60228 maximum d.c. resistance, class 1 (solid) / class 2 (stranded), plain copper,
    // ohm/km (from memory). Class 1/2 is what a field cable is unless it says flexible.
    private static readonly (double Mm2, double OhmPerKm)[] MetricClass12 =
    [
        (0.5, 36.0),
        (0.75, 24.5),
        (1.0, 18.1),
        (1.5, 12.1),
        (2.5, 7.41),
        (4.0, 4.61),
        (6.0, 3.08),
    ];

    /// <summary>The metric sizes the table knows, mm2.</summary>
    public static IEnumerable<double> KnownSquareMillimetres => MetricClass12.Select(s => s.Mm2);

    /// <summary>
    /// Ohm per km of one conductor: IEC 60228 class 1/2 for a metric size in the table,
    /// ASTM B258 diameter with annealed copper for AWG. Null for a size not known here
    /// (the binder reports it).
    /// </summary>
    public static double? OhmPerKm(Conductor conductor)
    {
        if (conductor.Awg is { } awg)
            return awg is >= AwgMin and <= AwgMax ? AwgOhmPerKm(awg) : null;
        if (conductor.SquareMillimetres is { } mm2)
        {
            foreach (var (size, ohm) in MetricClass12)
                if (Math.Abs(size - mm2) <= 1e-9) return ohm;
        }
        return null;
    }

    /// <summary>ASTM B258: d = 0.127 mm * 92^((36 - n) / 39).</summary>
    public static double AwgDiameterMillimetres(int awg) => 0.127 * Math.Pow(92.0, (36.0 - awg) / 39.0);

    public static double AwgSquareMillimetres(int awg)
    {
        var d = AwgDiameterMillimetres(awg);
        return Math.PI / 4.0 * d * d;
    }

    /// <summary>R = rho / A, per km.</summary>
    public static double AwgOhmPerKm(int awg) =>
        AnnealedCopperOhmMetre / (AwgSquareMillimetres(awg) * 1e-6) * 1000.0;

    /// <summary>Round-trip resistance of a two-wire loop: both conductors of a one-way length.</summary>
    public static double? LoopOhms(Conductor conductor, double oneWayMetres) =>
        OhmPerKm(conductor) is { } perKm ? 2.0 * oneWayMetres / 1000.0 * perKm : null;
}
