using ScaleGen.Model;

namespace ScaleGen.Emit;

/// <summary>
/// The text an operator sees for an alarm. Every emitter that shows alarm texts takes them
/// from here, so the alarm system, the PLC code and the check sheets say the same thing.
/// </summary>
public static class AlarmMessages
{
    /// <summary>The alarm's own <c>text</c> when it has one, else <see cref="Default"/>.</summary>
    public static string For(Point point, Alarm alarm) =>
        string.IsNullOrWhiteSpace(alarm.Message) ? Default(point, alarm.Kind) : alarm.Message;

    /// <summary>
    /// A message made of the tag, the description and the alarm kind in words, e.g.
    /// "FIT-101 Raw water flow high high". Words rather than HH/LL so that the message
    /// reads aloud; the tag first so that it sorts and searches by tag.
    /// </summary>
    public static string Default(Point point, AlarmKind kind)
    {
        var parts = new[] { point.Tag, point.Description.Trim(), KindInWords(kind) };
        return string.Join(" ", parts.Where(p => p.Length > 0));
    }

    public static string KindInWords(AlarmKind kind) => kind switch
    {
        AlarmKind.HH => "high high",
        AlarmKind.H => "high",
        AlarmKind.L => "low",
        _ => "low low",
    };
}
