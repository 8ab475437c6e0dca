using ScaleGen.Model;
using static ScaleGen.Emit.StructuredText.StNames;

namespace ScaleGen.Emit.StructuredText;

/// <summary>
/// library.st: the types and function blocks every plant uses. The text is the same for
/// every plant; only the header (sources and their hashes) differs.
/// </summary>
/// <remarks>
/// Portable IEC 61131-3: no pragmas, no object-oriented extensions, no pointers, no
/// vendor libraries; only standard functions (SQRT, MAX, DINT_TO_REAL) and the standard TON.
/// The per-scan code has no division: the generator precomputes every gain. The order
/// within a scan (status, value, fault action, filter, alarms) is that of
/// <see cref="Engine.PointSimulator"/>, the reference the verifier runs it against.
/// The declarations are data (<see cref="DataTypes"/>, <see cref="Blocks"/>) so that the
/// PLCopen export writes the same ones; the bodies are text.
/// </remarks>
public static class StLibrary
{
    public static string Text(EmitContext context) =>
        StFile.HeaderComment(GeneratedHeader.Lines(context, "ScaleGen Structured Text library: types and function blocks for 4-20 mA analog input points."))
        + "\n" + Body;

    private static StVariable Var(string name, StType type, string? comment = null) => new(name, type, null, comment);

    private static StVariable Member(string name, StType type, string initial, string? comment = null) =>
        new(name, type, new StSimpleValue(initial), comment);

    private static readonly StType AlarmParams = new StDerivedType(AlarmParamsType);

    /// <summary>The types, in declaration order: the status enumeration, then the alarm and point parameter records.</summary>
    public static IReadOnlyList<StDataType> DataTypes { get; } =
    [
        new StEnumType(StatusType, StatusOrder.Select(StatusValue).ToArray(),
        [
            "Status of a point, judged on the raw count, first match wins:",
            "CARD_FAULT (raw outside the card limits or a card fault code), FAULT_LOW, FAULT_HIGH",
            "(loop current in the fault bands), UNDER, OVER (outside the signal span), else OK.",
        ]),
        new StStructType(AlarmParamsType,
        [
            Member("Enabled", StType.Bool, "FALSE", "FALSE: the point has no alarm of this kind"),
            Member("Setpoint", StType.Real, "0.0", "on at Value >= Setpoint (HH, H) or Value <= Setpoint (L, LL)"),
            Member("ResetValue", StType.Real, "0.0", "setpoint -/+ deadband: off at Value < ResetValue (HH, H) or Value > ResetValue (L, LL)"),
            Member("TripRawMin", StType.Dint, "1", "unfiltered points: raw counts at which Value is at or beyond Setpoint"),
            Member("TripRawMax", StType.Dint, "0"),
            Member("ClearRawMin", StType.Dint, "1", "unfiltered points: raw counts at which Value is beyond ResetValue"),
            Member("ClearRawMax", StType.Dint, "0"),
            Member("OnDelay", StType.Time, "T#0s", "the limit must hold this long before the alarm comes on"),
            Member("OffDelay", StType.Time, "T#0s", "the on-delayed limit must be gone this long before the alarm goes off"),
        ],
        ["One alarm limit. A raw range Min .. Max is empty when Min > Max."]),
        new StStructType(PointParamsType,
        [
            Member("Tag", new StStringType(StPlant.TagLength), "''"),
            Member("Description", new StStringType(StPlant.DescriptionLength), "''"),
            Member("LimitLow", StType.Dint, "0", "raw below LimitLow or above LimitHigh: CARD_FAULT") with { Notes = ["Status bands, judged in this order"] },
            Member("LimitHigh", StType.Dint, "0"),
            Member("FaultLowMin", StType.Dint, "1", "FAULT_LOW"),
            Member("FaultLowMax", StType.Dint, "0"),
            Member("FaultHighMin", StType.Dint, "1", "FAULT_HIGH"),
            Member("FaultHighMax", StType.Dint, "0"),
            Member("UnderMin", StType.Dint, "1", "UNDER"),
            Member("UnderMax", StType.Dint, "0"),
            Member("OverMin", StType.Dint, "1", "OVER"),
            Member("OverMax", StType.Dint, "0"),
            Member("SquareRoot", StType.Bool, "FALSE") with { Notes = ["Signal path"] },
            Member("Gain", StType.Real, "0.0", "linear: Value = raw * Gain + Offset; square root: fraction = raw * Gain + Offset"),
            Member("Offset", StType.Real, "0.0"),
            Member("CutoffRawMin", StType.Dint, "1", "square root: raw counts below the cutoff, where Value = Lrv"),
            Member("CutoffRawMax", StType.Dint, "0"),
            Member("Lrv", StType.Real, "0.0", "square root: Value = SQRT(fraction) * Span + Lrv"),
            Member("Span", StType.Real, "0.0"),
            Member("HoldLastGood", StType.Bool, "FALSE", "TRUE: keep the last good value, FaultValue until there is one") with { Notes = ["Fault action"] },
            Member("FaultValue", StType.Real, "0.0"),
            Member("FilterOn", StType.Bool, "FALSE") with { Notes = ["First-order lag"] },
            Member("Alpha", StType.Real, "1.0", "1 - EXP(-cycle / time constant), for the task cycle the plant declares"),
            .. AlarmKinds.Select((kind, i) => Var(AlarmParamsField(kind), AlarmParams) with { Notes = i == 0 ? ["Alarms"] : [] }),
        ],
        [
            "Every constant of one point, computed by the generator. A raw range Min .. Max is",
            "empty when Min > Max; ranges are exact for every raw count inside the card limits.",
        ]),
    ];

    private const string AlarmBlockBody = """
    IF Faulted OR NOT Par.Enabled THEN
        Condition := FALSE;
        Active := FALSE;
        OnTimer(IN := FALSE, PT := Par.OnDelay);
        OffTimer(IN := FALSE, PT := Par.OffDelay);
    ELSE
        IF Condition THEN
            (* holds until the value is beyond the reset value *)
            IF CompareRaw THEN
                Condition := NOT ((Raw >= Par.ClearRawMin) AND (Raw <= Par.ClearRawMax));
            ELSIF HighLimit THEN
                Condition := Value >= Par.ResetValue;
            ELSE
                Condition := Value <= Par.ResetValue;
            END_IF;
        ELSE
            IF CompareRaw THEN
                Condition := (Raw >= Par.TripRawMin) AND (Raw <= Par.TripRawMax);
            ELSIF HighLimit THEN
                Condition := Value >= Par.Setpoint;
            ELSE
                Condition := Value <= Par.Setpoint;
            END_IF;
        END_IF;
        OnTimer(IN := Condition, PT := Par.OnDelay);
        (* the off-delay runs while the alarm is on and the on-delayed limit is not *)
        OffTimer(IN := Active AND NOT OnTimer.Q, PT := Par.OffDelay);
        IF OnTimer.Q THEN
            Active := TRUE;
        ELSIF OffTimer.Q THEN
            Active := FALSE;
        END_IF;
    END_IF;

    """;

    // Static fields initialise in text order: the bodies come before the blocks that use them.
    private static readonly string PointBlockBody = $$"""
    (* 1. Status: integer comparisons on the raw count, first match wins. *)
    IF ({{RawInput}} < {{ParamsInput}}.LimitLow) OR ({{RawInput}} > {{ParamsInput}}.LimitHigh) OR {{CodeFaultInput}} THEN
        {{StatusOutput}} := {{StatusValue(PointStatus.CARD_FAULT)}};
    ELSIF ({{RawInput}} >= {{ParamsInput}}.FaultLowMin) AND ({{RawInput}} <= {{ParamsInput}}.FaultLowMax) THEN
        {{StatusOutput}} := {{StatusValue(PointStatus.FAULT_LOW)}};
    ELSIF ({{RawInput}} >= {{ParamsInput}}.FaultHighMin) AND ({{RawInput}} <= {{ParamsInput}}.FaultHighMax) THEN
        {{StatusOutput}} := {{StatusValue(PointStatus.FAULT_HIGH)}};
    ELSIF ({{RawInput}} >= {{ParamsInput}}.UnderMin) AND ({{RawInput}} <= {{ParamsInput}}.UnderMax) THEN
        {{StatusOutput}} := {{StatusValue(PointStatus.UNDER)}};
    ELSIF ({{RawInput}} >= {{ParamsInput}}.OverMin) AND ({{RawInput}} <= {{ParamsInput}}.OverMax) THEN
        {{StatusOutput}} := {{StatusValue(PointStatus.OVER)}};
    ELSE
        {{StatusOutput}} := {{StatusValue(PointStatus.OK)}};
    END_IF;
    {{FaultOutput}} := ({{StatusOutput}} = {{StatusValue(PointStatus.FAULT_LOW)}}) OR ({{StatusOutput}} = {{StatusValue(PointStatus.FAULT_HIGH)}}) OR ({{StatusOutput}} = {{StatusValue(PointStatus.CARD_FAULT)}});

    (* 2. Value along the signal path: one multiply and one add, no division. *)
    IF NOT {{ParamsInput}}.SquareRoot THEN
        {{LinearValueStatement}}
    ELSIF ({{RawInput}} >= {{ParamsInput}}.CutoffRawMin) AND ({{RawInput}} <= {{ParamsInput}}.CutoffRawMax) THEN
        Reading := {{ParamsInput}}.Lrv;
    ELSE
        Fraction := DINT_TO_REAL({{RawInput}}) * {{ParamsInput}}.Gain + {{ParamsInput}}.Offset;
        Reading := SQRT(MAX(Fraction, 0.0)) * {{ParamsInput}}.Span + {{ParamsInput}}.Lrv;
    END_IF;

    (* 3. Fault action: hold the last good value, or the fault value. *)
    IF {{FaultOutput}} THEN
        IF {{ParamsInput}}.HoldLastGood AND HaveGood THEN
            Reading := LastGood;
        ELSE
            Reading := {{ParamsInput}}.FaultValue;
        END_IF;
    ELSE
        LastGood := Reading;
        HaveGood := TRUE;
    END_IF;

    (* 4. First-order lag; the first good value sets it, a fault does not reset it. *)
    IF NOT {{ParamsInput}}.FilterOn THEN
        {{ValueOutput}} := Reading;
    ELSIF NOT FilterReady THEN
        {{ValueOutput}} := Reading;
        FilterReady := NOT {{FaultOutput}};
    ELSE
        {{ValueOutput}} := {{ValueOutput}} + (Reading - {{ValueOutput}}) * {{ParamsInput}}.Alpha;
    END_IF;

    (* 5. Alarms on the value shown. *)
    LimitHH(Raw := {{RawInput}}, Value := {{ValueOutput}}, CompareRaw := NOT {{ParamsInput}}.FilterOn, HighLimit := TRUE, Faulted := {{FaultOutput}}, Par := {{ParamsInput}}.{{AlarmParamsField(AlarmKind.HH)}});
    LimitH(Raw := {{RawInput}}, Value := {{ValueOutput}}, CompareRaw := NOT {{ParamsInput}}.FilterOn, HighLimit := TRUE, Faulted := {{FaultOutput}}, Par := {{ParamsInput}}.{{AlarmParamsField(AlarmKind.H)}});
    LimitL(Raw := {{RawInput}}, Value := {{ValueOutput}}, CompareRaw := NOT {{ParamsInput}}.FilterOn, HighLimit := FALSE, Faulted := {{FaultOutput}}, Par := {{ParamsInput}}.{{AlarmParamsField(AlarmKind.L)}});
    LimitLL(Raw := {{RawInput}}, Value := {{ValueOutput}}, CompareRaw := NOT {{ParamsInput}}.FilterOn, HighLimit := FALSE, Faulted := {{FaultOutput}}, Par := {{ParamsInput}}.{{AlarmParamsField(AlarmKind.LL)}});
    {{AlarmOutput(AlarmKind.HH)}} := LimitHH.Active;
    {{AlarmOutput(AlarmKind.H)}} := LimitH.Active;
    {{AlarmOutput(AlarmKind.L)}} := LimitL.Active;
    {{AlarmOutput(AlarmKind.LL)}} := LimitLL.Active;

    """;

    /// <summary>The function blocks, in declaration order: the alarm limit, then the point block that uses it.</summary>
    public static IReadOnlyList<StPou> Blocks { get; } =
    [
        new StPou(StPouKind.FunctionBlock, AlarmBlock,
        [
            new StVarSection(StVarKind.Input,
            [
                Var("Raw", StType.Dint, "this scan's raw count"),
                Var("Value", StType.Real, "this scan's value after fault action and filter"),
                Var("CompareRaw", StType.Bool, "TRUE: judge on the raw ranges (exact; unfiltered points only)"),
                Var("HighLimit", StType.Bool, "TRUE for HH and H, FALSE for L and LL"),
                Var("Faulted", StType.Bool),
                Var("Par", AlarmParams),
            ]),
            new StVarSection(StVarKind.Output, [Var("Active", StType.Bool)]),
            new StVarSection(StVarKind.Local,
            [
                Var("Condition", StType.Bool, "the limit with deadband, before the delays"),
                Var("OnTimer", new StDerivedType("TON")),
                Var("OffTimer", new StDerivedType("TON")),
            ]),
        ],
        AlarmBlockBody,
        [
            "One alarm limit with deadband, on-delay and off-delay, both timed by TON.",
            "Not evaluated while the point is faulted: then it is off and its timers restart.",
        ]),
        new StPou(StPouKind.FunctionBlock, PointBlock,
        [
            new StVarSection(StVarKind.Input,
            [
                Var(RawInput, StType.Dint, "the card's raw count"),
                Member(CodeFaultInput, StType.Bool, "FALSE", "TRUE: the raw count is a card fault code inside the limits"),
                Var(ParamsInput, new StDerivedType(PointParamsType)),
            ]),
            new StVarSection(StVarKind.Output,
            [
                Var(ValueOutput, StType.Real, "engineering value shown"),
                Var(StatusOutput, new StDerivedType(StatusType)),
                Var(FaultOutput, StType.Bool, "FAULT_LOW, FAULT_HIGH or CARD_FAULT"),
                .. AlarmKinds.Select(kind => Var(AlarmOutput(kind), StType.Bool)),
            ]),
            new StVarSection(StVarKind.Local,
            [
                Var("Reading", StType.Real, "this scan's value before the filter"),
                Var("Fraction", StType.Real, "square root: signal fraction before extraction"),
                Var("LastGood", StType.Real, "last value read while not faulted"),
                Var("HaveGood", StType.Bool),
                Var("FilterReady", StType.Bool, "the filter has had its first good value"),
                .. AlarmKinds.Select(kind => Var("Limit" + kind, new StDerivedType(AlarmBlock))),
            ]),
        ],
        PointBlockBody,
        [
            "One 4-20 mA analog input point. Call once per task cycle with the card's raw count",
            "(converted to DINT) and the point's parameter record.",
        ]),
    ];

    /// <summary>Everything after the header.</summary>
    public static string Body { get; } = StWriter.Library(DataTypes, Blocks);

    /// <summary>The statement of the linear path: the whole per-scan arithmetic of a linear point's value.</summary>
    public const string LinearValueStatement =
        $"Reading := DINT_TO_REAL({RawInput}) * {ParamsInput}.Gain + {ParamsInput}.Offset;";
}
