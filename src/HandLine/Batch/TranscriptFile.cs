using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>The per-image text file: where it goes and what it holds. One place, so runs and merges agree.</summary>
public static class TranscriptFile
{
    private static readonly System.Text.UTF8Encoding Utf8 = new(false);

    /// <summary>The source's path with its extension replaced by ".txt" ('/' separators, relative to the out folder).</summary>
    public static string RelativePathFor(string source)
    {
        ArgumentException.ThrowIfNullOrEmpty(source);
        return Path.ChangeExtension(source, ".txt");
    }

    public static string FullPathFor(string outDir, string source) =>
        Path.Combine(outDir, RelativePathFor(source).Replace('/', Path.DirectorySeparatorChar));

    /// <summary>
    /// One recognised line per text line, each ended by a line feed; on a page, the parts of one entry (a ruled row:
    /// description and amounts) share a text line, separated by tabs, in reading order.
    /// </summary>
    public static string TextOf(IReadOnlyList<LineResult> lines)
    {
        var text = new System.Text.StringBuilder();
        for (var i = 0; i < lines.Count; i++)
        {
            text.Append(lines[i].Text);
            var sameEntry = i + 1 < lines.Count && lines[i].Entry is { } e && lines[i + 1].Entry == e;
            text.Append(sameEntry ? '\t' : '\n');
        }
        if (lines.Count == 0) text.Append('\n');
        return text.ToString();
    }

    /// <summary>Writes the file atomically unless it already holds exactly this text.</summary>
    public static void Write(string outDir, string source, IReadOnlyList<LineResult> lines, bool skipIfSame)
    {
        var target = FullPathFor(outDir, source);
        var bytes = Utf8.GetBytes(TextOf(lines));
        if (skipIfSame && File.Exists(target) && File.ReadAllBytes(target).AsSpan().SequenceEqual(bytes)) return;
        Directory.CreateDirectory(Path.GetDirectoryName(target)!);
        AtomicFile.WriteAllBytes(target, bytes);
    }
}
