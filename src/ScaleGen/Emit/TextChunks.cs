using System.Globalization;
using System.Text;

namespace ScaleGen.Emit;

/// <summary>
/// Helpers for emitters that stream a large output (see <see cref="GeneratedFile"/>): they
/// build a point's text in a StringBuilder as before and spill it to the writer every so
/// often, so the whole file never sits in memory.
/// </summary>
public static class TextChunks
{
    /// <summary>About 64 K characters: large enough for few writes, small enough to stay out of the large object heap.</summary>
    private const int ChunkSize = 1 << 15;

    /// <summary>Writes the builder's text out and empties it once it has grown past a chunk; with <paramref name="all"/>, always.</summary>
    public static void Spill(StringBuilder text, TextWriter output, bool all = false)
    {
        if (!all && text.Length < ChunkSize) return;
        output.Write(text);
        text.Clear();
    }

    /// <summary>What a streaming writer writes, as one string (for commands and tests that want the text).</summary>
    public static string Render(Action<TextWriter> write)
    {
        var writer = new StringWriter(CultureInfo.InvariantCulture) { NewLine = "\n" };
        write(writer);
        return writer.ToString();
    }
}
