using System.Collections.Concurrent;
using System.Text;

namespace ScaleGen.Emit;

/// <summary>One file <see cref="OutputWriter"/> put in place, for the summary a command prints.</summary>
public sealed record WrittenFile(string RelativePath, long Bytes);

/// <summary>
/// The output folder cannot be used or written: a path problem, not a bug. Its message is
/// one line that names the path and says what is wrong.
/// </summary>
public sealed class OutputFolderException(string message, Exception? inner = null) : IOException(message, inner);

/// <summary>The points in a write at which a test can stop it as if the process were killed.</summary>
internal enum WriteStep
{
    /// <summary>One more file is complete in the temporary folder.</summary>
    FileWritten,
    /// <summary>The old output folder has been renamed aside; the new one is not yet in place.</summary>
    MovedAside,
    /// <summary>The new folder is in place; the set-aside old one is not yet deleted.</summary>
    Swapped,
}

/// <summary>
/// Writes a set of generated files into an output folder all or nothing.
/// </summary>
/// <remarks>
/// Protocol, for a target folder DIR with parent P:
/// <list type="number">
/// <item>Take a lock file <c>P/.DIR.scalegen-lock</c>, so two builds never write one folder.</item>
/// <item>Recover from an earlier run that was killed: if <c>P/.DIR.scalegen-old</c> exists
/// and DIR does not, the kill came between the two renames: rename it back to DIR. If both
/// exist, the swap finished: delete the old one. Delete a left-over <c>P/.DIR.scalegen-new</c>.</item>
/// <item>Refuse a DIR that holds files scalegen did not write: DIR must be missing, empty, or
/// carry the marker file <see cref="MarkerFileName"/> from an earlier build.</item>
/// <item>Write the marker and every file into <c>P/.DIR.scalegen-new</c>. If anything fails
/// (an emitter throws, the disk is full), delete it and leave DIR as it was.</item>
/// <item>Swap: rename DIR to <c>.DIR.scalegen-old</c>, rename the new folder to DIR, delete the old.</item>
/// </list>
/// Renames within one folder are atomic on the file systems a build runs on, so at every
/// instant DIR is the complete old set, the complete new set, or (between the two renames)
/// missing with the complete old set beside it, which the next run restores.
/// No fsync: a power cut may lose the new set, but a killed process never leaves half of one.
/// </remarks>
public static class OutputWriter
{
    /// <summary>The file that marks a folder as scalegen's own, so a later build may replace it whole.</summary>
    public const string MarkerFileName = ".scalegen-output";

    private const string MarkerText =
        "This folder is written by scalegen. The next 'scalegen build' into it replaces the whole folder:\n" +
        "keep nothing else here.\n";

    private static readonly UTF8Encoding Utf8NoBom = new(encoderShouldEmitUTF8Identifier: false);

    /// <summary>
    /// Runs the emitters and writes their files all or nothing. Files are written side by
    /// side, and the list comes back in catalog order.
    /// <paramref name="writing"/>, if given, hears the name of each file as its writing
    /// starts, from whichever thread writes it.
    /// </summary>
    /// <exception cref="OutputFolderException">The folder cannot be used or written, or holds one of the input files.</exception>
    public static IReadOnlyList<WrittenFile> Build(EmitContext context, IEnumerable<IOutputEmitter> emitters, string directory,
        Action<string>? writing = null)
    {
        // The folder is replaced whole: a source kept inside it would be deleted.
        var target = FullPath(directory) + Path.DirectorySeparatorChar;
        foreach (var source in context.Plant.Sources)
        {
            if (Path.GetFullPath(source.Path).StartsWith(target, OperatingSystem.IsLinux() ? StringComparison.Ordinal : StringComparison.OrdinalIgnoreCase))
                throw new OutputFolderException($"'{directory}' holds the input file '{source.Path}', and a build replaces the whole folder; give another output folder");
        }
        var groups = emitters.Select(emitter => emitter.Emit(context)).ToList();
        return Write(directory, groups, stopAt: null, writing)!;
    }

    /// <summary>
    /// Writes the files into <paramref name="directory"/>, replacing what an earlier build
    /// wrote there, all or nothing. The sequence is read lazily, while writing; if it
    /// throws, the exception comes out unchanged and the folder is untouched.
    /// </summary>
    /// <exception cref="OutputFolderException">The folder cannot be used or written.</exception>
    public static IReadOnlyList<WrittenFile> Write(string directory, IEnumerable<GeneratedFile> files) =>
        Write(directory, [files], stopAt: null, writing: null)!;

    /// <summary>The folder a write fills before the swap.</summary>
    public static string TemporaryFolderFor(string directory) => Sibling(directory, "scalegen-new");

    /// <summary>Where the old output folder waits during the swap.</summary>
    public static string SetAsideFolderFor(string directory) => Sibling(directory, "scalegen-old");

    /// <summary>
    /// Puts things right after a write that was killed (see the protocol above). Every
    /// <see cref="Write(string, IEnumerable{GeneratedFile})"/> starts with this.
    /// </summary>
    public static void Recover(string directory)
    {
        var target = FullPath(directory);
        using var _ = Lock(directory, target);
        RecoverLocked(directory, target);
    }

    /// <summary>
    /// The write, with a test hook: when <paramref name="stopAt"/> returns true the write
    /// returns null at once, leaving everything as a killed process would.
    /// </summary>
    internal static IReadOnlyList<WrittenFile>? Write(string directory, IEnumerable<GeneratedFile> files, Func<WriteStep, bool>? stopAt) =>
        Write(directory, [files], stopAt, writing: null);

    /// <summary>
    /// The write. The groups of files (one per emitter) are read lazily and the files written
    /// in parallel, unless a test hook watches the steps; the list that comes back is in group
    /// and file order. A failure anywhere leaves the folder as it was, and its exception comes
    /// out unchanged.
    /// </summary>
    private static IReadOnlyList<WrittenFile>? Write(string directory, IReadOnlyList<IEnumerable<GeneratedFile>> groups,
        Func<WriteStep, bool>? stopAt, Action<string>? writing)
    {
        var target = FullPath(directory);
        using var _ = Lock(directory, target);
        RecoverLocked(directory, target);
        CheckReplaceable(directory, target);

        var temporary = TemporaryFolderFor(target);
        var swapped = false;
        try
        {
            Io(directory, () =>
            {
                Directory.CreateDirectory(temporary);
                File.WriteAllText(Path.Combine(temporary, MarkerFileName), MarkerText, Utf8NoBom);
            });
            var seen = new HashSet<string>(StringComparer.OrdinalIgnoreCase) { MarkerFileName };
            var written = new List<(int Group, int Index, WrittenFile File)>();

            bool WriteOne(int group, int index, GeneratedFile file)
            {
                var relative = CheckRelativePath(file.RelativePath);
                lock (seen)
                {
                    if (!seen.Add(relative))
                        throw new InvalidOperationException($"Two outputs want the same file '{relative}'.");
                }
                writing?.Invoke(relative);
                var done = WriteFile(directory, temporary, relative, file);
                lock (written) written.Add((group, index, done));
                return stopAt?.Invoke(WriteStep.FileWritten) != true;
            }

            if (stopAt is not null || Environment.ProcessorCount == 1)
            {
                for (var group = 0; group < groups.Count; group++)
                {
                    var index = 0;
                    foreach (var file in groups[group])
                        if (!WriteOne(group, index++, file)) return null;
                }
            }
            else
            {
                // Every file on its own, as many at a time as there are processors. The files are
                // taken from the emitters one by one (a streamed file costs nothing until it is
                // written), so a large output does not wait for the others of its emitter.
                var files = groups.SelectMany((group, g) => group.Select((file, i) => (Group: g, Index: i, File: file)));
                try
                {
                    Parallel.ForEach(Partitioner.Create(files, EnumerablePartitionerOptions.NoBuffering),
                        new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount },
                        item => WriteOne(item.Group, item.Index, item.File));
                }
                catch (AggregateException failure)
                {
                    // The exception itself, as a write one file after another would throw it.
                    System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(failure.InnerExceptions[0]).Throw();
                }
            }

            if (!Swap(directory, target, temporary, ref swapped, stopAt)) return null;
            return written.OrderBy(w => w.Group).ThenBy(w => w.Index).Select(w => w.File).ToList();
        }
        finally
        {
            if (!swapped) DeleteQuietly(temporary);
        }
    }

    /// <summary>Streams one file into the temporary folder as UTF-8 without a byte-order mark.</summary>
    private static WrittenFile WriteFile(string directory, string temporary, string relative, GeneratedFile file)
    {
        long bytes = 0;
        Io(directory, () =>
        {
            var path = Path.Combine(temporary, relative);
            Directory.CreateDirectory(Path.GetDirectoryName(path)!);
            using var stream = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.None, 1 << 16);
            using (var writer = new StreamWriter(stream, Utf8NoBom, 1 << 16, leaveOpen: true) { NewLine = "\n" })
                file.WriteTo(writer);
            bytes = stream.Length;
        });
        return new WrittenFile(relative, bytes);
    }

    /// <summary>Rename the old folder aside, the new one into place, delete the old. False when the test hook stopped it.</summary>
    private static bool Swap(string directory, string target, string temporary, ref bool swapped, Func<WriteStep, bool>? stopAt)
    {
        var old = SetAsideFolderFor(target);
        var hadOld = Directory.Exists(target);
        if (hadOld)
        {
            Io(directory, () => Directory.Move(target, old));
            if (stopAt?.Invoke(WriteStep.MovedAside) == true) { swapped = true; return false; }
        }
        try
        {
            Io(directory, () => Directory.Move(temporary, target));
        }
        catch when (hadOld)
        {
            // Put the old outputs back; if even that fails, the next run's recovery does it.
            try { Directory.Move(old, target); } catch (IOException) { } catch (UnauthorizedAccessException) { }
            throw;
        }
        swapped = true;
        if (stopAt?.Invoke(WriteStep.Swapped) == true) return false;
        // The build has succeeded; an old folder that will not go is removed by the next run.
        if (hadOld) DeleteQuietly(old);
        return true;
    }

    private static void RecoverLocked(string directory, string target)
    {
        var old = SetAsideFolderFor(target);
        var temporary = TemporaryFolderFor(target);
        Io(directory, () =>
        {
            if (Directory.Exists(old))
            {
                RequireOurs(old);
                if (Directory.Exists(target)) Directory.Delete(old, recursive: true); // the swap finished
                else if (!File.Exists(target)) Directory.Move(old, target); // killed between the renames
            }
            if (Directory.Exists(temporary))
            {
                RequireOurs(temporary);
                Directory.Delete(temporary, recursive: true);
            }
        });
    }

    private static void CheckReplaceable(string directory, string target)
    {
        if (File.Exists(target))
            throw new OutputFolderException($"cannot write outputs to '{directory}': it is a file, not a folder");
        if (!Directory.Exists(target)) return;
        if (new DirectoryInfo(target).LinkTarget is not null)
            throw new OutputFolderException($"cannot write outputs to '{directory}': it is a symbolic link; give the folder it points to");
        if (!IsOurs(target))
            throw new OutputFolderException(
                $"'{directory}' holds files scalegen did not write (it has no {MarkerFileName} marker); give an empty or new folder");
    }

    /// <summary>Empty, or marked by an earlier build.</summary>
    private static bool IsOurs(string folder) =>
        File.Exists(Path.Combine(folder, MarkerFileName)) || !Directory.EnumerateFileSystemEntries(folder).Any();

    private static void RequireOurs(string folder)
    {
        if (!IsOurs(folder))
            throw new OutputFolderException($"'{folder}' is left over but was not written by scalegen; move it away and build again");
    }

    private static IDisposable Lock(string directory, string target)
    {
        var parent = Path.GetDirectoryName(target)!;
        var lockPath = Sibling(target, "scalegen-lock");
        FileStream? stream = null;
        // Name the culprit when a folder on the way is a file: the system's message does not.
        for (var ancestor = parent; ancestor is not null; ancestor = Path.GetDirectoryName(ancestor))
        {
            if (File.Exists(ancestor))
                throw new OutputFolderException($"cannot write outputs to '{directory}': '{ancestor}' is a file, not a folder");
        }
        Io(directory, () =>
        {
            Directory.CreateDirectory(parent);
            // FileShare.None is an exclusive lock held until this process closes the file or dies.
            stream = new FileStream(lockPath, FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None, 1, FileOptions.DeleteOnClose);
        });
        return stream!;
    }

    /// <summary>A relative path inside the output folder, with '/' separators; anything else is an emitter bug.</summary>
    private static string CheckRelativePath(string relative)
    {
        var parts = relative.Replace('\\', '/').Split('/');
        if (relative.Length == 0 || Path.IsPathRooted(relative) || parts.Any(p => p is "" or "." or ".."))
            throw new InvalidOperationException($"An output path must be relative and plain: '{relative}'.");
        return string.Join('/', parts);
    }

    private static string FullPath(string directory)
    {
        if (string.IsNullOrWhiteSpace(directory))
            throw new OutputFolderException("the output folder is empty: give a folder name with -o");
        string full;
        try { full = Path.GetFullPath(directory); }
        catch (Exception e) when (e is ArgumentException or NotSupportedException or PathTooLongException)
        {
            throw new OutputFolderException($"cannot write outputs to '{directory}': {e.Message}", e);
        }
        full = Path.TrimEndingDirectorySeparator(full);
        if (Path.GetDirectoryName(full) is null)
            throw new OutputFolderException($"cannot write outputs to '{directory}': a root folder cannot be replaced; give a folder inside it");
        return full;
    }

    private static string Sibling(string directory, string suffix)
    {
        var full = Path.TrimEndingDirectorySeparator(Path.GetFullPath(directory));
        return Path.Combine(Path.GetDirectoryName(full)!, $".{Path.GetFileName(full)}.{suffix}");
    }

    /// <summary>File-system failures become one line naming the folder the user gave.</summary>
    private static void Io(string directory, Action action)
    {
        try
        {
            action();
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException && e is not OutputFolderException)
        {
            throw new OutputFolderException($"cannot write outputs to '{directory}': {e.Message}", e);
        }
    }

    private static void DeleteQuietly(string folder)
    {
        try
        {
            if (Directory.Exists(folder)) Directory.Delete(folder, recursive: true);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            // Left for the next run's recovery to remove.
        }
    }
}
