using ScaleGen.Import;
using ScaleGen.Tests.Support;
using ScaleGen.Text;

namespace ScaleGen.Tests.Import;

/// <summary>Shared inputs for the import tests: the card declarations, a header row, a scratch folder.</summary>
internal static class ImportCases
{
    public const string Header = "tag,description,card,address,signal_lo,signal_hi,lrv,urv,unit,sqrt,cutoff,health,hh,h,l,ll";

    public static string CardsFile => Path.Combine(TestInputs.ExamplesFolder, "cards.scale");

    public static string IoListFile => Path.Combine(TestInputs.RepositoryRoot, "examples", "io-list", "io-list.csv");

    public static SourceText Cards => SourceText.FromFile(CardsFile);

    public static ImportOptions WithCards => ImportOptions.Default with { Declarations = new[] { Cards } };

    /// <summary>A good row for the header above; tests change one cell of it.</summary>
    public const string GoodRow = "PT-901,Test pressure,ai_4_20,R9.S1.C0,4,20,0,10,bar,no,,ne43,9,8,2,1";

    public static ImportResult ImportCsv(string csv, ImportOptions? options = null, string path = "io-list.csv") =>
        IoListImporter.Import(path, csv, options ?? WithCards);

    public static string Lines(params string[] lines) => string.Join("\n", lines) + "\n";
}

/// <summary>A folder of its own under the temp folder, removed afterwards.</summary>
public sealed class ScratchFolder : IDisposable
{
    public ScratchFolder() => Directory.CreateDirectory(Path);

    public string Path { get; } = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "scalegen-tests-" + Guid.NewGuid().ToString("N"));

    public string File(string name) => System.IO.Path.Combine(Path, name);

    public string Write(string name, string text)
    {
        var path = File(name);
        System.IO.File.WriteAllText(path, text);
        return path;
    }

    public void Dispose()
    {
        try { Directory.Delete(Path, recursive: true); }
        catch (IOException) { }
        catch (UnauthorizedAccessException) { }
    }
}
