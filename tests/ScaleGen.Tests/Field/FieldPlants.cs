using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Field;

/// <summary>Small invented plants for the loop and sheet tests, compiled from .scale text.</summary>
internal static class FieldPlants
{
    /// <summary>Compiles the standard card plus the given points; fails the test on any error.</summary>
    public static Compilation Compile(string points)
    {
        var compilation = TestInputs.Compile(TestInputs.StandardCard + "\n" + points);
        Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics));
        return compilation;
    }

    /// <summary>Writes the text to a fresh temporary .scale file for CLI runs.</summary>
    public static string File(string points)
    {
        var folder = Directory.CreateTempSubdirectory("scalegen-field-");
        var path = Path.Combine(folder.FullName, "plant.scale");
        System.IO.File.WriteAllText(path, TestInputs.StandardCard + "\n" + points);
        return path;
    }
}
