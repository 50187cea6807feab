using System.Text;

namespace HandLine.Scoring;

/// <summary>
/// Truth manifest: UTF-8 text, one line per image, <c>relative/path.png&lt;TAB&gt;transcript</c>.
/// Paths are relative to the manifest's own folder; lines starting with '#' are comments; blank lines
/// are skipped; a trailing CR is dropped. Transcripts are NFC and may be empty, but cannot contain a
/// tab or a line break.
/// </summary>
public static class Manifest
{
    private const string Stage = "manifest";

    // Strict, so a line that is not UTF-8 is reported instead of scored with replacement characters.
    private static readonly UTF8Encoding StrictUtf8 = new(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true);

    /// <summary>
    /// Reads a manifest. Each bad line becomes an <see cref="InputException"/> in
    /// <see cref="ManifestReadResult.Errors"/> and the other lines still load.
    /// </summary>
    /// <exception cref="InputException">Stage "read": the file is missing or unreadable.</exception>
    public static ManifestReadResult Read(string tsvPath)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(tsvPath);
        var bytes = InputFile.ReadAllBytes(tsvPath, "read", "manifest");

        var folder = Path.GetDirectoryName(Path.GetFullPath(tsvPath))!;
        var entries = new List<ManifestEntry>();
        var errors = new List<InputException>();
        var firstLineOf = new Dictionary<string, int>(StringComparer.Ordinal);

        var lineNumber = 0;
        foreach (var raw in ByteLines.Split(bytes))
        {
            lineNumber++;
            var lineBytes = raw.Span;
            if (lineBytes.Length == 0 || lineBytes[0] == (byte)'#')
                continue;

            string line;
            try
            {
                line = StrictUtf8.GetString(lineBytes);
            }
            catch (DecoderFallbackException)
            {
                errors.Add(Error(tsvPath, lineNumber, "not valid UTF-8"));
                continue;
            }
            if (line.Trim(' ').Length == 0)
                continue;

            var tab = line.IndexOf('\t');
            if (tab < 0)
            {
                errors.Add(Error(tsvPath, lineNumber, "no tab between path and transcript"));
                continue;
            }
            if (line.IndexOf('\t', tab + 1) >= 0)
            {
                errors.Add(Error(tsvPath, lineNumber, "more than one tab; a transcript cannot contain a tab"));
                continue;
            }
            if (!RelativePaths.TryCanonicalise(line[..tab], out var relative, out var reason))
            {
                errors.Add(Error(tsvPath, lineNumber, reason));
                continue;
            }
            if (!firstLineOf.TryAdd(relative, lineNumber))
            {
                errors.Add(Error(tsvPath, lineNumber, $"duplicate path '{relative}' (first on line {firstLineOf[relative]})"));
                continue;
            }

            var full = Path.GetFullPath(Path.Combine(folder, relative.Replace('/', Path.DirectorySeparatorChar)));
            entries.Add(new ManifestEntry(relative, full, TextUnits.ToNfc(line[(tab + 1)..]), lineNumber));
        }
        return new ManifestReadResult(entries, errors);
    }

    /// <summary>
    /// Writes a manifest atomically: a temporary file in the same folder, then a rename over the target,
    /// so a reader never sees half a file. Paths are written in canonical form, transcripts as NFC.
    /// </summary>
    /// <exception cref="ArgumentException">A path is unusable or repeated, or a transcript has a tab or line break.</exception>
    public static void Write(string tsvPath, IEnumerable<(string RelativePath, string Text)> entries)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(tsvPath);
        ArgumentNullException.ThrowIfNull(entries);

        // Check everything before touching the disk, so a bad entry leaves no file behind.
        var text = new StringBuilder();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var (path, transcript) in entries)
        {
            ArgumentNullException.ThrowIfNull(path, nameof(entries));
            ArgumentNullException.ThrowIfNull(transcript, nameof(entries));
            if (path.Contains('\t'))
                throw new ArgumentException($"Path '{path}' contains a tab.", nameof(entries));
            if (!RelativePaths.TryCanonicalise(path, out var relative, out var reason))
                throw new ArgumentException($"Path '{path}': {reason}.", nameof(entries));
            if (relative[0] == '#')
                throw new ArgumentException($"Path '{path}' starts with '#', which reads back as a comment.", nameof(entries));
            if (!seen.Add(relative))
                throw new ArgumentException($"Path '{path}' appears twice.", nameof(entries));
            if (transcript.AsSpan().IndexOfAny('\t', '\r', '\n') >= 0)
                throw new ArgumentException($"Transcript for '{path}' contains a tab or line break.", nameof(entries));
            text.Append(relative).Append('\t').Append(TextUnits.ToNfc(transcript)).Append('\n');
        }

        var full = Path.GetFullPath(tsvPath);
        var temp = Path.Combine(Path.GetDirectoryName(full)!, $".{Path.GetFileName(full)}.{Guid.NewGuid():N}.tmp");
        try
        {
            using (var stream = new FileStream(temp, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                stream.Write(StrictUtf8.GetBytes(text.ToString()));
                stream.Flush(flushToDisk: true);
            }
            File.Move(temp, full, overwrite: true);
        }
        finally
        {
            if (File.Exists(temp))
                File.Delete(temp);
        }
    }

    private static InputException Error(string tsvPath, int lineNumber, string reason) =>
        new(tsvPath, Stage, $"line {lineNumber}: {reason}");
}
