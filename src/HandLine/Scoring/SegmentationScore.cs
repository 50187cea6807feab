using System.Text.Json;
using HandLine.Formats;

namespace HandLine.Scoring;

/// <summary>One page's line detection: truth boxes, found boxes, and how many matched one to one at IoU ≥ the threshold.</summary>
public sealed record PageSegmentationScore(string Page, int Truth, int Found, int Matched, double MeanIoU, bool Missing);

/// <summary>
/// Line detection against truth boxes, over pages: precision (matched / found), recall (matched / truth) and F1
/// (their harmonic mean). Boxes are matched one to one, greedily by decreasing IoU (intersection over union), and a
/// pair counts only at IoU ≥ <see cref="Threshold"/> (0.5, the usual detection criterion: common practice, no source).
/// </summary>
public sealed record SegmentationScore(IReadOnlyList<PageSegmentationScore> Pages, double Threshold)
{
    public int Truth => Pages.Sum(p => p.Truth);
    public int Found => Pages.Sum(p => p.Found);
    public int Matched => Pages.Sum(p => p.Matched);
    public double Precision => Found == 0 ? 0 : (double)Matched / Found;
    public double Recall => Truth == 0 ? 0 : (double)Matched / Truth;
    public double F1 => Precision + Recall == 0 ? 0 : 2 * Precision * Recall / (Precision + Recall);

    public const double DefaultThreshold = 0.5;

    /// <summary>
    /// Scores a run against a folder of truth box files (<see cref="BoxFile"/>, <c>*.tsv</c>, searched recursively).
    /// A truth file meets the run's page whose source, without its extension, is the file's path relative to the
    /// folder without <c>.tsv</c>, or failing that the only page of the same file name. The run is a
    /// <c>transcribe</c> folder (boxes from <c>lines.jsonl</c>) or a <c>segment</c> folder (<c>*.json</c>).
    /// </summary>
    /// <exception cref="InputException">A truth file is wrong (stage "boxes"), or the run holds no boxes (stage "run").</exception>
    public static SegmentationScore ScoreRun(string truthDir, string runDir, double threshold = DefaultThreshold)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(truthDir);
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        if (!Directory.Exists(truthDir))
            throw new InputException(truthDir, "boxes", "the truth folder does not exist");
        var found = ReadRunBoxes(runDir);
        var byName = found.Keys.GroupBy(k => Path.GetFileName(k), StringComparer.Ordinal)
            .Where(g => g.Count() == 1).ToDictionary(g => g.Key, g => g.Single(), StringComparer.Ordinal);
        var pages = new List<PageSegmentationScore>();
        var files = Directory.EnumerateFiles(truthDir, "*.tsv", SearchOption.AllDirectories).Order(StringComparer.Ordinal).ToArray();
        if (files.Length == 0)
            throw new InputException(truthDir, "boxes", "no truth box files (*.tsv) in the folder");
        foreach (var file in files)
        {
            var key = Path.ChangeExtension(Path.GetRelativePath(truthDir, file), null).Replace(Path.DirectorySeparatorChar, '/');
            var truth = BoxFile.Read(file);
            if (!found.TryGetValue(key, out var boxes) && byName.TryGetValue(Path.GetFileName(key), out var other))
                boxes = found[other];
            pages.Add(Match(key, truth, boxes, threshold));
        }
        return new SegmentationScore(pages, threshold);
    }

    /// <summary>One page: boxes matched one to one, best IoU first.</summary>
    public static PageSegmentationScore Match(string page, IReadOnlyList<LineBox> truth, IReadOnlyList<LineBox>? found, double threshold = DefaultThreshold)
    {
        ArgumentNullException.ThrowIfNull(truth);
        var f = found ?? [];
        var pairs = new List<(double IoU, int T, int F)>();
        for (var t = 0; t < truth.Count; t++)
            for (var k = 0; k < f.Count; k++)
            {
                var iou = truth[t].IoU(f[k]);
                if (iou >= threshold) pairs.Add((iou, t, k));
            }
        var usedT = new bool[truth.Count];
        var usedF = new bool[f.Count];
        int matched = 0;
        double sum = 0;
        foreach (var (iou, t, k) in pairs.OrderByDescending(p => p.IoU))
        {
            if (usedT[t] || usedF[k]) continue;
            usedT[t] = usedF[k] = true;
            matched++;
            sum += iou;
        }
        return new PageSegmentationScore(page, truth.Count, f.Count, matched, matched == 0 ? 0 : sum / matched, found is null);
    }

    /// <summary>The run's boxes per page, keyed by source without extension.</summary>
    private static Dictionary<string, IReadOnlyList<LineBox>> ReadRunBoxes(string runDir)
    {
        var result = new Dictionary<string, IReadOnlyList<LineBox>>(StringComparer.Ordinal);
        var jsonl = Path.Combine(runDir, RunReader.LinesFileName);
        if (File.Exists(jsonl))
        {
            var lists = new Dictionary<string, List<LineBox>>(StringComparer.Ordinal);
            var bytes = RunReader.ReadLinesFile(runDir, out var file);
            var n = 0;
            foreach (var raw in ByteLines.Split(bytes))
            {
                n++;
                if (raw.Span.Trim(" \t"u8).Length == 0) continue;
                try
                {
                    using var doc = JsonDocument.Parse(raw);
                    var root = doc.RootElement;
                    if (!root.TryGetProperty("source", out var s) || s.GetString() is not { } source) continue;
                    var key = Path.ChangeExtension(source, null);
                    if (!lists.TryGetValue(key, out var list)) lists[key] = list = [];
                    if (root.TryGetProperty("box", out var box)) list.Add(Box(box, file, n));
                }
                catch (JsonException e)
                {
                    throw new InputException(file, "run", $"line {n}: not valid JSON: {e.Message}", e);
                }
            }
            foreach (var (k, v) in lists) result[k] = v;
            return result;
        }
        if (!Directory.Exists(runDir))
            throw new InputException(runDir, "run", "the run folder does not exist");
        foreach (var file in Directory.EnumerateFiles(runDir, "*.json", SearchOption.AllDirectories))
        {
            try
            {
                using var doc = JsonDocument.Parse(File.ReadAllBytes(file));
                var root = doc.RootElement;
                if (root.ValueKind != JsonValueKind.Object || !root.TryGetProperty("source", out var s) || s.GetString() is not { } source
                    || !root.TryGetProperty("lines", out var lines) || lines.ValueKind != JsonValueKind.Array) continue;
                result[Path.ChangeExtension(source, null)] = lines.EnumerateArray().Select((l, i) => Box(l.GetProperty("box"), file, i + 1)).ToArray();
            }
            catch (Exception e) when (e is JsonException or KeyNotFoundException or IOException or InvalidOperationException)
            {
                throw new InputException(file, "run", $"not a segment file: {e.Message}", e);
            }
        }
        if (result.Count == 0)
            throw new InputException(runDir, "run", "no lines.jsonl and no segment files (*.json) in the run folder");
        return result;
    }

    private static LineBox Box(JsonElement box, string file, int line)
    {
        if (box.ValueKind != JsonValueKind.Array || box.GetArrayLength() != 4)
            throw new InputException(file, "run", $"line {line}: 'box' must be [x, y, w, h]");
        var v = box.EnumerateArray().Select(e => e.GetInt32()).ToArray();
        return new LineBox(v[0], v[1], v[2], v[3]);
    }
}
