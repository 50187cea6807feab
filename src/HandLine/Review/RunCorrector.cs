using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Nodes;
using HandLine.Batch;
using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Review;

/// <summary>
/// Applies an editor's corrections to a finished run: each corrected line's <c>text</c> becomes the editor's, the
/// machine's stays beside it (<c>machine_text</c>) with <c>corrected: true</c>; the source's <c>.txt</c> and
/// <c>lines.csv</c> follow; and <c>corrected/lines.tsv</c>, a ground-truth manifest of every corrected, legible line
/// with its crop under <c>corrected/lines/</c>, is written for <c>train</c>.
/// Everything is checked and computed before the first file is written: a correction naming a line the run does not
/// have, or whose machine text is not the run's (a file made on another run), stops it with nothing changed. Each
/// file is replaced atomically and only when its content changes, <c>lines.jsonl</c> last; so applying the same file
/// twice changes nothing, and applying it again after an interruption completes it.
/// </summary>
public static class RunCorrector
{
    public const string TruthFolderName = "corrected";
    public const string TruthManifestName = "lines.tsv";
    public const string CropFolderName = "lines";

    private const string Stage = "corrections";
    // A run made before rotation_deg existed keeps its layout.
    private const string CsvHeaderBeforeRotation = "source,line,text,confidence,flagged,deskew_deg,slant_deg";
    private static readonly UTF8Encoding Utf8 = new(false);

    private static readonly JsonSerializerOptions RecordJson = new() { Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    /// <param name="imagesRoot">The folder the run's sources are relative to (as for <c>sample --images</c>), for the crops.</param>
    /// <exception cref="InputException">The run or the corrections file cannot be read, a correction does not fit the
    /// run, an image is missing, or another process is writing the run folder. Nothing has been changed.</exception>
    public static CorrectionResult Apply(string runDir, string correctionsPath, string imagesRoot)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        ArgumentException.ThrowIfNullOrWhiteSpace(correctionsPath);
        ArgumentException.ThrowIfNullOrWhiteSpace(imagesRoot);
        if (!Directory.Exists(imagesRoot))
            throw new InputException(imagesRoot, Stage, "no such images folder (--images)");

        var corrections = CorrectionsFile.Read(correctionsPath);
        using var runLock = RunLock.Acquire(runDir);
        var records = RunRecords.Read(runDir);
        var index = new Dictionary<(string, int), int>();
        for (var i = 0; i < records.Count; i++)
            index[(records[i].Source, records[i].Line)] = i;

        var problems = new List<string>();
        var updated = records.ToArray();
        foreach (var c in corrections)
        {
            if (!index.TryGetValue((c.Source, c.Line), out var i))
            {
                problems.Add($"source '{c.Source}' line {c.Line} is not in the run");
                continue;
            }
            var before = records[i];
            if (!Same(c.Machine, before.MachineText))
            {
                problems.Add($"source '{c.Source}' line {c.Line}: the machine text in the file ('{c.Machine}') is not the run's ('{before.MachineText}'); were these corrections made on another run?");
                continue;
            }
            updated[i] = Corrected(before, c);
        }
        if (problems.Count > 0)
            throw new InputException(correctionsPath, Stage,
                $"{problems.Count} correction(s) do not fit the run in {runDir}, so nothing was changed: " + string.Join("; ", problems.Take(10))
                + (problems.Count > 10 ? $"; and {problems.Count - 10} more" : ""));

        // Everything to write, worked out before anything is written.
        var crops = TruthCrops(updated, imagesRoot, out var uncut);
        var manifest = Manifest(crops);
        var changed = Enumerable.Range(0, records.Count).Where(i => !ReferenceEquals(records[i], updated[i]) && records[i].Raw != updated[i].Raw).ToArray();
        var changedSources = changed.Select(i => records[i].Source).ToHashSet(StringComparer.Ordinal);
        var transcripts = updated.Where(r => changedSources.Contains(r.Source))
            .GroupBy(r => r.Source, StringComparer.Ordinal)
            .Select(g => (Path: TranscriptFile.FullPathFor(runDir, g.Key), Text: string.Join("\n", g.OrderBy(r => r.Line).Select(r => r.Text)) + "\n"))
            .ToArray();
        var csvPath = Path.Combine(runDir, "lines.csv");
        var csv = Csv(csvPath, updated);

        var truthDir = Path.Combine(runDir, TruthFolderName);
        foreach (var (relative, _, bytes) in crops)
            WriteIfChanged(Path.Combine(truthDir, relative.Replace('/', Path.DirectorySeparatorChar)), bytes);
        var manifestPath = Path.Combine(truthDir, TruthManifestName);
        WriteIfChanged(manifestPath, Utf8.GetBytes(manifest));
        var written = 0;
        foreach (var (path, text) in transcripts)
            written += WriteIfChanged(path, Utf8.GetBytes(text)) ? 1 : 0;
        if (csv is not null)
            WriteIfChanged(csvPath, Utf8.GetBytes(csv));
        // lines.jsonl last: it is the record of what has been applied.
        WriteIfChanged(Path.Combine(runDir, RunReader.LinesFileName), Utf8.GetBytes(string.Concat(updated.Select(r => r.Raw + "\n"))));

        return new CorrectionResult(corrections.Count, changed.Length, written, manifestPath, crops.Count,
            updated.Count(r => r.Corrected && r.Illegible), uncut);
    }

    private static bool Same(string a, string b) =>
        string.Equals(a.Normalize(NormalizationForm.FormC), b.Normalize(NormalizationForm.FormC), StringComparison.Ordinal);

    private static RunRecord Corrected(RunRecord before, Correction c)
    {
        var fields = (JsonObject)before.Fields.DeepClone();
        fields["text"] = c.Text;
        fields[RunRecordFields.MachineText] = before.MachineText;
        fields[RunRecordFields.Corrected] = true;
        fields[RunRecordFields.Illegible] = c.Illegible;
        var raw = fields.ToJsonString(RecordJson);
        return raw == before.Raw ? before : new RunRecord(raw, fields, before.Source, before.Line);
    }

    /// <summary>The crop of every corrected, legible line, named after its source and line so that names never shift.</summary>
    private static List<(string Relative, RunRecord Record, byte[] Bytes)> TruthCrops(IReadOnlyList<RunRecord> records, string imagesRoot, out int uncut)
    {
        uncut = 0;
        var images = new LineImages(imagesRoot, records);
        var crops = new List<(string, RunRecord, byte[])>();
        foreach (var r in records.Where(r => r.Corrected && !r.Illegible).OrderBy(r => r.Source, StringComparer.Ordinal).ThenBy(r => r.Line))
        {
            var image = images.Find(r)
                ?? throw new InputException(images.PathOf(r.Source), Stage, $"image of source '{r.Source}' not found under the images folder (--images); nothing was changed");
            if (image.WholePage)
            {
                // A whole page is no training line for line 3 of it.
                uncut++;
                continue;
            }
            RelativePaths.TryCanonicalise(r.Source, out var canonical, out _);
            var stem = canonical[..^Path.GetExtension(canonical).Length];
            var name = $"{CropFolderName}/{stem}.line{r.Line.ToString(CultureInfo.InvariantCulture)}{image.Extension}";
            crops.Add((name, r, image.Bytes));
        }
        return crops;
    }

    private static string Manifest(IEnumerable<(string Relative, RunRecord Record, byte[] Bytes)> crops)
    {
        var text = new StringBuilder();
        text.Append("# Ground truth from an editor's corrections (handline correct): each line image with its checked text.\n")
            .Append(ManifestColumns.Marker).Append("\tpath\ttext\tsource\tline\tmachine\n");
        foreach (var (relative, r, _) in crops)
            text.Append(relative).Append('\t').Append(r.Text).Append('\t').Append(Field(r.Source)).Append('\t')
                .Append(r.Line.ToString(CultureInfo.InvariantCulture)).Append('\t').Append(Field(r.MachineText)).Append('\n');
        return text.ToString();
    }

    /// <summary>A manifest field cannot hold a tab or line break.</summary>
    private static string Field(string value) => value.Replace('\t', ' ').Replace('\r', ' ').Replace('\n', ' ');

    /// <summary>lines.csv again from the records, or null when the run has none or one of another layout (left alone).</summary>
    private static string? Csv(string path, IReadOnlyList<RunRecord> records)
    {
        if (!File.Exists(path))
            return null;
        string? header;
        using (var reader = new StreamReader(path))
            header = reader.ReadLine();
        if (header is not (RunReports.CsvHeader or CsvHeaderBeforeRotation))
            return null;
        var rotation = header == RunReports.CsvHeader;
        var text = new StringBuilder(header).Append('\n');
        foreach (var r in records)
        {
            text.Append(RunReports.CsvField(r.Source)).Append(',').Append(r.Line.ToString(CultureInfo.InvariantCulture)).Append(',')
                .Append(RunReports.CsvField(r.Text)).Append(',').Append(Number(r.Fields["confidence"])).Append(',')
                .Append(r.Flagged ? "true" : "false").Append(',').Append(Number(r.Fields["deskew_deg"])).Append(',')
                .Append(Number(r.Fields["slant_deg"]));
            if (rotation) text.Append(',').Append(Number(r.Fields["rotation_deg"]));
            text.Append('\n');
        }
        return text.ToString();
    }

    private static string Number(JsonNode? node) =>
        node is JsonValue v && v.TryGetValue<double>(out var d) ? d.ToString(CultureInfo.InvariantCulture) : "";

    /// <returns>True when the file was written.</returns>
    private static bool WriteIfChanged(string path, byte[] bytes)
    {
        if (File.Exists(path) && File.ReadAllBytes(path).AsSpan().SequenceEqual(bytes))
            return false;
        Directory.CreateDirectory(Path.GetDirectoryName(Path.GetFullPath(path))!);
        AtomicFile.WriteAllBytes(path, bytes);
        return true;
    }
}
