using System.Collections;

namespace ScaleGen.Emit;

/// <summary>
/// A read-only list made of equal-sized groups of items that are computed each time they are
/// read and never stored: the plant program's declarations (three sections per point, with
/// a parameter record each) would take hundreds of MB at 50,000 points if they were held
/// whole, while the writers that stream them only need one point's at a time.
/// </summary>
/// <remarks>
/// Reading it twice computes everything twice and gives equal items; it only reads what
/// <paramref name="group"/> reads, so several threads may enumerate it at once if that is
/// shared-state free. Enumerate it rather than index it: an index computes its whole group.
/// </remarks>
public sealed class GroupedList<T>(int groupCount, int groupSize, Func<int, IReadOnlyList<T>> group) : IReadOnlyList<T>
{
    public int Count => groupCount * groupSize;

    public T this[int index] =>
        (uint)index < (uint)Count
            ? Group(index / groupSize)[index % groupSize]
            : throw new ArgumentOutOfRangeException(nameof(index));

    public IEnumerator<T> GetEnumerator()
    {
        for (var g = 0; g < groupCount; g++)
            foreach (var item in Group(g))
                yield return item;
    }

    IEnumerator IEnumerable.GetEnumerator() => GetEnumerator();

    private IReadOnlyList<T> Group(int index)
    {
        var items = group(index);
        return items.Count == groupSize
            ? items
            : throw new InvalidOperationException($"Group {index} has {items.Count} items, not {groupSize}.");
    }
}
