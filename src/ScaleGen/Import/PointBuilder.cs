using System.Collections.Immutable;
using ScaleGen.Syntax;
using ScaleGen.Text;

namespace ScaleGen.Import;

/// <summary>
/// Turns one I/O-list row into a <c>point</c> declaration of the syntax tree. Only what the
/// row says is written: an empty cell writes no statement, so the point's profile or the
/// language's default applies. Spans are empty: the tree is printed by the formatter and
/// read back before it is checked, and the check's positions are mapped back to the row.
/// </summary>
internal static class PointBuilder
{
    private static readonly WordSyntax NoWord = new(default, "");

    /// <summary>The point, or null when a cell of the row is bad (the problems say which).</summary>
    public static PointSyntax? Build(IoListRow row, List<ImportProblem> problems)
    {
        var cells = new CellReader(row, problems);
        var statements = ImmutableArray.CreateBuilder<StatementSyntax>();

        WordSyntax? tag = null;
        if (!cells.Has(IoListColumns.Tag))
            cells.Report(DiagnosticCatalog.MissingCell, IoListColumns.Tag, "the row has no tag: give the point's tag, or clear the whole row");
        else tag = cells.Tag(IoListColumns.Tag);

        WordSyntax? profile = cells.Has(IoListColumns.Profile) ? cells.Name(IoListColumns.Profile, "profile") : null;

        var description = cells.Text(IoListColumns.Description);
        if (description.Length > 0)
            statements.Add(new DescriptionSyntax(default, Word("desc"), new StringSyntax(default, description)));

        if (!cells.Has(IoListColumns.Card))
            cells.Report(DiagnosticCatalog.MissingCell, IoListColumns.Card, "the row has no card: give the name of the card the point is wired to");
        else if (cells.Name(IoListColumns.Card, "card") is { } card)
        {
            var address = cells.Text(IoListColumns.Address);
            statements.Add(new CardReferenceSyntax(default, Word("card"), card, address.Length > 0 ? new StringSyntax(default, address) : null));
        }

        var signalLow = cells.OptionalNumber(IoListColumns.SignalLow);
        var signalHigh = cells.OptionalNumber(IoListColumns.SignalHigh);
        if (cells.Has(IoListColumns.SignalLow) != cells.Has(IoListColumns.SignalHigh))
        {
            var missing = cells.Has(IoListColumns.SignalLow) ? IoListColumns.SignalHigh : IoListColumns.SignalLow;
            cells.Report(DiagnosticCatalog.CellsIncomplete, missing,
                $"signal_lo and signal_hi go together: give both (e.g. 4 and 20) or leave both empty for the default");
        }
        else if (signalLow is not null && signalHigh is not null)
            statements.Add(new RangeSettingSyntax(default, Word("signal"), new RangeSyntax(default, signalLow, signalHigh, Unit("mA"))));

        if (cells.OptionalNumber(IoListColumns.Shunt) is { } shunt)
            statements.Add(Quantity("shunt", shunt, "ohm"));

        NumberSyntax? lrv = null, urv = null;
        if (!cells.Has(IoListColumns.Lrv))
            cells.Report(DiagnosticCatalog.MissingCell, IoListColumns.Lrv, "the row has no LRV: give the engineering value at signal low");
        else lrv = cells.Number(IoListColumns.Lrv);
        if (!cells.Has(IoListColumns.Urv))
            cells.Report(DiagnosticCatalog.MissingCell, IoListColumns.Urv, "the row has no URV: give the engineering value at signal high");
        else urv = cells.Number(IoListColumns.Urv);
        if (lrv is not null && urv is not null)
        {
            var unit = cells.Text(IoListColumns.Unit);
            statements.Add(new RangeSettingSyntax(default, Word("range"),
                new RangeSyntax(default, lrv, urv, unit.Length > 0 ? EngineeringUnit(unit) : null)));
        }

        var sqrt = cells.YesNo(IoListColumns.Sqrt);
        var cutoff = cells.OptionalNumber(IoListColumns.Cutoff);
        if (sqrt == true)
            statements.Add(new SqrtSyntax(default, Word("sqrt"), cutoff is null ? null : new QuantitySyntax(default, cutoff, Unit("%"))));
        else if (cells.Has(IoListColumns.Cutoff) && !cells.Failed)
            cells.Report(DiagnosticCatalog.CellsIncomplete, IoListColumns.Cutoff,
                "a low-flow cutoff needs square-root extraction: write yes in the sqrt column, or clear the cutoff");

        if (cells.Has(IoListColumns.Health) && cells.Choice(IoListColumns.Health, "ne43", "none") is { } health)
            statements.Add(new HealthSyntax(default, Word("health"), Word(health), null, null));

        if (cells.Has(IoListColumns.OnFault))
        {
            var cell = cells.Cell(IoListColumns.OnFault);
            var lower = cell.ToLowerInvariant();
            if (lower is "hold" or "low" or "high")
                statements.Add(new OnFaultSyntax(default, Word("on-fault"), Word(lower), null));
            else if (lower.StartsWith("value", StringComparison.Ordinal) || char.IsDigit(lower[0]) || lower[0] is '-' or '+' or '.')
            {
                // "value 5" or just "5": the value to show while faulted.
                var number = cells.Number(IoListColumns.OnFault, lower.StartsWith("value", StringComparison.Ordinal) ? cell[5..].Trim() : cell);
                if (number is not null) statements.Add(new OnFaultSyntax(default, Word("on-fault"), Word("value"), number));
            }
            else cells.Choice(IoListColumns.OnFault, "hold", "low", "high", "value");
        }

        if (cells.OptionalNumber(IoListColumns.Filter) is { } filter)
            statements.Add(Quantity("filter", filter, "s"));

        if (cells.Has(IoListColumns.Measure)
            && cells.Choice(IoListColumns.Measure, "flow", "level", "pressure", "temperature", "analysis", "other") is { } measure)
            statements.Add(new MeasureSyntax(default, Word("measure"), Word(measure)));

        if (cells.OptionalNumber(IoListColumns.Tolerance) is { } tolerance)
            statements.Add(Quantity("tolerance", tolerance, "%"));

        var deadband = cells.OptionalNumber(IoListColumns.Deadband);
        var delay = cells.OptionalNumber(IoListColumns.Delay);
        var anyAlarm = false;
        foreach (var (kind, setpointColumn, priorityColumn) in IoListColumns.Alarms)
        {
            var priority = cells.OptionalNumber(priorityColumn);
            if (!cells.Has(setpointColumn))
            {
                if (cells.Has(priorityColumn))
                    cells.Report(DiagnosticCatalog.CellsIncomplete, priorityColumn,
                        $"a priority for the {kind} alarm, but no {kind} setpoint: give the setpoint in column '{setpointColumn.Name}' or clear the priority");
                continue;
            }
            var setpoint = cells.Number(setpointColumn);
            if (setpoint is null) continue;
            anyAlarm = true;
            var options = ImmutableArray.CreateBuilder<AlarmOptionSyntax>();
            if (deadband is not null) options.Add(new AlarmOptionSyntax(default, Word("deadband"), new QuantitySyntax(default, deadband, Unit("%")), null));
            if (priority is not null) options.Add(new AlarmOptionSyntax(default, Word("priority"), new QuantitySyntax(default, priority, null), null));
            if (delay is not null) options.Add(new AlarmOptionSyntax(default, Word("delay"), new QuantitySyntax(default, delay, Unit("s")), null));
            statements.Add(new AlarmSyntax(default, Word("alarm"), Word(kind), setpoint, options.ToImmutable()));
        }
        if (!anyAlarm && !cells.Failed)
            foreach (var column in new[] { IoListColumns.Deadband, IoListColumns.Delay }.Where(cells.Has))
                cells.Report(DiagnosticCatalog.CellsIncomplete, column,
                    $"the row has a {column.Name} but no alarm setpoint (hh, h, l, ll): give a setpoint or clear the {column.Name}");

        if (cells.Failed || tag is null) return null;
        return new PointSyntax(default, Word("point"), tag, profile,
            new BlockSyntax(default, statements.ToImmutable(), ImmutableArray<string>.Empty));
    }

    private static WordSyntax Word(string text) => text.Length == 0 ? NoWord : new WordSyntax(default, text);

    private static UnitSyntax Unit(string text) => new(default, text, false);

    /// <summary>An engineering unit is written bare when the language reads it as one word, else quoted.</summary>
    private static UnitSyntax EngineeringUnit(string text)
    {
        var bare = !char.IsDigit(text[0]) && ".,-+".IndexOf(text[0]) < 0
            && text.All(ch => !char.IsWhiteSpace(ch) && !char.IsControl(ch) && "{}#;\"".IndexOf(ch) < 0);
        return new UnitSyntax(default, text, Quoted: !bare);
    }

    private static QuantitySettingSyntax Quantity(string keyword, NumberSyntax number, string unit) =>
        new(default, Word(keyword), new QuantitySyntax(default, number, Unit(unit)));
}
