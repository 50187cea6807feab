using System.Text.Json;
using HandLine.Formats;

namespace HandLine.Scoring;

/// <summary>
/// Reads the recognised text of a transcription run folder. Its <c>lines.jsonl</c> holds one JSON
/// object per recognised line with at least <c>source</c> (image path relative to the input root,
/// '/' separators), <c>line</c> (0-based index within the source) and <c>text</c>.
/// </summary>
public static class RunReader
{
    public const string LinesFileName = "lines.jsonl";

    private const string Stage = "run";

    /// <summary>
    /// One hypothesis per source: its lines' texts in <c>line</c> order, joined with one space.
    /// Lines with empty text add nothing, so they cannot add a stray space to be scored as an error.
    /// Keys are the sources exactly as the run wrote them.
    /// </summary>
    /// <exception cref="InputException">Stage "run": no lines.jsonl, or a line that is not a valid record.</exception>
    public static IReadOnlyDictionary<string, string> ReadHypotheses(string runDir)
    {
        var bySource = new Dictionary<string, SortedDictionary<int, string>>(StringComparer.Ordinal);
        foreach (var record in ReadLines(runDir))
        {
            if (!bySource.TryGetValue(record.Source, out var lines))
                bySource[record.Source] = lines = new SortedDictionary<int, string>();
            lines[record.Line] = record.Text;
        }

        return bySource.ToDictionary(
            pair => pair.Key,
            pair => string.Join(' ', pair.Value.Values.Where(text => text.Length > 0)),
            StringComparer.Ordinal);
    }

    /// <summary>
    /// Every recognised line of the run in file order, with its confidence when the record has one (a run
    /// written by <c>transcribe</c> always does).
    /// </summary>
    /// <exception cref="InputException">Stage "run": no lines.jsonl, a record that is not valid, or a line given twice.</exception>
    public static IReadOnlyList<RunLine> ReadLines(string runDir)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        var bytes = ReadLinesFile(runDir, out var file);

        var result = new List<RunLine>();
        var seen = new HashSet<(string, int)>();
        var lineNumber = 0;
        foreach (var raw in ByteLines.Split(bytes))
        {
            lineNumber++;
            if (raw.Span.Trim(" \t"u8).Length == 0)
                continue;
            var record = ParseRecord(file, lineNumber, raw);
            if (!seen.Add((record.Source, record.Line)))
                throw Error(file, lineNumber, $"source '{record.Source}' has line {record.Line} twice");
            result.Add(record);
        }
        return result;
    }

    private static RunLine ParseRecord(string file, int lineNumber, ReadOnlyMemory<byte> raw)
    {
        try
        {
            // JsonDocument checks UTF-8 itself, so the bytes go in undecoded.
            using var doc = JsonDocument.Parse(raw);
            var root = doc.RootElement;
            if (root.ValueKind != JsonValueKind.Object)
                throw Error(file, lineNumber, $"expected a JSON object, found {root.ValueKind}");

            if (!root.TryGetProperty("source", out var source) || source.ValueKind != JsonValueKind.String
                || source.GetString() is not { Length: > 0 } sourceText)
                throw Error(file, lineNumber, "'source' must be a non-empty string");
            if (!root.TryGetProperty("line", out var line) || line.ValueKind != JsonValueKind.Number
                || !line.TryGetInt32(out var index) || index < 0)
                throw Error(file, lineNumber, "'line' must be a whole number, 0 or more");
            if (!root.TryGetProperty("text", out var text) || text.ValueKind != JsonValueKind.String)
                throw Error(file, lineNumber, "'text' must be a string");
            double? confidence = root.TryGetProperty("confidence", out var c) && c.ValueKind == JsonValueKind.Number
                && c.TryGetDouble(out var value) && double.IsFinite(value) ? value : null;
            return new RunLine(sourceText, index, text.GetString()!, confidence);
        }
        catch (JsonException e)
        {
            throw Error(file, lineNumber, $"not valid JSON: {e.Message}", e);
        }
        catch (InvalidOperationException e)
        {
            // GetString throws this for an escaped lone surrogate.
            throw Error(file, lineNumber, $"invalid text: {e.Message}", e);
        }
    }

    private static InputException Error(string file, int lineNumber, string reason, Exception? inner = null) =>
        new(file, Stage, $"line {lineNumber}: {reason}", inner);

    /// <summary>The bytes of a run's <c>lines.jsonl</c>, for every reader of it.</summary>
    /// <exception cref="InputException">Stage "run": the file is missing or cannot be read.</exception>
    internal static byte[] ReadLinesFile(string runDir, out string file)
    {
        file = Path.Combine(runDir, LinesFileName);
        try
        {
            return File.ReadAllBytes(file);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or NotSupportedException)
        {
            var reason = e is FileNotFoundException or DirectoryNotFoundException
                ? $"no {LinesFileName} in the run folder"
                : $"cannot read {LinesFileName}: {e.Message}";
            throw new InputException(file, Stage, reason, e);
        }
    }
}
