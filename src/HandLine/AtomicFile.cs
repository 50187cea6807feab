using System.Text;

namespace HandLine;

/// <summary>Whole-file writes that never leave a half-written file: write a temporary sibling, then rename.</summary>
public static class AtomicFile
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
}
