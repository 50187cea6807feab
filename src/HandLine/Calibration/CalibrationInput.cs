using System.Text.Json;
using HandLine.Decoding;
using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Calibration;

/// <summary>
/// Pairs a run's lines.jsonl (text, line confidence and per-character confidences) with a truth manifest. Each
/// source's lines are joined with one space, as <see cref="Scorer"/> does, and aligned to its truth; a hypothesis
/// character is right when the alignment makes it a hit. Errors go to the line that holds the character (a
/// deletion to the line of the character after it; the joining space belongs to the line after it).
/// </summary>
public static class CalibrationInput
{
    private const string Stage = "run";

    public sealed record Result(IReadOnlyList<CalibrationLine> Lines, int UnmatchedTruthSources, int UnmatchedErrors);

    /// <summary>One recognised line as the run reported it: index within its source, text and confidences.</summary>
    public sealed record RunLine(int Line, string Text, double Confidence, IReadOnlyList<double> Chars);

    /// <exception cref="InputException">The truth file has problems, or lines.jsonl is missing or malformed.</exception>
    public static Result Load(string truthTsv, string runDir)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(truthTsv);
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        var manifest = Manifest.Read(truthTsv);
        if (manifest.Errors.Count > 0)
            throw new InputException(truthTsv, "manifest",
                $"{manifest.Errors.Count} problem(s) in the truth file: {string.Join("; ", manifest.Errors.Select(e => e.Reason))}");
        var run = ReadRun(runDir);

        var lines = new List<CalibrationLine>();
        int unmatched = 0, unmatchedErrors = 0;
        foreach (var entry in manifest.Entries)
        {
            if (!run.TryGetValue(entry.RelativePath, out var runLines))
            {
                unmatched++;
                unmatchedErrors += TextUnits.CodePoints(entry.Text).Length;
                continue;
            }
            lines.AddRange(ForSource(entry.RelativePath, entry.Text, runLines));
        }
        return new Result(lines, unmatched, unmatchedErrors);
    }

    /// <summary>The same for decoder output held in memory: the hypotheses of one source's lines, top to bottom.</summary>
    public static IReadOnlyList<CalibrationLine> ForSource(string id, string truth, IReadOnlyList<Hypothesis> lines)
    {
        ArgumentNullException.ThrowIfNull(lines);
        return ForSource(id, truth, lines.Select((h, k) => new RunLine(k, h.Text, h.Confidence, h.Chars.Select(c => c.Confidence).ToArray())));
    }

    /// <summary>Aligns one source's recognised lines (joined with one space) to its truth; one result per line.</summary>
    public static IReadOnlyList<CalibrationLine> ForSource(string id, string truth, IEnumerable<RunLine> runLines)
    {
        ArgumentNullException.ThrowIfNull(id);
        ArgumentNullException.ThrowIfNull(truth);
        ArgumentNullException.ThrowIfNull(runLines);
        var lines = new List<CalibrationLine>();
        var ordered = runLines.OrderBy(l => l.Line).ToArray();
        // Hypothesis code points with their line and confidence (NaN for a joining space).
        var units = new List<int>();
        var lineOf = new List<int>();
        var confidence = new List<double>();
        for (var i = 0; i < ordered.Length; i++)
        {
            var cps = TextUnits.CodePoints(ordered[i].Text);
            if (cps.Length == 0) continue;
            if (units.Count > 0) { units.Add(' '); lineOf.Add(i); confidence.Add(double.NaN); }
            for (var j = 0; j < cps.Length; j++) { units.Add(cps[j]); lineOf.Add(i); confidence.Add(ordered[i].Chars[j]); }
        }
        var alignment = EditDistance.Trace<int>(TextUnits.CodePoints(truth), units.ToArray());
        var errors = new int[ordered.Length];
        var charConf = ordered.Select(_ => new List<double>()).ToArray();
        var charOk = ordered.Select(_ => new List<bool>()).ToArray();
        for (var j = 0; j <= units.Count; j++)
        {
            var line = j < units.Count ? lineOf[j] : ordered.Length - 1;
            errors[line] += alignment.DeletionsBefore[j];
            if (j == units.Count) continue;
            var hit = alignment.HypothesisHits[j];
            if (!hit) errors[line]++;
            if (!double.IsNaN(confidence[j])) { charConf[line].Add(confidence[j]); charOk[line].Add(hit); }
        }
        for (var i = 0; i < ordered.Length; i++)
        {
            var lineId = ordered.Length == 1 ? id : $"{id}#{ordered[i].Line}";
            lines.Add(new CalibrationLine(lineId, ordered[i].Confidence, charConf[i], charOk[i], errors[i]));
        }
        return lines;
    }

    private static Dictionary<string, List<RunLine>> ReadRun(string runDir)
    {
        var file = Path.Combine(runDir, RunReader.LinesFileName);
        string[] raw;
        try
        {
            raw = File.ReadAllLines(file);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or NotSupportedException)
        {
            throw new InputException(file, Stage, e is FileNotFoundException or DirectoryNotFoundException
                ? $"no {RunReader.LinesFileName} in the run folder" : $"cannot read {RunReader.LinesFileName}: {e.Message}", e);
        }

        var bySource = new Dictionary<string, List<RunLine>>(StringComparer.Ordinal);
        for (var n = 0; n < raw.Length; n++)
        {
            if (raw[n].Trim().Length == 0) continue;
            InputException Bad(string reason) => new(file, Stage, $"line {n + 1}: {reason}");
            try
            {
                using var doc = JsonDocument.Parse(raw[n]);
                var root = doc.RootElement;
                var source = root.GetProperty("source").GetString() ?? throw Bad("'source' is missing");
                if (!RelativePaths.TryCanonicalise(source, out var key, out _)) continue;
                var text = root.GetProperty("text").GetString() ?? throw Bad("'text' is missing");
                var confidence = root.GetProperty("confidence").GetDouble();
                var chars = root.GetProperty("chars").EnumerateArray().Select(c => c.GetProperty("confidence").GetDouble()).ToArray();
                if (chars.Length != TextUnits.CodePoints(text).Length)
                    throw Bad($"'chars' has {chars.Length} entries but the text has {TextUnits.CodePoints(text).Length} characters");
                if (confidence is < 0 or > 1 || chars.Any(c => c is < 0 or > 1)) throw Bad("a confidence is outside [0, 1]");
                if (!bySource.TryGetValue(key, out var list)) bySource[key] = list = [];
                list.Add(new RunLine(root.GetProperty("line").GetInt32(), text, confidence, chars));
            }
            catch (Exception e) when (e is JsonException or KeyNotFoundException or InvalidOperationException or FormatException)
            {
                throw Bad($"not a transcription record with confidences: {e.Message}");
            }
        }
        return bySource;
    }
}
