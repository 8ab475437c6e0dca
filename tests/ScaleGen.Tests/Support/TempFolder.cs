namespace ScaleGen.Tests.Support;

/// <summary>A fresh folder under the system temp folder, deleted with everything in it on dispose.</summary>
public sealed class TempFolder : IDisposable
{
    public TempFolder()
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "scalegen-tests-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    public string Combine(params string[] parts) => System.IO.Path.Combine([Path, .. parts]);

    /// <summary>Writes a text file inside the folder and returns its full path.</summary>
    public string Write(string relative, string text)
    {
        var path = Combine(relative);
        Directory.CreateDirectory(System.IO.Path.GetDirectoryName(path)!);
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

    /// <summary>Every file under a folder (hidden ones too) with its bytes, by relative path.</summary>
    public static SortedDictionary<string, byte[]> Snapshot(string folder)
    {
        var files = new SortedDictionary<string, byte[]>(StringComparer.Ordinal);
        if (!Directory.Exists(folder)) return files;
        foreach (var file in Directory.GetFiles(folder, "*", SearchOption.AllDirectories))
            files[System.IO.Path.GetRelativePath(folder, file).Replace('\\', '/')] = File.ReadAllBytes(file);
        return files;
    }

    public static void AssertSameFiles(IDictionary<string, byte[]> expected, IDictionary<string, byte[]> actual)
    {
        Assert.Equal(expected.Keys.ToArray(), actual.Keys.ToArray());
        foreach (var (name, bytes) in expected)
            Assert.True(bytes.AsSpan().SequenceEqual(actual[name]), $"{name} differs");
    }

    public void Dispose()
    {
        try { Directory.Delete(Path, recursive: true); }
        catch (IOException) { }
        catch (UnauthorizedAccessException) { }
    }
}
