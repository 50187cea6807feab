using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Review;

/// <summary>Reads a run's <c>lines.jsonl</c> record by record, keeping every field (see <see cref="RunRecord"/>).</summary>
public static class RunRecords
{
    private const string Stage = "run";

    /// <exception cref="InputException">Stage "run": no lines.jsonl, a record that is not valid, a source that is not a
    /// relative path, or a line given twice.</exception>
    public static IReadOnlyList<RunRecord> Read(string runDir)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        var bytes = RunReader.ReadLinesFile(runDir, out var file);

        var records = new List<RunRecord>();
        var seen = new HashSet<(string, int)>();
        var number = 0;
        var utf8 = new UTF8Encoding(false, throwOnInvalidBytes: true);
        foreach (var raw in ByteLines.Split(bytes))
        {
            number++;
            if (raw.Span.Trim(" \t"u8).Length == 0)
                continue;
            JsonObject fields;
            string text;
            try
            {
                text = utf8.GetString(raw.Span);
                fields = JsonNode.Parse(text) as JsonObject ?? throw Error(file, number, "expected a JSON object");
            }
            catch (Exception e) when (e is JsonException or DecoderFallbackException)
            {
                throw Error(file, number, $"not valid JSON: {e.Message}", e);
            }
            var source = Text(fields, "source");
            if (source is not { Length: > 0 })
                throw Error(file, number, "'source' must be a non-empty string");
            // Sources name files under the images folder and the run folder: one leading outside either is refused.
            if (!RelativePaths.TryCanonicalise(source, out _, out var why))
                throw Error(file, number, $"source '{source}': {why}");
            if (fields["line"] is not JsonValue lineValue || !lineValue.TryGetValue<int>(out var line) || line < 0)
                throw Error(file, number, "'line' must be a whole number, 0 or more");
            if (Text(fields, "text") is null)
                throw Error(file, number, "'text' must be a string");
            if (!seen.Add((source, line)))
                throw Error(file, number, $"source '{source}' has line {line} twice");
            records.Add(new RunRecord(text, fields, source, line));
        }
        return records;
    }

    private static string? Text(JsonObject fields, string name) =>
        fields[name] is JsonValue v && v.TryGetValue<string>(out var s) ? s : null;

    private static InputException Error(string file, int number, string reason, Exception? inner = null) =>
        new(file, Stage, $"line {number}: {reason}", inner);
}
