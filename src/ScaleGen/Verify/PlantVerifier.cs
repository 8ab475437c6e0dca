using System.Collections.Immutable;
using System.Diagnostics;
using System.Globalization;
using System.Runtime.CompilerServices;
using System.Text;
using ScaleGen.Emit;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Engine;
using ScaleGen.Model;
using ScaleGen.Text;
using ScaleGen.Verify.Runtime;

namespace ScaleGen.Verify;

/// <summary>The first scan of a point that disagreed with the reference.</summary>
/// <param name="Case">1-based number of the case in the point's sweep.</param>
/// <param name="CaseName">What the case does.</param>
/// <param name="Scan">1-based scan within the case (each case starts from a fresh block).</param>
/// <param name="Raw">The raw count of that scan.</param>
/// <param name="What">Which output differed: Value, Status, Fault, AlarmHH, AlarmH, AlarmL, AlarmLL or Raw (the input could not be set).</param>
public sealed record VerifyFailure(int Case, string CaseName, int Scan, long Raw, string What, string Expected, string Got);

/// <summary>The verdict for one point.</summary>
/// <param name="Cases">Runs from a fresh block.</param>
/// <param name="Scans">Scans compared.</param>
/// <param name="MaxErrorPercent">Largest |block value − reference value| over all scans, in % of the span.</param>
/// <param name="TolerancePercent">Largest derived tolerance over all scans, in % of the span (see <see cref="ValueTolerance"/>).</param>
/// <param name="ToleranceUnits">The same in engineering units.</param>
/// <param name="EdgeScans">Scans where an alarm bit differed from the reference only through a limit decision taken within the tolerance of its edge.</param>
/// <param name="Mismatches">Scans where anything differed beyond that.</param>
public sealed record PointVerdict(
    string Point,
    int Cases,
    long Scans,
    double MaxErrorPercent,
    double TolerancePercent,
    double ToleranceUnits,
    long EdgeScans,
    long Mismatches,
    VerifyFailure? FirstFailure)
{
    public bool Ok => Mismatches == 0;
}

/// <summary>A problem that stopped verify before or while running the points (unreadable Structured Text, a run-time error).</summary>
public sealed record VerifyProblem(string Path, int Line, int Column, string Message)
{
    public static VerifyProblem At(SourceLocation location, string message) => new(location.Path, location.Line, location.Column, message);

    public override string ToString() =>
        Line > 0 ? $"{Path}({Line},{Column}): error: {Message}" : $"{Path}: error: {Message}";
}

/// <summary>Wall-clock time of each phase (for the benchmark; never printed by the command).</summary>
public sealed record VerifyTimings(TimeSpan Translate, TimeSpan Compile, TimeSpan Run);

/// <param name="PerPoint">True when the program split by point and each point ran alone (else all ran in lockstep, whole scans).</param>
public sealed record VerifyResult(
    ImmutableArray<PointVerdict> Points,
    VerifyProblem? Problem,
    ImmutableArray<string> StFiles,
    double CycleSeconds,
    VerifyTimings Timings,
    bool PerPoint = false)
{
    public bool Ok => Problem is null && Points.All(p => p.Ok);
}

/// <summary>
/// `verify`: runs the Structured Text itself against the reference. The text is read,
/// type-checked and translated to C# (<see cref="StTranslator"/>), compiled in memory with
/// Roslyn, and driven scan by scan: every point of the program runs its
/// <see cref="VerifySweep"/> cases in lockstep, and after each scan each point's Value,
/// Status, Fault and alarm bits are compared with a <see cref="PointSimulator"/> fed the
/// same raw counts. Nothing of the model goes into the program: the model is only the
/// reference and tells which program variables belong to which point (<see cref="StNames"/>).
/// </summary>
public static class PlantVerifier
{
    /// <summary>The Structured Text `build --only st` would write, as source texts named library.st and plant.st.</summary>
    public static IReadOnlyList<SourceText> GenerateStructuredText(Compilation compilation) =>
        new StructuredTextEmitter().Emit(EmitContext.From(compilation)).Select(f => new SourceText(f.RelativePath, f.Content)).ToList();

    /// <summary>
    /// Runs the Structured Text against the reference. <paramref name="progress"/>, if given,
    /// hears what is being done (a phase, or how many points have been swept) for a
    /// progress line; it is called from this thread only.
    /// </summary>
    public static VerifyResult Verify(Plant plant, IReadOnlyList<SourceText> structuredText, Action<string>? progress = null)
    {
        var files = structuredText.Select(s => s.Path).ToImmutableArray();
        var watch = Stopwatch.StartNew();
        VerifyResult Failed(VerifyProblem problem, TimeSpan translate = default, TimeSpan compile = default, TimeSpan run = default) =>
            new([], problem, files, plant.CycleSeconds, new VerifyTimings(translate, compile, run));

        if (structuredText.Count == 0)
            return Failed(new VerifyProblem("plant.st", 0, 0, "no Structured Text was given"));

        var cycleMicroseconds = plant.CycleSeconds * 1e6;
        if (Math.Abs(cycleMicroseconds - Math.Round(cycleMicroseconds)) > 1e-6 * Math.Max(1, cycleMicroseconds) || Math.Round(cycleMicroseconds) < 1)
            return Failed(new VerifyProblem(files.FirstOrDefault() ?? "plant", 0, 0,
                $"the plant cycle {plant.CycleSeconds.ToString("R", CultureInfo.InvariantCulture)} s is not a whole number of microseconds; TIME in the generated code counts whole microseconds"));

        var names = StNames.ForPlant(plant);
        StTranslation translation;
        string harness;
        try
        {
            progress?.Invoke("reading and translating the Structured Text");
            translation = StTranslator.Translate(structuredText);
            harness = HarnessCode(translation, names);
        }
        catch (StReadException e)
        {
            return Failed(VerifyProblem.At(e.Location, e.Message), watch.Elapsed);
        }
        var translate = watch.Elapsed;

        watch.Restart();
        progress?.Invoke("compiling the translation");
        using var assembly = StAssembly.Compile([translation.Code, harness], out var errors);
        var compile = watch.Elapsed;
        if (assembly is null)
        {
            var where = translation.FirstLocation is { } first ? VerifyProblem.At(first, "") : new VerifyProblem(files.FirstOrDefault() ?? "", 0, 0, "");
            return Failed(where with { Message = "the C# translated from the Structured Text did not compile (a construct the reader let through but cannot run): " + string.Join("; ", errors) },
                translate, compile);
        }

        watch.Restart();
        var clock = new StClock();
        var driver = (IStPlantHarness)Activator.CreateInstance(assembly.Assembly.GetType(StTranslator.Namespace + "." + HarnessClass)!, clock)!;
        var checkers = names.Select((n, i) => new PointChecker(i, n, plant.CycleSeconds, StatusMap(translation, n))).ToArray();
        try
        {
            Run(driver, clock, (long)Math.Round(cycleMicroseconds), checkers, progress);
        }
        catch (StRuntimeException e)
        {
            var message = $"run-time error in the Structured Text: {e.Message}";
            return Failed(e.Location >= 0 && e.Location < translation.Locations.Count
                ? VerifyProblem.At(translation.Locations[e.Location], message)
                : new VerifyProblem(files.FirstOrDefault() ?? "", 0, 0, message), translate, compile, watch.Elapsed);
        }
        return new VerifyResult(checkers.Select(c => c.Verdict()).ToImmutableArray(), null, files, plant.CycleSeconds,
            new VerifyTimings(translate, compile, watch.Elapsed), driver.PerPoint);
    }

    /// <summary>
    /// Where the program splits by point, each point runs its cases alone with its own
    /// statements; otherwise every point advances through its cases in lockstep with the
    /// others, one whole program scan per step. The clock advances one cycle per scan.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Run(IStPlantHarness driver, StClock clock, long cycleMicroseconds, PointChecker[] checkers, Action<string>? progress)
    {
        var outputs = new StPointOutputs();
        // About a hundred progress updates over the run, whatever the plant's size.
        var every = Math.Max(1, checkers.Length / 100);
        if (driver.PerPoint)
        {
            foreach (var checker in checkers)
            {
                if (progress is not null && checker.Index % every == 0)
                    progress($"sweeping point {checker.Index + 1} of {checkers.Length}");
                while (!checker.Done)
                {
                    if (checker.AtCaseStart) driver.ResetPoint(checker.Index);
                    try
                    {
                        driver.SetRaw(checker.Index, checker.CurrentRaw);
                    }
                    catch (StRuntimeException e)
                    {
                        checker.InputRejected(e.Message);
                        break;
                    }
                    driver.ScanPoint(checker.Index);
                    clock.NowMicroseconds += cycleMicroseconds;
                    driver.Read(checker.Index, ref outputs);
                    checker.Compare(outputs);
                }
                checker.Release();
            }
            return;
        }

        progress?.Invoke($"sweeping {checkers.Length} points in step");
        var active = checkers.Where(c => !c.Done).ToList();
        while (active.Count > 0)
        {
            foreach (var checker in active)
            {
                if (checker.AtCaseStart) driver.ResetPoint(checker.Index);
                try
                {
                    driver.SetRaw(checker.Index, checker.CurrentRaw);
                }
                catch (StRuntimeException e)
                {
                    checker.InputRejected(e.Message);
                }
            }
            driver.Scan();
            clock.NowMicroseconds += cycleMicroseconds;
            foreach (var checker in active)
            {
                if (checker.Done) continue; // its input was rejected
                driver.Read(checker.Index, ref outputs);
                checker.Compare(outputs);
            }
            active.RemoveAll(c => c.Done);
        }
        foreach (var checker in checkers) checker.Release();
    }

    /// <summary>Status ordinals of the block's status type mapped to statuses by their names (SG_OK, ...); null for a value that names none.</summary>
    private static PointStatus?[] StatusMap(StTranslation translation, StPointNames names)
    {
        var program = translation.Pous[StNames.Program];
        var block = program.VariableIndex[names.Instance].Type.Pou!;
        var type = block.VariableIndex[StNames.StatusOutput].Type;
        return type.Members.Select(m => StNames.StatusOrder.Cast<PointStatus?>()
            .FirstOrDefault(s => string.Equals(StNames.StatusValue(s!.Value), m.Name, StringComparison.OrdinalIgnoreCase))).ToArray();
    }

    private const string HarnessClass = "VerifyHarness";

    /// <summary>
    /// C# glue between the translated program and the verifier: set each point's raw input,
    /// give a point a fresh block, run a scan, read a block. Before writing it, the program
    /// and its blocks are checked to have the names and types the verifier reads.
    /// </summary>
    private static string HarnessCode(StTranslation translation, ImmutableArray<StPointNames> points)
    {
        var where = translation.FirstLocation!.Value;
        if (!translation.Pous.TryGetValue(StNames.Program, out var program) || program.Kind != StPouKind.Program)
            throw new StReadException(where, $"no PROGRAM {StNames.Program}: verify runs the plant program plant.st declares (give plant.st and library.st)");
        var at = program.Syntax!.Location;

        // One small method per point and purpose, reached through arrays of delegates: a
        // switch over a thousand points would be one method too large for the JIT to optimise.
        var methods = new StringBuilder();
        var owner = new Dictionary<string, int>(StringComparer.OrdinalIgnoreCase);
        for (var i = 0; i < points.Length; i++)
        {
            var point = points[i];
            var tag = point.Point.Tag;
            if (!program.VariableIndex.TryGetValue(point.RawInput, out var raw))
                throw new StReadException(at, $"PROGRAM {program.Name} has no input '{point.RawInput}' for point {tag}");
            if (!raw.Type.IsInteger || raw.Kind == StVarKind.Constant)
                throw new StReadException(raw.Location ?? at, $"'{raw.Name}' (point {tag}) must be an integer variable the card writes, not {raw.Type.Display}");
            if (!program.VariableIndex.TryGetValue(point.Instance, out var instance))
                throw new StReadException(at, $"PROGRAM {program.Name} has no instance '{point.Instance}' for point {tag}");
            if (instance.Type.Kind != StKind.Block)
                throw new StReadException(instance.Location ?? at, $"'{instance.Name}' (point {tag}) must be a function block instance, not {instance.Type.Display}");
            var block = instance.Type.Pou!;
            StVariable Output(string name, Func<StType, bool> ok, string expected)
            {
                if (!block.VariableIndex.TryGetValue(name, out var output) || output.Kind != StVarKind.Output || !ok(output.Type))
                    throw new StReadException(block.Syntax?.Location ?? instance.Location ?? at,
                        $"{block.Name} (the block of point {tag}) needs a VAR_OUTPUT {name} : {expected}");
                return output;
            }
            var value = Output(StNames.ValueOutput, t => t.IsReal, "REAL");
            var status = Output(StNames.StatusOutput, t => t.Kind == StKind.Enum, StNames.StatusType);
            var fault = Output(StNames.FaultOutput, t => t.Kind == StKind.Bool, "BOOL");
            var alarms = StNames.AlarmKinds.Select(k => Output(StNames.AlarmOutput(k), t => t.Kind == StKind.Bool, "BOOL")).ToList();

            owner[raw.Name] = i;
            owner[instance.Name] = i;
            if (program.VariableIndex.TryGetValue(point.Parameters, out var parameters)) owner[parameters.Name] = i;

            var n = i.ToString(CultureInfo.InvariantCulture);
            methods.Append("        private void Set_").Append(n).Append("(long raw) => p.").Append(raw.CsName).Append(" = (").Append(raw.Type.CsName)
                .Append(")StRt.Fit(raw, ").Append(raw.Type.Min).Append("L, ").Append(raw.Type.Max).Append("L, -1, \"")
                .Append(raw.Type.Name).Append(" (").Append(raw.Name).Append(")\");\n");
            methods.Append("        private void Reset_").Append(n).Append("() => p.").Append(instance.CsName).Append(".__Init();\n");
            methods.Append("        private void Read_").Append(n).Append("(ref StPointOutputs o) { var b = p.").Append(instance.CsName).Append("; ")
                .Append("o.Value = b.").Append(value.CsName).Append("; o.Status = (int)b.").Append(status.CsName)
                .Append("; o.Fault = b.").Append(fault.CsName);
            foreach (var (kind, alarm) in StNames.AlarmKinds.Zip(alarms))
                methods.Append("; o.Alarm").Append(kind).Append(" = b.").Append(alarm.CsName);
            methods.Append("; }\n");
        }

        // Does the program split by point? Each top-level statement must touch the
        // variables of one point only; a statement of no point's (or of two) means no.
        var statementsOf = points.Select(_ => new List<int>()).ToArray();
        var perPoint = true;
        for (var k = 0; k < program.StatementVariables.Count && perPoint; k++)
        {
            var owners = program.StatementVariables[k].Select(v => owner.TryGetValue(v, out var o) ? o : -1).Distinct().ToList();
            if (owners.Count == 0) continue;
            if (owners.Count > 1 || owners[0] < 0) perPoint = false;
            else statementsOf[owners[0]].Add(k);
        }
        for (var i = 0; i < points.Length; i++)
        {
            methods.Append("        private void Scan_").Append(i.ToString(CultureInfo.InvariantCulture)).Append("() {");
            foreach (var k in perPoint ? statementsOf[i] : []) methods.Append(" p.S_").Append(k.ToString(CultureInfo.InvariantCulture)).Append("();");
            methods.Append(" }\n");
        }

        string Table(string type, string name) =>
            $"new {type}[] {{ {string.Join(", ", Enumerable.Range(0, points.Length).Select(i => name + "_" + i.ToString(CultureInfo.InvariantCulture)))} }}";

        return $$"""
            using System;
            using ScaleGen.Verify.Runtime;

            namespace {{StTranslator.Namespace}}
            {
                public delegate void ReadOutputs(ref StPointOutputs outputs);

                public sealed class {{HarnessClass}} : IStPlantHarness
                {
                    private readonly {{program.CsName}} p;
                    private readonly Action<long>[] _set;
                    private readonly Action[] _reset;
                    private readonly Action[] _scan;
                    private readonly ReadOutputs[] _read;

                    public {{HarnessClass}}(StClock clock)
                    {
                        p = new {{program.CsName}}(clock);
                        _set = {{Table("Action<long>", "Set")}};
                        _reset = {{Table("Action", "Reset")}};
                        _scan = {{Table("Action", "Scan")}};
                        _read = {{Table("ReadOutputs", "Read")}};
                    }

                    public bool PerPoint => {{(perPoint ? "true" : "false")}};

                    public void Scan() => p.Body();

                    public void SetRaw(int point, long raw) => _set[point](raw);

                    public void ResetPoint(int point) => _reset[point]();

                    public void ScanPoint(int point)
                    {
                        if (!PerPoint) throw new InvalidOperationException("the program does not split by point");
                        _scan[point]();
                    }

                    public void Read(int point, ref StPointOutputs o) => _read[point](ref o);

            {{methods}}    }
            }
            """;
    }

    /// <summary>One point's cases, its reference, its tolerance and its tally.</summary>
    private sealed class PointChecker
    {
        private readonly Point _point;
        private readonly double _cycleSeconds;
        private IReadOnlyList<SweepCase>? _sweep;
        private int _caseCount;
        private readonly PointSimulator _reference;
        private readonly ValueTolerance _tolerance;
        private readonly PointStatus?[] _statusByOrdinal;
        private readonly AlarmEdgeTracker?[] _edges;
        private readonly int[] _alarmIndex;
        private readonly double _span;

        private int _case;
        private int _scan;
        private long _scans;
        private long _mismatches;
        private long _edgeScans;
        private double _maxError;
        private double _maxTolerance;
        private VerifyFailure? _first;

        public PointChecker(int index, StPointNames names, double cycleSeconds, PointStatus?[] statusByOrdinal)
        {
            Index = index;
            _point = names.Point;
            _cycleSeconds = cycleSeconds;
            _reference = new PointSimulator(_point, cycleSeconds);
            _tolerance = new ValueTolerance(_point, cycleSeconds);
            _statusByOrdinal = statusByOrdinal;
            _span = Math.Abs(_point.Span);
            // Unfiltered points decide their alarms on raw counts, exactly: no edge allowance.
            var filtered = _point.FilterSeconds > 0;
            _alarmIndex = StNames.AlarmKinds.Select(k => IndexOfKind(_point, k)).ToArray();
            _edges = _alarmIndex.Select(i => filtered && i >= 0 ? new AlarmEdgeTracker(_point.Alarms[i], cycleSeconds) : null).ToArray();
        }

        public int Index { get; }

        /// <summary>The sweep, made when first needed and dropped by <see cref="Release"/>, so a large plant holds one point's at a time.</summary>
        private IReadOnlyList<SweepCase> _cases
        {
            get
            {
                if (_sweep is null)
                {
                    _sweep = VerifySweep.For(_point, _cycleSeconds);
                    _caseCount = _sweep.Count;
                }
                return _sweep;
            }
        }

        public void Release()
        {
            _caseCount = _cases.Count;
            _sweep = [];
            _case = 0;
        }

        public bool Done => _case >= _cases.Count;


        public bool AtCaseStart => _scan == 0;

        public long CurrentRaw => _cases[_case].Raws[_scan];

        /// <summary>The program input could not take the raw count: a failure of this point, which stops its run.</summary>
        public void InputRejected(string message)
        {
            _mismatches++;
            Record("Raw", "the card's raw count set on the program input", message);
            _case = _cases.Count;
        }

        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public void Compare(in StPointOutputs got)
        {
            var raw = CurrentRaw;
            if (_scan == 0)
            {
                _reference.Reset();
                _tolerance.Reset();
                foreach (var edge in _edges) edge?.Reset();
            }
            var lastGood = _reference.LastGoodValue;
            var expected = _reference.Step(raw);
            var faulted = expected.IsFault;
            var reading = faulted ? FaultActions.Substitute(_point, lastGood) : SignalPath.RawToValue(_point, raw);
            var tolerance = _tolerance.Step(raw, faulted, reading, expected.Value);
            _scans++;
            _maxTolerance = Math.Max(_maxTolerance, tolerance);

            string? what = null, want = null, have = null;
            void Differ(string output, string expectedText, string gotText)
            {
                if (what is not null) return;
                (what, want, have) = (output, expectedText, gotText);
            }

            var status = got.Status >= 0 && got.Status < _statusByOrdinal.Length ? _statusByOrdinal[got.Status] : null;
            if (status != expected.Status)
                Differ(StNames.StatusOutput, StNames.StatusValue(expected.Status), status is { } s ? StNames.StatusValue(s) : $"ordinal {got.Status}");

            var error = Math.Abs(got.Value - expected.Value);
            if (double.IsFinite(error)) _maxError = Math.Max(_maxError, error / _span * 100);
            if (!(error <= tolerance))
                Differ(StNames.ValueOutput, Number(expected.Value) + $" (tolerance {Number(tolerance)})", Number(got.Value));

            if (got.Fault != faulted) Differ(StNames.FaultOutput, Bool(faulted), Bool(got.Fault));

            var edgeScan = false;
            for (var k = 0; k < StNames.AlarmKinds.Length; k++)
            {
                var kind = StNames.AlarmKinds[k];
                var observed = kind switch
                {
                    AlarmKind.HH => got.AlarmHH,
                    AlarmKind.H => got.AlarmH,
                    AlarmKind.L => got.AlarmL,
                    _ => got.AlarmLL,
                };
                var i = _alarmIndex[k];
                var wanted = i >= 0 && expected.Alarms[i].Active;
                var verdict = _edges[k] is { } tracker
                    ? tracker.Step(expected.Value, tolerance, faulted, wanted, observed, _reference.Alarms[i])
                    : observed == wanted ? AlarmVerdict.Agrees : AlarmVerdict.Mismatch;
                if (verdict == AlarmVerdict.Edge) edgeScan = true;
                if (verdict == AlarmVerdict.Mismatch)
                    Differ(StNames.AlarmOutput(kind), Bool(wanted) + (i < 0 ? " (the point has no such alarm)" : ""), Bool(observed));
            }

            if (what is not null)
            {
                _mismatches++;
                Record(what, want!, have!);
            }
            else if (edgeScan) _edgeScans++;

            if (++_scan >= _cases[_case].Raws.Length)
            {
                _scan = 0;
                _case++;
            }
        }

        private void Record(string what, string expected, string got)
        {
            var current = _cases[Math.Min(_case, _cases.Count - 1)];
            _first ??= new VerifyFailure(_case + 1, current.Name, _scan + 1, current.Raws[_scan], what, expected, got);
        }

        public PointVerdict Verdict() => new(
            _point.Tag,
            _caseCount,
            _scans,
            _maxError,
            _maxTolerance / _span * 100,
            _maxTolerance,
            _edgeScans,
            _mismatches,
            _first);

        private static int IndexOfKind(Point point, AlarmKind kind)
        {
            for (var i = 0; i < point.Alarms.Length; i++)
                if (point.Alarms[i].Kind == kind) return i;
            return -1;
        }

        private static string Number(double value) => value.ToString("R", CultureInfo.InvariantCulture);

        private static string Bool(bool value) => value ? "TRUE" : "FALSE";
    }
}
