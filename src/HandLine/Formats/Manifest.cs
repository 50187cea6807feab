using System.Text;

namespace HandLine.Formats;

/// <summary>
/// Truth manifest: UTF-8 text, one line per image, <c>relative/path.png&lt;TAB&gt;transcript</c>.
/// Paths are relative to the manifest's own folder; lines starting with '#' are comments; blank lines
/// are skipped; a trailing CR is dropped. Transcripts are NFC and may be empty, but cannot contain a
/// tab or a line break. An optional header <c>#columns&lt;TAB&gt;path&lt;TAB&gt;text&lt;TAB&gt;NAME...</c>
/// before the first entry names extra columns (see <see cref="ManifestColumns"/>); every entry then has
/// exactly that many tab-separated fields. Without it the format is the two columns above.
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
        // Set by a #columns header: the extra names, the fields an entry must have, the header's line.
        IReadOnlyList<string> columns = [];
        var fieldCount = 2;
        var headerLine = 0;
        var firstEntryLine = 0;

        var lineNumber = 0;
        foreach (var raw in ByteLines.Split(bytes))
        {
            lineNumber++;
            var lineBytes = raw.Span;
            if (lineBytes.Length > 0 && lineBytes[0] == (byte)'#')
            {
                if (IsHeaderLine(lineBytes))
                    ReadHeader(tsvPath, lineNumber, lineBytes, firstEntryLine, ref headerLine, ref columns, ref fieldCount, errors);
                continue;
            }
            if (lineBytes.Length == 0)
                continue;

            string line;
            try
            {
                line = StrictUtf8.GetString(lineBytes);
            }
            catch (DecoderFallbackException)
            {
                errors.Add(Error(tsvPath, lineNumber, "not valid UTF-8"));
                if (firstEntryLine == 0)
                    firstEntryLine = lineNumber;
                continue;
            }
            if (line.Trim(' ').Length == 0)
                continue;
            if (firstEntryLine == 0)
                firstEntryLine = lineNumber;

            string[] fields;
            if (fieldCount > 2)
            {
                fields = line.Split('\t');
                if (fields.Length != fieldCount)
                {
                    var named = columns.Count > 0 ? $" ({PathAndText}, {string.Join(", ", columns)})" : "";
                    errors.Add(Error(tsvPath, lineNumber,
                        $"{fields.Length} tab-separated field(s), but the {ManifestColumns.Marker} header on line {headerLine} names {fieldCount}{named}"));
                    continue;
                }
            }
            else
            {
                if (TwoFields(tsvPath, lineNumber, line, errors) is not { } two)
                    continue;
                fields = two;
            }
            if (!RelativePaths.TryCanonicalise(fields[0], out var relative, out var reason))
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
            var entry = new ManifestEntry(relative, full, TextUnits.ToNfc(fields[1]), lineNumber);
            if (columns.Count > 0)
            {
                var values = new Dictionary<string, string>(columns.Count, StringComparer.Ordinal);
                for (var c = 0; c < columns.Count; c++)
                    values[columns[c]] = TextUnits.ToNfc(fields[2 + c]);
                entry = entry with { Columns = values.AsReadOnly() };
            }
            entries.Add(entry);
        }
        return new ManifestReadResult(entries, errors) { Columns = columns };
    }

    private const string PathAndText = ManifestColumns.PathColumn + ", " + ManifestColumns.TextColumn;

    private static bool IsHeaderLine(ReadOnlySpan<byte> line)
    {
        var marker = "#columns"u8;
        return line.StartsWith(marker) && (line.Length == marker.Length || line[marker.Length] == (byte)'\t');
    }

    /// <summary>
    /// Takes the first header before any entry; a later one is an error, because entries already read would
    /// have been split by another rule. A bad header is an error, and entries are still checked against its
    /// field count but keep no extra columns, since their names are unusable.
    /// </summary>
    private static void ReadHeader(string tsvPath, int lineNumber, ReadOnlySpan<byte> lineBytes, int firstEntryLine,
        ref int headerLine, ref IReadOnlyList<string> columns, ref int fieldCount, List<InputException> errors)
    {
        if (firstEntryLine > 0)
        {
            errors.Add(Error(tsvPath, lineNumber,
                $"{ManifestColumns.Marker} header after the first entry (line {firstEntryLine}); it must come before every entry"));
            return;
        }
        if (headerLine > 0)
        {
            errors.Add(Error(tsvPath, lineNumber, $"second {ManifestColumns.Marker} header (the first is on line {headerLine})"));
            return;
        }
        headerLine = lineNumber;
        string line;
        try
        {
            line = StrictUtf8.GetString(lineBytes);
        }
        catch (DecoderFallbackException)
        {
            errors.Add(Error(tsvPath, lineNumber, "not valid UTF-8"));
            return;
        }
        if (ManifestColumns.TryParse(line, out var names, out var count, out var reason))
            columns = names;
        else
            errors.Add(Error(tsvPath, lineNumber, $"bad {ManifestColumns.Marker} header: {reason}"));
        fieldCount = count;
    }

    /// <summary>Path and transcript of a two-column line, or null after recording why not.</summary>
    private static string[]? TwoFields(string tsvPath, int lineNumber, string line, List<InputException> errors)
    {
        var tab = line.IndexOf('\t');
        if (tab < 0)
        {
            errors.Add(Error(tsvPath, lineNumber, "no tab between path and transcript"));
            return null;
        }
        if (line.IndexOf('\t', tab + 1) >= 0)
        {
            errors.Add(Error(tsvPath, lineNumber, "more than one tab; a transcript cannot contain a tab"));
            return null;
        }
        return [line[..tab], line[(tab + 1)..]];
    }

    /// <summary>
    /// Writes a manifest atomically: a temporary file in the same folder, then a rename over the target,
    /// so a reader never sees half a file. Paths are written in canonical form, transcripts as NFC.
    /// </summary>
    /// <exception cref="ArgumentException">A path is unusable or repeated, or a transcript has a tab or line break.</exception>
    public static void Write(string tsvPath, IEnumerable<(string RelativePath, string Text)> entries)
    {
        ArgumentNullException.ThrowIfNull(entries);
        Write(tsvPath, [], entries.Select(e => (e.RelativePath, e.Text, (IReadOnlyList<string>)[])));
    }

    /// <summary>
    /// Writes a manifest with extra columns: a <c>#columns</c> header naming them (none when
    /// <paramref name="columns"/> is empty, so the file is the plain two-column format), then each entry's
    /// path, transcript and values in <paramref name="columns"/> order. An optional <paramref name="comment"/>
    /// goes first as a '#' line. Atomic and canonical as the two-column overload.
    /// </summary>
    /// <exception cref="ArgumentException">
    /// A column name is unusable or repeated, an entry has the wrong number of values, a path is unusable or
    /// repeated, a transcript or value has a tab or line break, or the comment has a line break.
    /// </exception>
    public static void Write(string tsvPath, IReadOnlyList<string> columns,
        IEnumerable<(string RelativePath, string Text, IReadOnlyList<string> Values)> entries, string? comment = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(tsvPath);
        ArgumentNullException.ThrowIfNull(columns);
        ArgumentNullException.ThrowIfNull(entries);

        // Check everything before touching the disk, so a bad entry leaves no file behind.
        var text = new StringBuilder();
        if (comment is not null)
        {
            if (comment.AsSpan().IndexOfAny('\r', '\n') >= 0)
                throw new ArgumentException("The comment contains a line break.", nameof(comment));
            // The space after '#' keeps a comment from ever reading back as a #columns header.
            text.Append(("# " + comment).TrimEnd()).Append('\n');
        }
        var names = new HashSet<string>(StringComparer.Ordinal);
        foreach (var name in columns)
        {
            ArgumentNullException.ThrowIfNull(name, nameof(columns));
            if (ManifestColumns.Problem(name) is { } problem)
                throw new ArgumentException($"Bad column name: {problem}.", nameof(columns));
            if (!names.Add(name))
                throw new ArgumentException($"Column '{name}' appears twice.", nameof(columns));
        }
        if (columns.Count > 0)
            text.Append(ManifestColumns.Marker).Append('\t').Append(ManifestColumns.PathColumn)
                .Append('\t').Append(ManifestColumns.TextColumn).Append('\t').AppendJoin('\t', columns).Append('\n');

        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var (path, transcript, values) in entries)
        {
            ArgumentNullException.ThrowIfNull(path, nameof(entries));
            ArgumentNullException.ThrowIfNull(transcript, nameof(entries));
            ArgumentNullException.ThrowIfNull(values, nameof(entries));
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
            if (values.Count != columns.Count)
                throw new ArgumentException($"Entry '{path}' has {values.Count} extra value(s) for {columns.Count} column(s).", nameof(entries));
            text.Append(relative).Append('\t').Append(TextUnits.ToNfc(transcript));
            for (var c = 0; c < values.Count; c++)
            {
                ArgumentNullException.ThrowIfNull(values[c], nameof(entries));
                if (values[c].AsSpan().IndexOfAny('\t', '\r', '\n') >= 0)
                    throw new ArgumentException($"Column '{columns[c]}' of '{path}' contains a tab or line break.", nameof(entries));
                text.Append('\t').Append(TextUnits.ToNfc(values[c]));
            }
            text.Append('\n');
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
