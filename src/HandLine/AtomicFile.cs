using System.Text;
using System.Text.RegularExpressions;

namespace HandLine;

/// <summary>Whole-file writes that never leave a half-written file: write a temporary sibling, then rename.</summary>
public static partial class AtomicFile
{
    public static void WriteAllBytes(string path, ReadOnlySpan<byte> bytes)
    {
        var tmp = TempPathFor(path);
        try
        {
            using (var fs = new FileStream(tmp, FileMode.CreateNew, FileAccess.Write))
            {
                fs.Write(bytes);
                fs.Flush(flushToDisk: true);
            }
            File.Move(tmp, path, overwrite: true);
        }
        finally
        {
            if (File.Exists(tmp)) File.Delete(tmp);
        }
    }

    public static void WriteAllText(string path, string text) =>
        WriteAllBytes(path, new UTF8Encoding(false).GetBytes(text));

    /// <summary>A unique temporary name in the same folder, so the rename stays on one file system.</summary>
    public static string TempPathFor(string path)
    {
        var full = Path.GetFullPath(path);
        return Path.Combine(Path.GetDirectoryName(full)!, $".{Path.GetFileName(full)}.{Guid.NewGuid():N}.tmp");
    }

    /// <summary>True for names made by <see cref="TempPathFor"/>.</summary>
    public static bool IsTempName(string fileName) => TempName().IsMatch(fileName);

    /// <summary>
    /// Deletes temporary files that a killed process left under <paramref name="dir"/>. Call it only while no
    /// other writer uses the folder (the batch holds a lock on it). Returns how many were removed.
    /// </summary>
    public static int DeleteStaleTemps(string dir)
    {
        var removed = 0;
        foreach (var file in Directory.EnumerateFiles(dir, ".*.tmp", SearchOption.AllDirectories))
        {
            if (!IsTempName(Path.GetFileName(file))) continue;
            File.Delete(file);
            removed++;
        }
        return removed;
    }

    [GeneratedRegex("^\\..+\\.[0-9a-f]{32}\\.tmp$", RegexOptions.CultureInvariant)]
    private static partial Regex TempName();
}
