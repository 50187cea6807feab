using HandLine.Formats;

namespace HandLine.Language;

/// <summary>Training text for word lists and language models: manifest transcripts or plain text lines.</summary>
public static class TextSources
{
    /// <summary>
    /// A file ending in .tsv is read as a manifest and its transcripts are used (the images need not exist);
    /// any other file is UTF-8 text, one line per line. Blank lines are skipped.
    /// </summary>
    /// <exception cref="InputException">A file is unreadable or a manifest line is malformed.</exception>
    public static IReadOnlyList<string> ReadLines(IEnumerable<string> paths)
    {
        ArgumentNullException.ThrowIfNull(paths);
        var lines = new List<string>();
        foreach (var path in paths)
        {
            if (Path.GetExtension(path).Equals(".tsv", StringComparison.OrdinalIgnoreCase))
            {
                var manifest = Manifest.Read(path);
                if (manifest.Errors.Count > 0) throw manifest.Errors[0];
                lines.AddRange(manifest.Entries.Select(e => e.Text).Where(t => t.Trim().Length > 0));
                continue;
            }
            try
            {
                lines.AddRange(File.ReadAllLines(path).Where(l => l.Trim().Length > 0).Select(TextUnits.ToNfc));
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException or NotSupportedException)
            {
                throw new InputException(path, "read", $"cannot read the text file: {e.Message}", e);
            }
        }
        return lines;
    }
}
