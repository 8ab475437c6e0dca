using System.Collections.Immutable;
using ScaleGen.Model;

namespace ScaleGen.Emit.StructuredText;

/// <summary>
/// Every name the Structured Text output uses, in one place, so that the verifier and
/// other readers map the text to points without guessing.
/// </summary>
/// <remarks>
/// <para>How to run the generated code scan by scan: the PROGRAM <see cref="Program"/> in
/// <see cref="PlantFile"/> has one raw input per point (<see cref="StPointNames.RawInput"/>,
/// of the card's raw type); set it, run the program body once, then read the point's
/// instance (<see cref="StPointNames.Instance"/>, a <see cref="PointBlock"/>) outputs
/// <see cref="ValueOutput"/>, <see cref="StatusOutput"/>, <see cref="FaultOutput"/> and
/// <see cref="AlarmOutput"/>. One run of the body is one PLC cycle of
/// <see cref="Plant.CycleSeconds"/>.</para>
/// <para>Timers: the code uses only the standard TON, with this model, which the engine's
/// <see cref="Engine.AlarmStateMachine"/> reproduces exactly: in the call in which IN turns
/// TRUE the elapsed time ET is 0; every later call with IN still TRUE adds one cycle; Q = IN
/// AND ET &gt;= PT (so PT = T#0s gives Q in the same call); IN = FALSE resets ET and Q. Every
/// PT the generator writes is a whole number of cycles
/// (<see cref="Engine.ScanTiming.DelayScans"/> times the cycle), so a model that counts calls
/// (Q once the number of calls since IN rose reaches PT / cycle) is equally exact.</para>
/// </remarks>
public static class StNames
{
    public const string LibraryFile = "library.st";
    public const string PlantFile = "plant.st";

    // ---- library types and blocks ----------------------------------------------------

    /// <summary>Enumerated status type; its values are <see cref="StatusValue"/>.</summary>
    public const string StatusType = "SG_Status";

    /// <summary>The parameter record of one point (a STRUCT).</summary>
    public const string PointParamsType = "SG_PointParams";

    /// <summary>The parameter record of one alarm limit (a STRUCT, four of them per point record).</summary>
    public const string AlarmParamsType = "SG_AlarmParams";

    /// <summary>The function block for one analog input point.</summary>
    public const string PointBlock = "SG_AnalogPoint";

    /// <summary>The function block for one alarm limit (deadband, on- and off-delay), used inside <see cref="PointBlock"/>.</summary>
    public const string AlarmBlock = "SG_AlarmLimit";

    /// <summary>The PROGRAM in <see cref="PlantFile"/>.</summary>
    public const string Program = "SG_Plant";

    /// <summary>The enumerated value for a status: SG_OK, SG_UNDER, SG_OVER, SG_FAULT_LOW, SG_FAULT_HIGH, SG_CARD_FAULT (declared in this order).</summary>
    public static string StatusValue(PointStatus status) => "SG_" + status;

    /// <summary>Status values in declaration order (ordinal 0 = SG_OK).</summary>
    public static ImmutableArray<PointStatus> StatusOrder { get; } =
    [
        PointStatus.OK, PointStatus.UNDER, PointStatus.OVER,
        PointStatus.FAULT_LOW, PointStatus.FAULT_HIGH, PointStatus.CARD_FAULT,
    ];

    // ---- members of the point block ---------------------------------------------------

    /// <summary>VAR_INPUT DINT: the card's raw count.</summary>
    public const string RawInput = "Raw";

    /// <summary>
    /// VAR_INPUT BOOL: TRUE when the raw count is one of the card's fault codes that lie
    /// inside its limits (codes outside the limits are card faults anyway). The program
    /// passes it only for points whose card has such codes; it defaults to FALSE.
    /// </summary>
    public const string CodeFaultInput = "CodeFault";

    /// <summary>VAR_INPUT <see cref="PointParamsType"/>: the point's parameter record.</summary>
    public const string ParamsInput = "Par";

    /// <summary>VAR_OUTPUT REAL: the value shown (after extraction, cutoff, fault action and filter).</summary>
    public const string ValueOutput = "Value";

    /// <summary>VAR_OUTPUT <see cref="StatusType"/>.</summary>
    public const string StatusOutput = "Status";

    /// <summary>VAR_OUTPUT BOOL: status is FAULT_LOW, FAULT_HIGH or CARD_FAULT.</summary>
    public const string FaultOutput = "Fault";

    /// <summary>VAR_OUTPUT BOOL per alarm kind: AlarmHH, AlarmH, AlarmL, AlarmLL (FALSE for a kind the point does not have).</summary>
    public static string AlarmOutput(AlarmKind kind) => "Alarm" + kind;

    /// <summary>The field of <see cref="PointParamsType"/> that holds one alarm kind's <see cref="AlarmParamsType"/>: HH, H, L, LL.</summary>
    public static string AlarmParamsField(AlarmKind kind) => kind.ToString();

    /// <summary>The alarm kinds in the order the block and the records list them.</summary>
    public static ImmutableArray<AlarmKind> AlarmKinds { get; } = [AlarmKind.HH, AlarmKind.H, AlarmKind.L, AlarmKind.LL];

    /// <summary>
    /// Every name the library declares at the top level, plus the program: point names
    /// never take one of these.
    /// </summary>
    public static ImmutableArray<string> LibraryNames { get; } =
    [
        StatusType, PointParamsType, AlarmParamsType, PointBlock, AlarmBlock, Program,
        .. StatusOrder.Select(StatusValue),
    ];

    // ---- per-point names in the program ------------------------------------------------

    /// <summary>
    /// The names of every point's program variables, in point order. The instance is the
    /// point's IEC identifier, the raw input that plus <c>_Raw</c>, the parameter constant
    /// plus <c>_Par</c>. IEC identifiers ignore case, so where a name is already taken (a
    /// library name, another point's instance, or an earlier name) it gets <c>_2</c>,
    /// <c>_3</c>, ...: instances are named first, so only contrived tags (a point <c>A</c>
    /// beside a point <c>A_Raw</c>) ever see a suffix.
    /// </summary>
    public static ImmutableArray<StPointNames> ForPlant(Plant plant)
    {
        var taken = new HashSet<string>(LibraryNames, StringComparer.OrdinalIgnoreCase);
        string Claim(string wanted)
        {
            var name = wanted;
            for (var n = 2; !taken.Add(name); n++) name = wanted + "_" + n.ToString(System.Globalization.CultureInfo.InvariantCulture);
            return name;
        }

        var instances = plant.Points.Select(p => Claim(p.Identifier)).ToArray();
        var raws = plant.Points.Select(p => Claim(p.Identifier + "_Raw")).ToArray();
        var parameters = plant.Points.Select(p => Claim(p.Identifier + "_Par")).ToArray();
        return plant.Points.Select((p, i) => new StPointNames(p, instances[i], raws[i], parameters[i])).ToImmutableArray();
    }
}

/// <summary>The program-level names of one point.</summary>
/// <param name="Point">The point.</param>
/// <param name="Instance">The <see cref="StNames.PointBlock"/> instance in the program.</param>
/// <param name="RawInput">The program's VAR_INPUT for the raw count, of the card's raw type (INT, DINT or UINT).</param>
/// <param name="Parameters">The VAR CONSTANT <see cref="StNames.PointParamsType"/> record passed to the instance.</param>
public sealed record StPointNames(Point Point, string Instance, string RawInput, string Parameters);
