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
/// </remarks>
public static class StLibrary
{
    public static string Text(EmitContext context) =>
        StFile.HeaderComment(GeneratedHeader.Lines(context, "ScaleGen Structured Text library: types and function blocks for 4-20 mA analog input points."))
        + "\n" + Body;

    /// <summary>Everything after the header.</summary>
    public static readonly string Body = $$"""
(* Status of a point, judged on the raw count, first match wins:
   CARD_FAULT (raw outside the card limits or a card fault code), FAULT_LOW, FAULT_HIGH
   (loop current in the fault bands), UNDER, OVER (outside the signal span), else OK. *)
TYPE {{StatusType}} :
    ({{StatusValue(PointStatus.OK)}}, {{StatusValue(PointStatus.UNDER)}}, {{StatusValue(PointStatus.OVER)}}, {{StatusValue(PointStatus.FAULT_LOW)}}, {{StatusValue(PointStatus.FAULT_HIGH)}}, {{StatusValue(PointStatus.CARD_FAULT)}});
END_TYPE

(* One alarm limit. A raw range Min .. Max is empty when Min > Max. *)
TYPE {{AlarmParamsType}} :
STRUCT
    Enabled : BOOL := FALSE;      (* FALSE: the point has no alarm of this kind *)
    Setpoint : REAL := 0.0;       (* on at Value >= Setpoint (HH, H) or Value <= Setpoint (L, LL) *)
    ResetValue : REAL := 0.0;     (* setpoint -/+ deadband: off at Value < ResetValue (HH, H) or Value > ResetValue (L, LL) *)
    TripRawMin : DINT := 1;       (* unfiltered points: raw counts at which Value is at or beyond Setpoint *)
    TripRawMax : DINT := 0;
    ClearRawMin : DINT := 1;      (* unfiltered points: raw counts at which Value is beyond ResetValue *)
    ClearRawMax : DINT := 0;
    OnDelay : TIME := T#0s;       (* the limit must hold this long before the alarm comes on *)
    OffDelay : TIME := T#0s;      (* the on-delayed limit must be gone this long before the alarm goes off *)
END_STRUCT;
END_TYPE

(* Every constant of one point, computed by the generator. A raw range Min .. Max is
   empty when Min > Max; ranges are exact for every raw count inside the card limits. *)
TYPE {{PointParamsType}} :
STRUCT
    Tag : STRING[40] := '';
    Description : STRING[80] := '';
    (* Status bands, judged in this order *)
    LimitLow : DINT := 0;         (* raw below LimitLow or above LimitHigh: CARD_FAULT *)
    LimitHigh : DINT := 0;
    FaultLowMin : DINT := 1;      (* FAULT_LOW *)
    FaultLowMax : DINT := 0;
    FaultHighMin : DINT := 1;     (* FAULT_HIGH *)
    FaultHighMax : DINT := 0;
    UnderMin : DINT := 1;         (* UNDER *)
    UnderMax : DINT := 0;
    OverMin : DINT := 1;          (* OVER *)
    OverMax : DINT := 0;
    (* Signal path *)
    SquareRoot : BOOL := FALSE;
    Gain : REAL := 0.0;           (* linear: Value = raw * Gain + Offset; square root: fraction = raw * Gain + Offset *)
    Offset : REAL := 0.0;
    CutoffRawMin : DINT := 1;     (* square root: raw counts below the cutoff, where Value = Lrv *)
    CutoffRawMax : DINT := 0;
    Lrv : REAL := 0.0;            (* square root: Value = SQRT(fraction) * Span + Lrv *)
    Span : REAL := 0.0;
    (* Fault action *)
    HoldLastGood : BOOL := FALSE; (* TRUE: keep the last good value, FaultValue until there is one *)
    FaultValue : REAL := 0.0;
    (* First-order lag *)
    FilterOn : BOOL := FALSE;
    Alpha : REAL := 1.0;          (* 1 - EXP(-cycle / time constant), for the task cycle the plant declares *)
    (* Alarms *)
    {{AlarmParamsField(AlarmKind.HH)}} : {{AlarmParamsType}};
    {{AlarmParamsField(AlarmKind.H)}} : {{AlarmParamsType}};
    {{AlarmParamsField(AlarmKind.L)}} : {{AlarmParamsType}};
    {{AlarmParamsField(AlarmKind.LL)}} : {{AlarmParamsType}};
END_STRUCT;
END_TYPE

(* One alarm limit with deadband, on-delay and off-delay, both timed by TON.
   Not evaluated while the point is faulted: then it is off and its timers restart. *)
FUNCTION_BLOCK {{AlarmBlock}}
VAR_INPUT
    Raw : DINT;                   (* this scan's raw count *)
    Value : REAL;                 (* this scan's value after fault action and filter *)
    CompareRaw : BOOL;            (* TRUE: judge on the raw ranges (exact; unfiltered points only) *)
    HighLimit : BOOL;             (* TRUE for HH and H, FALSE for L and LL *)
    Faulted : BOOL;
    Par : {{AlarmParamsType}};
END_VAR
VAR_OUTPUT
    Active : BOOL;
END_VAR
VAR
    Condition : BOOL;             (* the limit with deadband, before the delays *)
    OnTimer : TON;
    OffTimer : TON;
END_VAR

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

END_FUNCTION_BLOCK

(* One 4-20 mA analog input point. Call once per task cycle with the card's raw count
   (converted to DINT) and the point's parameter record. *)
FUNCTION_BLOCK {{PointBlock}}
VAR_INPUT
    {{RawInput}} : DINT;                   (* the card's raw count *)
    {{CodeFaultInput}} : BOOL := FALSE;    (* TRUE: the raw count is a card fault code inside the limits *)
    {{ParamsInput}} : {{PointParamsType}};
END_VAR
VAR_OUTPUT
    {{ValueOutput}} : REAL;                 (* engineering value shown *)
    {{StatusOutput}} : {{StatusType}};
    {{FaultOutput}} : BOOL;                 (* FAULT_LOW, FAULT_HIGH or CARD_FAULT *)
    {{AlarmOutput(AlarmKind.HH)}} : BOOL;
    {{AlarmOutput(AlarmKind.H)}} : BOOL;
    {{AlarmOutput(AlarmKind.L)}} : BOOL;
    {{AlarmOutput(AlarmKind.LL)}} : BOOL;
END_VAR
VAR
    Reading : REAL;               (* this scan's value before the filter *)
    Fraction : REAL;              (* square root: signal fraction before extraction *)
    LastGood : REAL;              (* last value read while not faulted *)
    HaveGood : BOOL;
    FilterReady : BOOL;           (* the filter has had its first good value *)
    LimitHH : {{AlarmBlock}};
    LimitH : {{AlarmBlock}};
    LimitL : {{AlarmBlock}};
    LimitLL : {{AlarmBlock}};
END_VAR

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

END_FUNCTION_BLOCK

""";

    /// <summary>The statement of the linear path: the whole per-scan arithmetic of a linear point's value.</summary>
    public const string LinearValueStatement =
        $"Reading := DINT_TO_REAL({RawInput}) * {ParamsInput}.Gain + {ParamsInput}.Offset;";
}
