using System.Collections;
using System.Reflection;
using ScaleGen.Text;

namespace ScaleGen.Tests.Support;

/// <summary>
/// Compares two syntax trees or two bound models field by field, ignoring where things were
/// written: spans, source locations, source texts, and blank-line flags (layout, not content).
/// Returns the first difference as a path such as <c>Points[2].Alarms[0].Deadband</c>.
/// </summary>
public static class StructuralComparer
{
    private static readonly HashSet<Type> Ignored = new() { typeof(TextSpan), typeof(SourceLocation), typeof(SourceText) };

    private static readonly HashSet<string> IgnoredProperties = new(StringComparer.Ordinal) { "BlankLineBefore", "EqualityContract" };

    /// <summary>The first difference, or null when the two are the same apart from where they were written.</summary>
    public static string? FirstDifference(object? expected, object? actual, string path = "")
    {
        if (expected is null || actual is null)
            return expected is null && actual is null ? null : $"{path}: {Show(expected)} vs {Show(actual)}";
        var type = expected.GetType();
        if (type != actual.GetType()) return $"{path}: {type.Name} vs {actual.GetType().Name}";
        if (Ignored.Contains(type)) return null;

        if (type.IsPrimitive || type.IsEnum || expected is string or decimal)
            return Equals(expected, actual) ? null : $"{path}: {Show(expected)} vs {Show(actual)}";

        if (expected is IEnumerable first && actual is IEnumerable second)
        {
            var a = first.Cast<object?>().ToList();
            var b = second.Cast<object?>().ToList();
            if (a.Count != b.Count) return $"{path}: {a.Count} items vs {b.Count}";
            for (var i = 0; i < a.Count; i++)
                if (FirstDifference(a[i], b[i], $"{path}[{i}]") is { } difference) return difference;
            return null;
        }

        foreach (var property in type.GetProperties(BindingFlags.Public | BindingFlags.Instance))
        {
            if (property.GetIndexParameters().Length > 0 || IgnoredProperties.Contains(property.Name)) continue;
            if (Ignored.Contains(property.PropertyType)) continue;
            var difference = FirstDifference(property.GetValue(expected), property.GetValue(actual),
                path.Length == 0 ? property.Name : $"{path}.{property.Name}");
            if (difference is not null) return difference;
        }
        return null;
    }

    private static string Show(object? value) => value switch
    {
        null => "null",
        string s => $"\"{s}\"",
        double d => d.ToString("R", System.Globalization.CultureInfo.InvariantCulture),
        _ => value.ToString() ?? "",
    };
}
