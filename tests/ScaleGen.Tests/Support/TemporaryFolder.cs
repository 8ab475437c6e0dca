namespace ScaleGen.Tests.Support;

/// <summary>A fresh folder under the system temp folder, deleted with everything in it on Dispose.</summary>
public sealed class TemporaryFolder : IDisposable
{
    public TemporaryFolder()
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "scalegen-tests-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    /// <summary>Writes a file (UTF-8, no byte-order mark) and returns its full path.</summary>
    public string Write(string name, string text)
    {
        var path = System.IO.Path.Combine(Path, name);
        File.WriteAllText(path, text);
        return path;
    }

    /// <summary>
    /// Output with this folder's path taken out of every file path, as written plainly, in a
    /// JSON string (backslashes doubled) or as a URI (forward slashes).
    /// </summary>
    public string Anonymise(string output)
    {
        var separator = System.IO.Path.DirectorySeparatorChar;
        return output
            .Replace(Path.Replace("\\", "\\\\") + (separator == '\\' ? "\\\\" : "/"), "", StringComparison.Ordinal)
            .Replace(Path + separator, "", StringComparison.Ordinal)
            .Replace(Path.Replace('\\', '/') + "/", "", StringComparison.Ordinal);
    }

    public void Dispose()
    {
        try { Directory.Delete(Path, recursive: true); }
        catch (IOException) { /* a leftover temp folder is harmless */ }
    }
}
