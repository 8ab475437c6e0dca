using System.Text;
using Newtonsoft.Json.Linq;
using ScaleGen.Emit;
using ScaleGen.Model;

namespace ScaleGen.Review;

/// <summary>A plant diff as text (one line per change), Markdown (for a review comment) and JSON.</summary>
public static class DiffReport
{
    /// <summary>"1 point added, 0 removed, 2 changed (3 fields)"; plant-wide changes are counted after.</summary>
    public static string Headline(PlantDiffResult diff)
    {
        var text = $"{Plural(diff.Added.Length, "point")} added, {diff.Removed.Length} removed, {diff.ChangedPointCount} changed ({Plural(diff.Changed.Length, "field")})";
        if (!diff.PlantChanges.IsEmpty) text += $", {Plural(diff.PlantChanges.Length, "plant setting")} changed";
        return text;
    }

    /// <summary>
    /// One line per change, like "~ FIT-101 HH setpoint moved from 430 to 440 m3/h: trips at
    /// 19.30 mA (raw 26342) instead of 18.61 mA (raw 25148)". Nothing at all when nothing changed.
    /// </summary>
    public static string Text(PlantDiffResult diff)
    {
        if (diff.IsEmpty) return "";
        var text = new StringBuilder();
        foreach (var change in diff.PlantChanges) text.Append("~ plant ").Append(Sentence(change)).Append('\n');
        foreach (var point in diff.Added) text.Append($"+ {point.Tag} added: {Sketch(point)}\n");
        foreach (var point in diff.Removed) text.Append($"- {point.Tag} removed: {Sketch(point)}\n");
        foreach (var change in diff.Changed) text.Append($"~ {change.Point} ").Append(Sentence(change)).Append('\n');
        text.Append(Headline(diff)).Append('\n');
        return text.ToString();
    }

    /// <summary>A Markdown section for a review comment: added and removed points, then a table of changes.</summary>
    public static string Markdown(PlantDiffResult diff)
    {
        var md = new StringBuilder();
        md.Append("### Point changes\n\n");
        if (diff.IsEmpty) return md.Append("No changes.\n").ToString();
        md.Append(Headline(diff)).Append(".\n\n");
        if (!diff.Added.IsEmpty)
        {
            md.Append("**Added**\n\n");
            foreach (var point in diff.Added) md.Append($"- `{point.Tag}`: {Cell(Sketch(point))}\n");
            md.Append('\n');
        }
        if (!diff.Removed.IsEmpty)
        {
            md.Append("**Removed**\n\n");
            foreach (var point in diff.Removed) md.Append($"- `{point.Tag}`: {Cell(Sketch(point))}\n");
            md.Append('\n');
        }
        var changes = diff.PlantChanges.Concat(diff.Changed).ToList();
        if (changes.Count > 0)
        {
            md.Append("| Point | Field | Change | Consequence |\n| --- | --- | --- | --- |\n");
            foreach (var change in changes)
                md.Append($"| {(change.Point is null ? "(plant)" : $"`{change.Point}`")} | `{change.Field}` | {Cell(change.Summary)} | {Cell(change.Consequence ?? "")} |\n");
            md.Append('\n');
        }
        md.Append("_Consequences are computed by scalegen from the two versions; review them against the loop drawings and the alarm philosophy._\n");
        return md.ToString();
    }

    /// <summary>
    /// <c>{ "added": [tags], "removed": [tags], "changed": [ { "point", "field", "old", "new", "summary", "consequence" } ], "plant": [...] }</c>
    /// (the first three as the command line contract says; "summary", "consequence" and "plant" are additions).
    /// </summary>
    public static string Json(PlantDiffResult diff) =>
        JsonOutput.Write(new JObject
        {
            ["added"] = new JArray(diff.Added.Select(p => p.Tag)),
            ["removed"] = new JArray(diff.Removed.Select(p => p.Tag)),
            ["changed"] = new JArray(diff.Changed.Select(ChangeJson)),
            ["plant"] = new JArray(diff.PlantChanges.Select(ChangeJson)),
        });

    private static JObject ChangeJson(FieldChange change)
    {
        var json = new JObject();
        if (change.Point is not null) json["point"] = change.Point;
        json["field"] = change.Field;
        json["old"] = change.Old.ToJson();
        json["new"] = change.New.ToJson();
        json["summary"] = change.Summary;
        json["consequence"] = change.Consequence is null ? JValue.CreateNull() : new JValue(change.Consequence);
        return json;
    }

    private static string Sentence(FieldChange change) =>
        change.Consequence is null ? change.Summary : $"{change.Summary}: {change.Consequence}";

    /// <summary>What a point is, in one line: description, range, card and channel.</summary>
    public static string Sketch(Point point)
    {
        var range = $"{DisplayNumbers.Exact(point.Lrv)} .. {DisplayNumbers.Exact(point.Urv)} {point.Unit}";
        var description = point.Description.Length > 0 ? $"\"{point.Description}\", " : "";
        return $"{description}{range}{(point.SquareRoot ? " (square root)" : "")} on {point.Card.Name} at \"{point.Address}\", {Plural(point.Alarms.Length, "alarm")}";
    }

    private static string Plural(int count, string noun) => $"{count} {noun}{(count == 1 ? "" : "s")}";

    /// <summary>Text inside a Markdown table cell: no pipe or HTML may break the table.</summary>
    private static string Cell(string text) =>
        text.Replace("&", "&amp;").Replace("<", "&lt;").Replace(">", "&gt;").Replace("|", "\\|").Replace("\n", " ");
}
