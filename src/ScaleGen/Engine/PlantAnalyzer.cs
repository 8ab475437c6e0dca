using ScaleGen.Model;
using ScaleGen.Text;

namespace ScaleGen.Engine;

/// <summary>
/// Checks that need the scaling math: whether the card can represent the signal span,
/// count resolution, loop budgets. They run on the bound model, after the binder.
/// </summary>
public static class PlantAnalyzer
{
    public static void Analyze(Plant plant, DiagnosticBag diagnostics)
    {
        // Filled in once the engine lands.
    }
}
