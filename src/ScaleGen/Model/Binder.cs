using System.Collections.Immutable;
using ScaleGen.Syntax;
using ScaleGen.Text;

namespace ScaleGen.Model;

/// <summary>
/// Turns the syntax trees of every file on the command line into one <see cref="Plant"/>:
/// resolves cards and profiles across files, applies profiles and defaults, converts
/// units, and reports what the language calls an error. Checks that need the scaling math
/// (loop budgets, count resolution) run afterwards, in the engine's analysis.
/// </summary>
public sealed class Binder
{
    private readonly DiagnosticBag _diagnostics;
    private readonly Dictionary<string, (CardSyntax Syntax, SourceText Source)> _cardSyntax = new(StringComparer.Ordinal);
    private readonly Dictionary<string, (ProfileSyntax Syntax, SourceText Source)> _profileSyntax = new(StringComparer.Ordinal);
    private readonly List<(PointSyntax Syntax, SourceText Source)> _pointSyntax = new();
    private readonly Dictionary<string, Card?> _cards = new(StringComparer.Ordinal);
    private readonly Dictionary<string, Settings?> _profiles = new(StringComparer.Ordinal);
    private readonly HashSet<string> _profilesInProgress = new(StringComparer.Ordinal);
    private readonly HashSet<string> _usedCards = new(StringComparer.Ordinal);
    private readonly HashSet<string> _usedProfiles = new(StringComparer.Ordinal);

    private Binder(DiagnosticBag diagnostics) => _diagnostics = diagnostics;

    public static Plant Bind(IReadOnlyList<CompilationUnitSyntax> units, DiagnosticBag diagnostics) =>
        new Binder(diagnostics).BindPlant(units);

    private Plant BindPlant(IReadOnlyList<CompilationUnitSyntax> units)
    {
        string? title = null;
        double? cycle = null;
        SourceLocation? titleAt = null, cycleAt = null;

        foreach (var unit in units)
        foreach (var statement in unit.Statements)
        {
            var source = unit.Source;
            switch (statement)
            {
                case PlantTitleSyntax plant:
                    if (titleAt is { } firstTitle)
                        Report(DiagnosticCatalog.DuplicateTopLevel, source, plant.Keyword.Span,
                            $"'plant' is given again; the first is at {firstTitle}: keep one");
                    else
                    {
                        title = plant.Title.Value;
                        titleAt = new SourceLocation(source, plant.Span);
                        CheckEscapes(plant.Title, source);
                    }
                    break;
                case CycleSyntax cycleSyntax:
                    if (cycleAt is { } firstCycle)
                        Report(DiagnosticCatalog.DuplicateTopLevel, source, cycleSyntax.Keyword.Span,
                            $"'cycle' is given again; the first is at {firstCycle}: keep one");
                    else
                    {
                        cycleAt = new SourceLocation(source, cycleSyntax.Span);
                        var seconds = Convert(cycleSyntax.Time, Dimension.Time, source, "cycle");
                        if (seconds is { } s && s <= 0)
                            Report(DiagnosticCatalog.NotPositive, source, cycleSyntax.Time.Span, "the task cycle must be longer than 0: write e.g. 'cycle 100 ms'");
                        else cycle = seconds;
                    }
                    break;
                case CardSyntax card:
                    if (DeclareOnce(card.Name, source, _cardSyntax.ContainsKey(card.Name.Text) ? Where(_cardSyntax[card.Name.Text]) : null, "card"))
                        _cardSyntax[card.Name.Text] = (card, source);
                    break;
                case ProfileSyntax profile:
                    if (DeclareOnce(profile.Name, source, _profileSyntax.ContainsKey(profile.Name.Text) ? Where(_profileSyntax[profile.Name.Text]) : null, "profile"))
                        _profileSyntax[profile.Name.Text] = (profile, source);
                    break;
                case PointSyntax point:
                    _pointSyntax.Add((point, source));
                    break;
            }
        }

        var cycleSeconds = cycle ?? Plant.DefaultCycleSeconds;
        var points = BindPoints(cycleSeconds);
        var cards = _cardSyntax.Keys.Select(BindCard).Where(c => c is not null).Select(c => c!)
            .OrderBy(c => c.Name, StringComparer.Ordinal).ToImmutableArray();

        // Profiles nobody uses are bound too, so their own mistakes are reported.
        foreach (var name in _profileSyntax.Keys) ResolveProfile(name);
        ReportUnused();
        // Points with errors are left out of the plant, but they are points: no warning for them,
        // nor when a top-level statement could not be read (it may be the point).
        if (_pointSyntax.Count == 0 && units.Any(u => u.Statements.Length > 0)
            && !units.Any(u => u.Statements.Any(s => s is ErrorStatementSyntax)))
            Report(DiagnosticCatalog.NoPoints, units[0].Source, new TextSpan(0, 0), "the plant has no points: add a 'point' declaration");

        return new Plant(title, cycleSeconds, cards, points, units.Select(u => u.Source).ToImmutableArray());
    }

    private static SourceLocation Where<T>((T Syntax, SourceText Source) declaration) where T : DeclarationSyntax =>
        new(declaration.Source, declaration.Syntax.Name.Span);

    private bool DeclareOnce(WordSyntax name, SourceText source, SourceLocation? existing, string kind)
    {
        if (existing is null) return true;
        Report(DiagnosticCatalog.DuplicateName, source, name.Span,
            $"{kind} '{name.Text}' is already declared at {existing}: rename one of them");
        return false;
    }

    // ---- Cards ------------------------------------------------------------------------

    private Card? BindCard(string name)
    {
        if (_cards.TryGetValue(name, out var bound)) return bound;
        var (syntax, source) = _cardSyntax[name];
        var settings = CollectUnique(syntax.Block.Statements, source);
        Card? card = null;

        var type = RawType.INT;
        if (settings.TryGetValue("type", out var typeSetting) && typeSetting.Statement is RawTypeSyntax typeSyntax)
            type = Choice(typeSyntax.Type, source, "a raw type", RawTypeWords) switch
            {
                "DINT" => RawType.DINT,
                "UINT" => RawType.UINT,
                _ => RawType.INT,
            };
        var (typeMin, typeMax) = Card.RangeOf(type);

        if (!settings.TryGetValue("counts", out var countsSetting) || countsSetting.Statement is not CountsSyntax counts)
        {
            if (!HasBrokenStatements(syntax.Block))
                Report(DiagnosticCatalog.MissingCounts, source, syntax.Name.Span,
                    $"card '{name}' has no 'counts': add e.g. 'counts 0 .. 27648 at 4 .. 20 mA'");
            _cards[name] = null;
            return null;
        }

        var ok = true;
        if (counts.Raw.Unit is not null)
        {
            Report(DiagnosticCatalog.WrongUnit, source, counts.Raw.Unit.Span, "raw counts have no unit: remove it");
            ok = false;
        }
        if (counts.Raw.Low.Value == counts.Raw.High.Value)
        {
            Report(DiagnosticCatalog.EqualCounts, source, counts.Raw.Span, "the two raw values of 'counts' are equal: give the raw values at both electrical ends");
            ok = false;
        }
        foreach (var raw in new[] { counts.Raw.Low, counts.Raw.High })
            if (raw.Value < typeMin || raw.Value > typeMax)
            {
                Report(DiagnosticCatalog.BadLimits, source, raw.Span,
                    $"raw value {raw.Text} does not fit the card's type {type} ({typeMin} .. {typeMax}): change 'type' or the counts");
                ok = false;
            }

        var electricalUnit = ElectricalUnit.MilliAmp;
        double elecLow = 0, elecHigh = 0;
        var electrical = counts.Electrical;
        if (electrical.Unit is null || !Units.TryGet(electrical.Unit.Text, out var dimension, out var factor)
            || dimension is not (Dimension.Current or Dimension.Voltage))
        {
            Report(DiagnosticCatalog.WrongUnit, source, electrical.Unit?.Span ?? electrical.Span,
                "the card's electrical values need a current or voltage unit: write e.g. '4 .. 20 mA' or '0 .. 10 V'");
            ok = false;
        }
        else
        {
            electricalUnit = dimension == Dimension.Current ? ElectricalUnit.MilliAmp : ElectricalUnit.Volt;
            elecLow = electrical.Low.Value * factor;
            elecHigh = electrical.High.Value * factor;
            if (elecLow == elecHigh)
            {
                Report(DiagnosticCatalog.EqualCounts, source, electrical.Span, "the two electrical values of 'counts' are equal: give the current or voltage at both raw ends");
                ok = false;
            }
        }

        long limitLow = typeMin, limitHigh = typeMax;
        if (settings.TryGetValue("limits", out var limitsSetting) && limitsSetting.Statement is LimitsSyntax limits)
        {
            if (limits.Raw.Unit is not null)
            {
                Report(DiagnosticCatalog.WrongUnit, source, limits.Raw.Unit.Span, "raw limits have no unit: remove it");
                ok = false;
            }
            var low = limits.Raw.Low.Value;
            var high = limits.Raw.High.Value;
            if (!IsWhole(low) || !IsWhole(high) || low > high || low < typeMin || high > typeMax)
            {
                Report(DiagnosticCatalog.BadLimits, source, limits.Raw.Span,
                    $"'limits' must be whole numbers, low before high, inside the type {type} ({typeMin} .. {typeMax})");
                ok = false;
            }
            else
            {
                limitLow = (long)low;
                limitHigh = (long)high;
            }
        }

        var faultCodes = ImmutableArray<long>.Empty;
        if (settings.TryGetValue("fault-code", out var faultSetting) && faultSetting.Statement is FaultCodeSyntax fault)
        {
            var builder = ImmutableArray.CreateBuilder<long>();
            foreach (var code in fault.Codes)
            {
                if (!IsWhole(code.Value) || code.Value < typeMin || code.Value > typeMax)
                {
                    Report(DiagnosticCatalog.BadLimits, source, code.Span,
                        $"fault code {code.Text} must be a whole number inside the type {type} ({typeMin} .. {typeMax})");
                    ok = false;
                }
                else if (!builder.Contains((long)code.Value)) builder.Add((long)code.Value);
            }
            faultCodes = builder.ToImmutable();
        }

        var inputOhms = electricalUnit == ElectricalUnit.MilliAmp ? 250.0 : 0.0;
        if (settings.TryGetValue("input", out var inputSetting) && inputSetting.Statement is QuantitySettingSyntax input)
        {
            var ohms = Convert(input.Quantity, Dimension.Resistance, source, "input");
            if (ohms is { } value && value < 0)
                Report(DiagnosticCatalog.NotPositive, source, input.Quantity.Span, "the input resistance cannot be negative");
            else if (ohms is { } value2) inputOhms = value2;
        }

        if (ok)
            card = new Card(name, counts.Raw.Low.Value, counts.Raw.High.Value, elecLow, elecHigh, electricalUnit,
                limitLow, limitHigh, faultCodes, type, inputOhms, new SourceLocation(source, syntax.Name.Span));
        _cards[name] = card;
        return card;
    }

    private static bool IsWhole(double value) => Math.Floor(value) == value;

    /// <summary>True when the parser already reported a statement of this block.</summary>
    private static bool HasBrokenStatements(BlockSyntax block)
    {
        foreach (var statement in block.Statements)
            if (statement is ErrorStatementSyntax) return true;
        return false;
    }

    // ---- Profiles and settings ---------------------------------------------------------

    /// <summary>A statement with the file it was written in (a profile may be in another file).</summary>
    private sealed record Setting(StatementSyntax Statement, SourceText Source);

    /// <summary>The settings a point ends up with after its profiles: later ones override earlier ones.</summary>
    private sealed class Settings
    {
        public Dictionary<string, Setting> Single { get; }
        public Dictionary<string, (AlarmSyntax Alarm, SourceText Source)> Alarms { get; }
        public Dictionary<string, Setting> Loop { get; }
        public Setting? LoopBlock { get; set; }

        /// <summary>
        /// A statement of this point or of a profile it uses was already reported, or a profile
        /// could not be found: a setting that seems missing may be in what could not be read,
        /// so "missing" is not reported on top.
        /// </summary>
        public bool Incomplete { get; set; }

        /// <summary>Like <see cref="Incomplete"/>, for the loop block.</summary>
        public bool LoopIncomplete { get; set; }

        public Settings()
        {
            Single = new(StringComparer.Ordinal);
            Alarms = new(StringComparer.Ordinal);
            Loop = new(StringComparer.Ordinal);
        }

        private Settings(Settings other)
        {
            // The copy constructors keep the order of entries and copy the tables whole.
            Single = new(other.Single, StringComparer.Ordinal);
            Alarms = new(other.Alarms, StringComparer.Ordinal);
            Loop = new(other.Loop, StringComparer.Ordinal);
            LoopBlock = other.LoopBlock;
            Incomplete = other.Incomplete;
            LoopIncomplete = other.LoopIncomplete;
        }

        public Settings Copy() => new(this);
    }

    private Dictionary<string, Setting> CollectUnique(ImmutableArray<StatementSyntax> statements, SourceText source)
    {
        var result = new Dictionary<string, Setting>(StringComparer.Ordinal);
        foreach (var statement in statements)
        {
            // Reported by the parser already; it sets nothing.
            if (statement is AlarmSyntax or ErrorStatementSyntax) continue;
            if (result.TryGetValue(statement.Keyword.Text, out var first))
                Report(DiagnosticCatalog.DuplicateSetting, source, statement.Keyword.Span,
                    $"'{statement.Keyword.Text}' is already set in this block at line {first.Source.GetLineColumn(first.Statement.Span.Start).Line}: keep one");
            else result[statement.Keyword.Text] = new Setting(statement, source);
        }
        return result;
    }

    /// <summary>Applies one block's statements over inherited settings.</summary>
    private Settings Apply(Settings inherited, BlockSyntax block, SourceText source)
    {
        var settings = inherited.Copy();
        if (HasBrokenStatements(block)) settings.Incomplete = true;
        foreach (var (keyword, setting) in CollectUnique(block.Statements, source))
        {
            if (setting.Statement is LoopSyntax loop)
            {
                settings.LoopBlock = setting;
                settings.LoopIncomplete |= HasBrokenStatements(loop.Block);
                foreach (var (loopKeyword, loopSetting) in CollectUnique(loop.Block.Statements, source))
                    settings.Loop[loopKeyword] = loopSetting;
            }
            else settings.Single[keyword] = setting;
        }

        var seen = new Dictionary<string, AlarmSyntax>(StringComparer.Ordinal);
        foreach (var statement in block.Statements)
        {
            if (statement is not AlarmSyntax alarm) continue;
            var kind = alarm.Kind.Text;
            if (seen.TryGetValue(kind, out var first))
            {
                Report(DiagnosticCatalog.DuplicateAlarm, source, alarm.Kind.Span,
                    $"alarm {kind} is already set at line {source.GetLineColumn(first.Span.Start).Line}: a point has one alarm of each kind; keep one");
                continue;
            }
            seen[kind] = alarm;
            settings.Alarms[kind] = (alarm, source);
        }
        return settings;
    }

    private Settings? ResolveProfile(string name)
    {
        if (_profiles.TryGetValue(name, out var resolved)) return resolved;
        var (syntax, source) = _profileSyntax[name];
        if (!_profilesInProgress.Add(name))
        {
            Report(DiagnosticCatalog.ProfileCycle, source, syntax.Name.Span,
                $"profile '{name}' uses itself through its 'uses' chain: break the cycle");
            return null;
        }

        var inherited = new Settings();
        if (syntax.Uses is { } uses)
            inherited = LookupProfile(uses, source) ?? new Settings { Incomplete = true };
        var settings = Apply(inherited, syntax.Block, source);
        _profilesInProgress.Remove(name);
        _profiles[name] = settings;
        return settings;
    }

    private Settings? LookupProfile(WordSyntax uses, SourceText source)
    {
        if (!_profileSyntax.ContainsKey(uses.Text))
        {
            var suggestion = SyntaxParser.Suggest(uses.Text, _profileSyntax.Keys);
            Report(DiagnosticCatalog.UnknownProfile, source, uses.Span,
                suggestion is null ? $"no profile '{uses.Text}' is declared: declare it, or give its file on the command line"
                                   : $"no profile '{uses.Text}' is declared: did you mean '{suggestion}'?");
            return null;
        }
        _usedProfiles.Add(uses.Text);
        if (_profilesInProgress.Contains(uses.Text))
        {
            Report(DiagnosticCatalog.ProfileCycle, source, uses.Span,
                $"'uses {uses.Text}' closes a cycle of profiles: a profile may not use itself, directly or through others");
            return null;
        }
        return ResolveProfile(uses.Text);
    }

    // ---- Points -----------------------------------------------------------------------

    private ImmutableArray<Point> BindPoints(double cycleSeconds)
    {
        var points = ImmutableArray.CreateBuilder<Point>(_pointSyntax.Count);
        var byTag = new Dictionary<string, SourceLocation>(StringComparer.Ordinal);
        var byIdentifier = new Dictionary<string, (string Tag, SourceLocation Location)>(StringComparer.OrdinalIgnoreCase);

        foreach (var (syntax, source) in _pointSyntax)
        {
            var tag = syntax.Name.Text;
            var location = new SourceLocation(source, syntax.Name.Span);
            if (byTag.TryGetValue(tag, out var first))
            {
                Report(DiagnosticCatalog.DuplicateName, source, syntax.Name.Span,
                    $"point '{tag}' is already declared at {first}: each tag once");
                continue;
            }
            byTag[tag] = location;

            var identifier = IecNames.ToIdentifier(tag);
            var nameOk = true;
            if (!IecNames.IsWellFormed(identifier))
            {
                Report(DiagnosticCatalog.InvalidName, source, syntax.Name.Span,
                    $"tag '{tag}' becomes '{identifier}', which IEC 61131-3 does not allow (no '__', no trailing '_'): rename the tag");
                nameOk = false;
            }
            else if (IecNames.IsReserved(identifier))
            {
                Report(DiagnosticCatalog.ReservedTag, source, syntax.Name.Span,
                    $"tag '{tag}' is the IEC 61131-3 keyword or standard name '{identifier.ToUpperInvariant()}': rename the point");
                nameOk = false;
            }
            else if (byIdentifier.TryGetValue(identifier, out var other))
            {
                Report(DiagnosticCatalog.TagCollision, source, syntax.Name.Span,
                    $"tags '{tag}' and '{other.Tag}' (at {other.Location}) both become the identifier '{identifier}': rename one");
                nameOk = false;
            }
            else byIdentifier[identifier] = (tag, location);

            var inherited = new Settings();
            if (syntax.Uses is { } uses)
                inherited = LookupProfile(uses, source) ?? new Settings { Incomplete = true };
            var settings = Apply(inherited, syntax.Block, source);
            var point = BindPoint(syntax, source, identifier, settings, cycleSeconds);
            if (point is not null && nameOk) points.Add(point);
        }
        return points.ToImmutable();
    }

    private Point? BindPoint(PointSyntax syntax, SourceText source, string identifier, Settings settings, double cycleSeconds)
    {
        var tag = syntax.Name.Text;
        var ok = true;
        var s = settings.Single;

        // Card
        Card? card = null;
        var address = "";
        if (!s.TryGetValue("card", out var cardSetting) || cardSetting.Statement is not CardReferenceSyntax cardRef)
        {
            if (!settings.Incomplete)
                Report(DiagnosticCatalog.MissingCard, source, syntax.Name.Span,
                    $"point '{tag}' has no 'card': add e.g. 'card AI16 at \"R1.S2.C0\"' (or set it in its profile)");
            ok = false;
        }
        else
        {
            address = cardRef.Address?.Value ?? "";
            if (cardRef.Address is not null) CheckEscapes(cardRef.Address, cardSetting.Source);
            if (!_cardSyntax.ContainsKey(cardRef.Card.Text))
            {
                var suggestion = SyntaxParser.Suggest(cardRef.Card.Text, _cardSyntax.Keys);
                Report(DiagnosticCatalog.UnknownCard, cardSetting.Source, cardRef.Card.Span,
                    suggestion is null ? $"no card '{cardRef.Card.Text}' is declared: declare it, or give its file on the command line"
                                       : $"no card '{cardRef.Card.Text}' is declared: did you mean '{suggestion}'?");
                ok = false;
            }
            else
            {
                _usedCards.Add(cardRef.Card.Text);
                card = BindCard(cardRef.Card.Text);
                if (card is null) ok = false;
            }
        }

        // Signal
        double signalLow = 4, signalHigh = 20;
        if (s.TryGetValue("signal", out var signalSetting) && signalSetting.Statement is RangeSettingSyntax signal)
        {
            var range = ConvertRange(signal.Range, Dimension.Current, signalSetting.Source, "signal");
            if (range is { } r)
            {
                (signalLow, signalHigh) = r;
                if (signalLow >= signalHigh || signalLow < 0)
                {
                    Report(DiagnosticCatalog.BadSignal, signalSetting.Source, signal.Range.Span,
                        "the signal span must rise from a low current to a higher one, e.g. 'signal 4 .. 20 mA' (a reverse-acting point swaps 'range' instead)");
                    ok = false;
                }
            }
            else ok = false;
        }

        // Shunt
        double? shunt = null;
        if (s.TryGetValue("shunt", out var shuntSetting) && shuntSetting.Statement is QuantitySettingSyntax shuntSyntax)
        {
            shunt = Convert(shuntSyntax.Quantity, Dimension.Resistance, shuntSetting.Source, "shunt");
            if (shunt is null) ok = false;
            else if (shunt <= 0)
            {
                Report(DiagnosticCatalog.NotPositive, shuntSetting.Source, shuntSyntax.Quantity.Span, "a shunt must be larger than 0 ohm, e.g. 'shunt 250 ohm'");
                ok = false;
            }
            else if (card is { IsVoltage: false })
            {
                Report(DiagnosticCatalog.ShuntMismatch, shuntSetting.Source, shuntSyntax.Keyword.Span,
                    $"card '{card.Name}' reads current; 'shunt' is only for a voltage card: remove it");
                ok = false;
            }
        }
        else if (card is { IsVoltage: true })
        {
            Report(DiagnosticCatalog.ShuntMismatch, source, syntax.Name.Span,
                $"card '{card.Name}' reads volts: add the resistor that turns the loop current into volts, e.g. 'shunt 250 ohm'");
            ok = false;
        }

        // Range
        double lrv = 0, urv = 0;
        var unit = "";
        SourceLocation? rangeAt = null;
        if (!s.TryGetValue("range", out var rangeSetting) || rangeSetting.Statement is not RangeSettingSyntax rangeSyntax)
        {
            if (!settings.Incomplete)
                Report(DiagnosticCatalog.MissingRange, source, syntax.Name.Span,
                    $"point '{tag}' has no 'range': add the engineering values at signal low and high, e.g. 'range 0 .. 450 m3/h'");
            ok = false;
        }
        else
        {
            lrv = rangeSyntax.Range.Low.Value;
            urv = rangeSyntax.Range.High.Value;
            unit = rangeSyntax.Range.Unit?.Text ?? "";
            rangeAt = new SourceLocation(rangeSetting.Source, rangeSyntax.Range.Span);
            if (lrv == urv)
            {
                Report(DiagnosticCatalog.EmptyRange, rangeSetting.Source, rangeSyntax.Range.Span,
                    $"LRV and URV are both {rangeSyntax.Range.Low.Text}: give two different values (LRV > URV makes a reverse-acting point)");
                ok = false;
            }
        }
        var span = urv - lrv;
        var absSpan = Math.Abs(span);

        // Square root
        var squareRoot = false;
        var cutoff = 0.0;
        if (s.TryGetValue("sqrt", out var sqrtSetting) && sqrtSetting.Statement is SqrtSyntax sqrt)
        {
            squareRoot = true;
            if (sqrt.Cutoff is null)
                Report(DiagnosticCatalog.SqrtWithoutCutoff, sqrtSetting.Source, sqrt.Keyword.Span,
                    "square-root extraction with no low-flow cutoff amplifies noise near zero flow: add e.g. 'sqrt cutoff 1 %'");
            else
            {
                var percent = ConvertPercent(sqrt.Cutoff, sqrtSetting.Source, "cutoff");
                if (percent is { } p && (p < 0 || p >= 100))
                {
                    Report(DiagnosticCatalog.NotPositive, sqrtSetting.Source, sqrt.Cutoff.Span, "the cutoff is a % of flow span between 0 and 100, e.g. 'sqrt cutoff 1 %'");
                    ok = false;
                }
                else if (percent is null) ok = false;
                else cutoff = percent.Value;
            }
        }

        // Health
        var health = Health.None;
        SourceLocation? healthAt = null;
        if (s.TryGetValue("health", out var healthSetting) && healthSetting.Statement is HealthSyntax healthSyntax)
        {
            healthAt = new SourceLocation(healthSetting.Source, healthSyntax.Span);
            switch (healthSyntax.Mode.Text)
            {
                case "ne43":
                    health = Health.Ne43;
                    if (signalLow <= Health.Ne43.FaultLowMa || signalHigh >= Health.Ne43.FaultHighMa)
                    {
                        Report(DiagnosticCatalog.Ne43WithoutLiveZero, healthSetting.Source, healthSyntax.Mode.Span,
                            $"NAMUR NE 43 bands need a live-zero signal inside 3.6 .. 21 mA, but the signal is {DiagnosticBag.Num(signalLow)} .. {DiagnosticBag.Num(signalHigh)} mA: use 'health none' or 'health below ... above ...'");
                        ok = false;
                    }
                    break;
                case "none":
                    health = Health.None;
                    break;
                case "below" or "above":
                    double? low = healthSyntax.Below is null ? null : Convert(healthSyntax.Below, Dimension.Current, healthSetting.Source, "health below");
                    double? high = healthSyntax.Above is null ? null : Convert(healthSyntax.Above, Dimension.Current, healthSetting.Source, "health above");
                    if ((healthSyntax.Below is not null && low is null) || (healthSyntax.Above is not null && high is null)) ok = false;
                    else if ((low is { } l && l >= signalLow) || (high is { } h && h <= signalHigh))
                    {
                        Report(DiagnosticCatalog.BadHealthBands, healthSetting.Source, healthSyntax.Span,
                            $"fault thresholds must lie outside the signal span {DiagnosticBag.Num(signalLow)} .. {DiagnosticBag.Num(signalHigh)} mA: 'below' under it, 'above' over it");
                        ok = false;
                    }
                    else health = new Health(HealthKind.Custom, low, high);
                    break;
                default:
                    Choice(healthSyntax.Mode, healthSetting.Source, "a health mode", HealthWords);
                    ok = false;
                    break;
            }
        }
        else if (signalLow > 0 && !settings.Incomplete)
            Report(DiagnosticCatalog.NoHealthOnLiveZero, source, syntax.Name.Span,
                $"point '{tag}' has a live-zero signal but no fault bands, so a broken wire reads as a low value: add 'health ne43'");

        // Fault action
        var onFault = FaultAction.Hold;
        if (s.TryGetValue("on-fault", out var faultSetting) && faultSetting.Statement is OnFaultSyntax faultSyntax)
        {
            switch (Choice(faultSyntax.Action, faultSetting.Source, "an on-fault action", FaultActionWords))
            {
                case "low": onFault = new FaultAction(FaultActionKind.Low); break;
                case "high": onFault = new FaultAction(FaultActionKind.High); break;
                case "value": onFault = new FaultAction(FaultActionKind.Value, faultSyntax.Value?.Value ?? 0); break;
                case "hold": break;
                default: ok = false; break;
            }
        }

        // Filter
        var filter = 0.0;
        if (s.TryGetValue("filter", out var filterSetting) && filterSetting.Statement is QuantitySettingSyntax filterSyntax)
        {
            var seconds = Convert(filterSyntax.Quantity, Dimension.Time, filterSetting.Source, "filter");
            if (seconds is null) ok = false;
            else if (seconds < 0)
            {
                Report(DiagnosticCatalog.NotPositive, filterSetting.Source, filterSyntax.Quantity.Span, "a filter time constant cannot be negative");
                ok = false;
            }
            else
            {
                filter = seconds.Value;
                if (filter > 0 && filter < cycleSeconds)
                    Report(DiagnosticCatalog.DelayBelowCycle, filterSetting.Source, filterSyntax.Quantity.Span,
                        $"a filter of {DiagnosticBag.Num(filter)} s is shorter than the task cycle of {DiagnosticBag.Num(cycleSeconds)} s and does almost nothing: lengthen it or remove it");
            }
        }

        // Measure
        var measure = MeasureKind.Other;
        if (s.TryGetValue("measure", out var measureSetting) && measureSetting.Statement is MeasureSyntax measureSyntax)
        {
            var word = Choice(measureSyntax.Kind, measureSetting.Source, "a measure kind", MeasureWords);
            if (word is null) ok = false;
            else measure = (MeasureKind)Array.IndexOf(MeasureWords, word);
        }

        // Tolerance
        var tolerance = 0.5;
        if (s.TryGetValue("tolerance", out var toleranceSetting) && toleranceSetting.Statement is QuantitySettingSyntax toleranceSyntax)
        {
            var percent = ConvertPercent(toleranceSyntax.Quantity, toleranceSetting.Source, "tolerance");
            if (percent is null) ok = false;
            else if (percent <= 0)
            {
                Report(DiagnosticCatalog.NotPositive, toleranceSetting.Source, toleranceSyntax.Quantity.Span, "a calibration tolerance must be larger than 0 %, e.g. 'tolerance 0.5 %'");
                ok = false;
            }
            else tolerance = percent.Value;
        }

        // Description
        var description = "";
        if (s.TryGetValue("desc", out var descSetting) && descSetting.Statement is DescriptionSyntax desc)
        {
            description = desc.Text.Value;
            CheckEscapes(desc.Text, descSetting.Source);
        }

        var alarms = BindAlarms(settings, unit, lrv, urv, absSpan, measure, cycleSeconds, rangeAt is not null && lrv != urv, ref ok);
        var loop = BindLoop(settings, ref ok);

        if (!ok || card is null) return null;
        return new Point(tag, identifier, description, card, address, signalLow, signalHigh, shunt, lrv, urv, unit,
            squareRoot, cutoff, health, onFault, filter, measure, tolerance, alarms, loop,
            new SourceLocation(source, syntax.Name.Span));
    }

    /// <summary>Usual starting deadbands, % of span (ISA-18.2 / ISA-TR18.2.3, EEMUA 191).</summary>
    public static double? UsualDeadbandPercent(MeasureKind measure) => measure switch
    {
        MeasureKind.Flow => 5,
        MeasureKind.Level => 5,
        MeasureKind.Pressure => 2,
        MeasureKind.Temperature => 1,
        _ => null,
    };

    private ImmutableArray<Alarm> BindAlarms(Settings settings, string unit, double lrv, double urv, double absSpan,
        MeasureKind measure, double cycleSeconds, bool haveRange, ref bool ok)
    {
        var alarms = ImmutableArray.CreateBuilder<Alarm>();
        var byKind = new Dictionary<AlarmKind, (Alarm Alarm, AlarmSyntax Syntax, SourceText Source)>();
        foreach (var (syntax, source) in AlarmsInKindOrder(settings))
        {
            var kindWord = Choice(syntax.Kind, source, "an alarm kind", AlarmKindWords);
            if (kindWord is null)
            {
                ok = false;
                continue;
            }
            var kind = (AlarmKind)Array.IndexOf(AlarmKindWords, kindWord);
            var setpoint = syntax.Setpoint.Value;
            double deadband = 0, onDelay = 0, offDelay = 0;
            var priority = 3;
            string? message = null;
            var seenOptions = 0; // one bit per option word: an alarm has at most five options

            foreach (var option in syntax.Options)
            {
                var bit = 1 << Array.IndexOf(AlarmOptionWords, option.Name.Text);
                if ((seenOptions & bit) != 0)
                {
                    Report(DiagnosticCatalog.DuplicateSetting, source, option.Name.Span, $"'{option.Name.Text}' is given twice on this alarm: keep one");
                    ok = false;
                    continue;
                }
                seenOptions |= bit;
                switch (option.Name.Text)
                {
                    case "priority":
                        var p = option.Quantity!;
                        if (p.Unit is not null || !IsWhole(p.Value) || p.Value < 1 || p.Value > 4)
                        {
                            Report(DiagnosticCatalog.PriorityOutOfRange, source, p.Span,
                                $"alarm priority '{source.ToString(p.Span)}' is not one of 1, 2, 3, 4 (1 is the most urgent)");
                            ok = false;
                        }
                        else priority = (int)p.Value;
                        break;
                    case "deadband":
                        var d = option.Quantity!;
                        if (d.Unit is { Text: "%" } && !d.Unit.Quoted)
                            deadband = d.Value / 100 * absSpan;
                        // Without a bound range the unit cannot be judged; the range's own error says enough.
                        else if (d.Unit is null || d.Unit.Text == unit || !haveRange)
                            deadband = d.Value;
                        else
                        {
                            Report(DiagnosticCatalog.WrongUnit, source, d.Unit.Span,
                                $"deadband unit '{d.Unit.Text}' is neither '%' (of span) nor the point's unit '{unit}': write e.g. 'deadband 2 %'");
                            ok = false;
                        }
                        if (deadband < 0)
                        {
                            Report(DiagnosticCatalog.NotPositive, source, d.Span, "a deadband cannot be negative");
                            ok = false;
                        }
                        else if (haveRange && UsualDeadbandPercent(measure) is { } usual && deadband < usual / 100 * absSpan * (1 - 1e-9))
                            Report(DiagnosticCatalog.DeadbandBelowUsual, source, d.Span,
                                $"a deadband of {DiagnosticBag.Num(deadband / absSpan * 100)} % of span is below the usual starting value of {DiagnosticBag.Num(usual)} % for {measure.ToString().ToLowerInvariant()} (ISA-18.2): widen it unless the process needs it");
                        break;
                    case "delay" or "clear":
                        var t = Convert(option.Quantity!, Dimension.Time, source, option.Name.Text);
                        if (t is null) ok = false;
                        else if (t < 0)
                        {
                            Report(DiagnosticCatalog.NotPositive, source, option.Quantity!.Span, $"a {option.Name.Text} time cannot be negative");
                            ok = false;
                        }
                        else
                        {
                            if (t > 0 && t < cycleSeconds)
                                Report(DiagnosticCatalog.DelayBelowCycle, source, option.Quantity!.Span,
                                    $"a {option.Name.Text} of {DiagnosticBag.Num(t.Value)} s is shorter than the task cycle of {DiagnosticBag.Num(cycleSeconds)} s: lengthen it or remove it");
                            if (option.Name.Text == "delay") onDelay = t.Value;
                            else offDelay = t.Value;
                        }
                        break;
                    case "text":
                        message = option.Text!.Value;
                        CheckEscapes(option.Text, source);
                        break;
                }
            }

            if (haveRange && (setpoint < Math.Min(lrv, urv) || setpoint > Math.Max(lrv, urv)))
                Report(DiagnosticCatalog.SetpointOutsideRange, source, syntax.Setpoint.Span,
                    $"alarm {kindWord} at {syntax.Setpoint.Text} lies outside the range {DiagnosticBag.Num(lrv)} .. {DiagnosticBag.Num(urv)} {unit}: it can only act while the signal is under or over range");

            var alarm = new Alarm(kind, setpoint, deadband, onDelay, offDelay, priority, message, new SourceLocation(source, syntax.Kind.Span));
            byKind[kind] = (alarm, syntax, source);
            alarms.Add(alarm);
        }

        if (byKind.TryGetValue(AlarmKind.HH, out var hh) && byKind.TryGetValue(AlarmKind.H, out var h) && hh.Alarm.Setpoint < h.Alarm.Setpoint)
        {
            Report(DiagnosticCatalog.MisorderedAlarms, hh.Source, hh.Syntax.Setpoint.Span,
                $"HH ({hh.Syntax.Setpoint.Text}) is below H ({h.Syntax.Setpoint.Text}): HH must be at or above H");
            ok = false;
        }
        if (byKind.TryGetValue(AlarmKind.LL, out var ll) && byKind.TryGetValue(AlarmKind.L, out var l) && ll.Alarm.Setpoint > l.Alarm.Setpoint)
        {
            Report(DiagnosticCatalog.MisorderedAlarms, ll.Source, ll.Syntax.Setpoint.Span,
                $"LL ({ll.Syntax.Setpoint.Text}) is above L ({l.Syntax.Setpoint.Text}): LL must be at or below L");
            ok = false;
        }
        return alarms.ToImmutable();
    }

    /// <summary>HH, H, L, LL, then words that are no alarm kind (reported when bound) in the order written.</summary>
    private static IEnumerable<(AlarmSyntax Alarm, SourceText Source)> AlarmsInKindOrder(Settings settings)
    {
        var alarms = settings.Alarms;
        if (alarms.Count == 0) return [];
        var ordered = new List<(AlarmSyntax, SourceText)>(alarms.Count);
        foreach (var kind in AlarmKindWords)
            if (alarms.TryGetValue(kind, out var alarm)) ordered.Add(alarm);
        if (ordered.Count < alarms.Count)
            foreach (var (kind, alarm) in alarms)
                if (Array.IndexOf(AlarmKindWords, kind) < 0) ordered.Add(alarm);
        return ordered;
    }

    // The words of each choice, in the order of the model's enums where there is one.
    private static readonly string[] AlarmKindWords = { "HH", "H", "L", "LL" };
    private static readonly string[] AlarmOptionWords = { "priority", "deadband", "delay", "clear", "text" };
    private static readonly string[] MeasureWords = { "flow", "level", "pressure", "temperature", "analysis", "other" };
    private static readonly string[] RawTypeWords = { "INT", "DINT", "UINT" };
    private static readonly string[] HealthWords = { "ne43", "none", "below", "above" };
    private static readonly string[] FaultActionWords = { "hold", "low", "high", "value" };

    private LoopSpec? BindLoop(Settings settings, ref bool ok)
    {
        if (settings.LoopBlock is null) return null;
        var loopSyntax = (LoopSyntax)settings.LoopBlock.Statement;
        var l = settings.Loop;
        double? Get(string keyword, Dimension dimension, double? fallback)
        {
            if (!l.TryGetValue(keyword, out var setting) || setting.Statement is not QuantitySettingSyntax q) return fallback;
            var value = Convert(q.Quantity, dimension, setting.Source, keyword);
            if (value is { } v && v < 0)
            {
                Report(DiagnosticCatalog.NotPositive, setting.Source, q.Quantity.Span, $"'{keyword}' cannot be negative");
                return null;
            }
            return value;
        }

        var supply = Get("supply", Dimension.Voltage, null);
        var device = Get("device", Dimension.Voltage, null);
        var barrier = Get("barrier", Dimension.Resistance, 0) ?? 0;
        var extra = Get("extra", Dimension.Resistance, 0) ?? 0;
        var current = Get("current", Dimension.Current, 20);

        // The cable is checked even when the loop is incomplete, so one run reports both.
        double? length = null;
        Conductor? conductor = null;
        if (l.TryGetValue("cable", out var cableSetting) && cableSetting.Statement is CableSyntax cable)
        {
            length = Convert(cable.Length, Dimension.Length, cableSetting.Source, "cable length");
            if (length is null) ok = false;
            conductor = BindConductor(cable.Size, cableSetting.Source);
            if (conductor is null) ok = false;
        }

        if (current is null) ok = false;
        else if (current <= 0)
        {
            var q = ((QuantitySettingSyntax)l["current"].Statement).Quantity;
            Report(DiagnosticCatalog.NotPositive, l["current"].Source, q.Span,
                "the current the budget is judged at must be larger than 0 mA, e.g. 'current 20 mA'");
            ok = false;
        }

        if (supply is null || device is null)
        {
            var missing = supply is null && !l.ContainsKey("supply") ? "supply" : device is null && !l.ContainsKey("device") ? "device" : null;
            if (missing is not null && !settings.LoopIncomplete)
                Report(DiagnosticCatalog.IncompleteLoop, settings.LoopBlock.Source, loopSyntax.Keyword.Span,
                    $"the loop block has no '{missing}': add e.g. '{(missing == "supply" ? "supply 24 V" : "device 10.5 V")}'");
            ok = false;
            return null;
        }
        if (current is not > 0) return null;

        return new LoopSpec(supply.Value, device.Value, length, conductor, barrier, extra, l.ContainsKey("hart"), current.Value,
            new SourceLocation(settings.LoopBlock.Source, loopSyntax.Keyword.Span));
    }

    private Conductor? BindConductor(QuantitySyntax size, SourceText source)
    {
        switch (size.Unit?.Text)
        {
            case "mm2" when size.Value > 0:
                return new Conductor(size.Value, null);
            case "AWG" when IsWhole(size.Value) && size.Value is >= 0 and <= 40:
                return new Conductor(null, (int)size.Value);
            default:
                Report(DiagnosticCatalog.UnknownConductor, source, size.Span,
                    $"'{source.ToString(size.Span)}' is not a conductor size: write a cross-section such as '1.0 mm2' or a gauge such as '18 AWG'");
                return null;
        }
    }

    // ---- Helpers ----------------------------------------------------------------------

    private double? Convert(QuantitySyntax quantity, Dimension expected, SourceText source, string what)
    {
        if (quantity.Unit is { } unit && !unit.Quoted && Units.TryGet(unit.Text, out var dimension, out var factor) && dimension == expected)
            return quantity.Value * factor;
        var found = quantity.Unit is null ? "no unit" : $"'{quantity.Unit.Text}'";
        var suggestion = quantity.Unit is null ? null : SyntaxParser.Suggest(quantity.Unit.Text, Units.WordsFor(expected));
        Report(DiagnosticCatalog.WrongUnit, source, quantity.Unit?.Span ?? quantity.Span,
            $"'{what}' needs {Units.Describe(expected)}, found {found}" +
            (suggestion is not null ? $": did you mean '{quantity.Number.Text} {suggestion}'?" : $": write e.g. '{quantity.Number.Text} {Units.ModelUnit(expected)}'"));
        return null;
    }

    private double? ConvertPercent(QuantitySyntax quantity, SourceText source, string what) =>
        quantity.Unit is null ? quantity.Value : Convert(quantity, Dimension.Percent, source, what);

    private (double Low, double High)? ConvertRange(RangeSyntax range, Dimension expected, SourceText source, string what)
    {
        // Checked as one quantity whose number is written as the whole range, so that a
        // suggestion reads '4 .. 20 mA' rather than '4 mA'.
        var whole = new NumberSyntax(range.Low.Span, range.Low.Value, $"{range.Low.Text} .. {range.High.Text}");
        var low = new QuantitySyntax(range.Span, whole, range.Unit);
        var factor = Convert(low, expected, source, what);
        if (factor is null) return null;
        Units.TryGet(range.Unit!.Text, out _, out var f);
        return (range.Low.Value * f, range.High.Value * f);
    }

    private string? Choice(WordSyntax word, SourceText source, string what, string[] choices)
    {
        if (Array.IndexOf(choices, word.Text) >= 0) return word.Text;
        var suggestion = SyntaxParser.Suggest(word.Text, choices);
        Report(DiagnosticCatalog.UnknownChoice, source, word.Span,
            $"'{word.Text}' is not {what}" + (suggestion is not null ? $": did you mean '{suggestion}'?" : $": use one of {string.Join(", ", choices)}"));
        return null;
    }

    private void CheckEscapes(StringSyntax text, SourceText source)
    {
        var raw = source.ToString(text.Span);
        for (var i = 1; i < raw.Length - 1; i++)
        {
            if (raw[i] != '\\') continue;
            if (raw[i + 1] is '"' or '\\') { i++; continue; }
            Report(DiagnosticCatalog.InvalidEscape, source, new TextSpan(text.Span.Start + i, 2),
                $"'\\{raw[i + 1]}' is not an escape: strings know only '\\\"' and '\\\\' (write '\\\\' for a backslash)");
            return;
        }
    }

    private void ReportUnused()
    {
        foreach (var (name, (syntax, source)) in _cardSyntax.OrderBy(c => c.Key, StringComparer.Ordinal))
            if (!_usedCards.Contains(name) && _pointSyntax.Count > 0)
                Report(DiagnosticCatalog.UnusedDeclaration, source, syntax.Name.Span, $"card '{name}' is declared but no point uses it: remove it or use it");
        foreach (var (name, (syntax, source)) in _profileSyntax.OrderBy(c => c.Key, StringComparer.Ordinal))
            if (!_usedProfiles.Contains(name) && _pointSyntax.Count > 0)
                Report(DiagnosticCatalog.UnusedDeclaration, source, syntax.Name.Span, $"profile '{name}' is declared but nothing uses it: remove it or use it");
    }

    private void Report(DiagnosticDescriptor descriptor, SourceText source, TextSpan span, string message) =>
        _diagnostics.Report(descriptor, source, span, message);
}
