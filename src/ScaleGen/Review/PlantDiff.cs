using System.Collections.Immutable;
using ScaleGen.Model;

namespace ScaleGen.Review;

/// <summary>
/// One field that differs between the old and the new version of a point (or of the plant,
/// when <see cref="Point"/> is null).
/// </summary>
/// <param name="Point">The point's tag; null for a plant-wide field (title, cycle).</param>
/// <param name="Field">The stable field name, e.g. <c>alarm.HH.setpoint</c> (docs/diff.md lists them all).</param>
/// <param name="Summary">The change in words: "HH setpoint moved from 430 to 440 m3/h".</param>
/// <param name="Consequence">What the change does, computed by the engine, or null when there is nothing to compute: "trips at 19.30 mA (raw 26342) instead of 18.61 mA (raw 25148)".</param>
public sealed record FieldChange(string? Point, string Field, DiffValue Old, DiffValue New, string Summary, string? Consequence);

/// <summary>What changed between two versions of a plant, point by point (matched by tag), field by field.</summary>
/// <param name="Added">Points only the new version has, in tag order.</param>
/// <param name="Removed">Points only the old version has, in tag order.</param>
/// <param name="PlantChanges">Plant-wide fields (title, cycle).</param>
/// <param name="Changed">Changes to points both versions have, in tag order, then in the order of the field list.</param>
public sealed record PlantDiffResult(
    ImmutableArray<Point> Added,
    ImmutableArray<Point> Removed,
    ImmutableArray<FieldChange> PlantChanges,
    ImmutableArray<FieldChange> Changed)
{
    public bool IsEmpty => Added.IsEmpty && Removed.IsEmpty && PlantChanges.IsEmpty && Changed.IsEmpty;

    /// <summary>How many points have at least one changed field.</summary>
    public int ChangedPointCount => Changed.Select(c => c.Point).Distinct(StringComparer.Ordinal).Count();
}

/// <summary>The old and the new version of one point, with the plant around it (for the cycle time).</summary>
public readonly record struct DiffSide(Plant Plant, Point Point);

/// <summary>Compares two bound plants.</summary>
public static class PlantDiff
{
    public static PlantDiffResult Compare(Plant oldPlant, Plant newPlant)
    {
        var oldByTag = oldPlant.Points.ToDictionary(p => p.Tag, StringComparer.Ordinal);
        var newByTag = newPlant.Points.ToDictionary(p => p.Tag, StringComparer.Ordinal);

        var added = newPlant.Points.Where(p => !oldByTag.ContainsKey(p.Tag)).OrderBy(p => p.Tag, StringComparer.Ordinal).ToImmutableArray();
        var removed = oldPlant.Points.Where(p => !newByTag.ContainsKey(p.Tag)).OrderBy(p => p.Tag, StringComparer.Ordinal).ToImmutableArray();

        var changed = ImmutableArray.CreateBuilder<FieldChange>();
        foreach (var tag in oldByTag.Keys.Where(newByTag.ContainsKey).OrderBy(t => t, StringComparer.Ordinal))
            changed.AddRange(ComparePoint(new DiffSide(oldPlant, oldByTag[tag]), new DiffSide(newPlant, newByTag[tag])));

        return new PlantDiffResult(added, removed, ComparePlant(oldPlant, newPlant), changed.ToImmutable());
    }

    /// <summary>Every field of two versions of one point that differs, in the order of <see cref="DiffFields.PointFields"/>.</summary>
    public static IEnumerable<FieldChange> ComparePoint(DiffSide oldSide, DiffSide newSide)
    {
        foreach (var field in DiffFields.For(oldSide.Point, newSide.Point))
        {
            var before = field.Read(oldSide.Point);
            var after = field.Read(newSide.Point);
            if (before.SameAs(after)) continue;
            yield return new FieldChange(
                newSide.Point.Tag,
                field.Name,
                before,
                after,
                field.Describe(oldSide.Point, before, newSide.Point, after),
                field.Explain?.Invoke(oldSide, newSide));
        }
    }

    private static ImmutableArray<FieldChange> ComparePlant(Plant oldPlant, Plant newPlant)
    {
        var changes = ImmutableArray.CreateBuilder<FieldChange>();
        var oldTitle = DiffValue.Of(oldPlant.Title);
        var newTitle = DiffValue.Of(newPlant.Title);
        if (!oldTitle.SameAs(newTitle))
            changes.Add(new FieldChange(null, "title", oldTitle, newTitle, $"plant title changed from {oldTitle.Display()} to {newTitle.Display()}", null));
        var oldCycle = DiffValue.Of(oldPlant.CycleSeconds);
        var newCycle = DiffValue.Of(newPlant.CycleSeconds);
        if (!oldCycle.SameAs(newCycle))
            changes.Add(new FieldChange(null, "cycle_s", oldCycle, newCycle,
                $"task cycle changed from {oldCycle.Display()} s to {newCycle.Display()} s",
                "every delay, clear time and filter now counts in the new cycle"));
        return changes.ToImmutable();
    }
}
