using ScaleGen.Emit.PlcOpen;
using ScaleGen.Text;

namespace ScaleGen.Verify;

/// <summary>
/// The Structured Text verify runs, from the files a user gives: `.st` files as they are,
/// and a PLCopen XML project as the Structured Text it carries (declarations rebuilt from
/// the XML interface, bodies as written), so the export is verified like the `.st` files.
/// </summary>
public static class StructuredTextSources
{
    /// <summary>Returns the Structured Text of one file, or a problem when a PLCopen file cannot be read.</summary>
    public static (SourceText? Text, VerifyProblem? Problem) From(SourceText file)
    {
        if (!IsPlcOpen(file)) return (file, null);
        try
        {
            // Positions in later errors refer to the extracted text; its name says so.
            return (new SourceText(file.Path + " (Structured Text)", PlcOpenReader.ExtractStructuredText(file.Text)), null);
        }
        catch (PlcOpenFormatException e)
        {
            return (null, new VerifyProblem(file.Path, e.Line, e.Column, e.Message));
        }
    }

    private static bool IsPlcOpen(SourceText file) =>
        file.Path.EndsWith(".xml", StringComparison.OrdinalIgnoreCase) || file.Text.TrimStart('\uFEFF', ' ', '\t', '\r', '\n').StartsWith("<?xml", StringComparison.Ordinal);
}
