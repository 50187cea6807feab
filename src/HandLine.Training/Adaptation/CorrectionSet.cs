using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json.Nodes;
using HandLine.Decoding;
using HandLine.Formats;
using HandLine.Recognition;
using HandLine.Review;

namespace HandLine.Adaptation;

/// <summary>
/// An editor's corrections checked against the run they were made on, before anything is trained or written: the
/// lines to train on (each with its image, cut from its page as <c>review</c> shows it) and, per source, the checked
/// lines the new run keeps as they are. The file is the review page's corrections TSV (<see cref="CorrectionsFile"/>)
/// or a manifest TSV of line images and their text (as <c>correct</c> or <c>sample</c> write them: columns
/// <c>source</c> and <c>line</c> name the run line; without them the image's path is the source, line 0).
/// </summary>
public sealed class CorrectionSet
{
    private const string Stage = "corrections";

    private CorrectionSet(string sha256, IReadOnlyList<AdaptationLine> lines, IReadOnlyDictionary<string, IReadOnlyDictionary<int, LineResult>> kept,
        IReadOnlyList<RunRecord> records, int illegible, int uncut, int unkeyed)
    {
        Sha256 = sha256;
        Lines = lines;
        Kept = kept;
        Records = records;
        Illegible = illegible;
        Uncut = uncut;
        Unkeyed = unkeyed;
    }

    /// <summary>SHA-256 of the corrections file's bytes.</summary>
    public string Sha256 { get; }

    /// <summary>Corrected, legible lines with their images, in source and line order.</summary>
    public IReadOnlyList<AdaptationLine> Lines { get; }

    /// <summary>Per source, the checked lines (by index) the re-read run keeps: this file's and those the run held already.</summary>
    public IReadOnlyDictionary<string, IReadOnlyDictionary<int, LineResult>> Kept { get; }

    /// <summary>Every record of the run, in its order.</summary>
    public IReadOnlyList<RunRecord> Records { get; }

    /// <summary>Corrections marked illegible (kept, not trained on).</summary>
    public int Illegible { get; }

    /// <summary>Corrected lines of pages whose lines could not be cut again (kept, not trained on).</summary>
    public int Uncut { get; }

    /// <summary>Manifest rows left empty (not keyed), skipped.</summary>
    public int Unkeyed { get; }

    /// <summary>Reads and checks the corrections against the run.</summary>
    /// <exception cref="InputException">The file or run cannot be read, or corrections do not fit the run (lines not
    /// in it, machine text not the run's, images missing): every problem is named, and nothing has been written.</exception>
    public static CorrectionSet Read(string runDir, string correctionsPath, string imagesRoot)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        ArgumentException.ThrowIfNullOrWhiteSpace(correctionsPath);
        ArgumentException.ThrowIfNullOrWhiteSpace(imagesRoot);
        if (!Directory.Exists(imagesRoot))
            throw new InputException(imagesRoot, Stage, "no such images folder (--images)");
        var bytes = InputFile.ReadAllBytes(correctionsPath, Stage, "corrections file");
        var sha = Convert.ToHexStringLower(SHA256.HashData(bytes));
        var records = RunRecords.Read(runDir);
        var index = records.ToDictionary(r => (r.Source, r.Line));

        var problems = new List<string>();
        var lines = new List<AdaptationLine>();
        var kept = new Dictionary<string, Dictionary<int, LineResult>>(StringComparer.Ordinal);
        int illegible = 0, uncut = 0, unkeyed = 0;
        void Keep(RunRecord r, string text, bool isIllegible)
        {
            if (!kept.TryGetValue(r.Source, out var bySource))
                kept[r.Source] = bySource = [];
            bySource[r.Line] = Result(r, text, isIllegible);
        }
        // Lines checked in an earlier round stay checked.
        foreach (var r in records.Where(r => r.Corrected))
            Keep(r, r.Text, r.Illegible);

        if (IsCorrectionsFile(bytes))
        {
            var images = new LineImages(imagesRoot, records);
            foreach (var c in CorrectionsFile.Read(correctionsPath))
            {
                if (!index.TryGetValue((c.Source, c.Line), out var r))
                {
                    problems.Add($"source '{c.Source}' line {c.Line} is not in the run");
                    continue;
                }
                if (!Same(c.Machine, r.MachineText))
                {
                    problems.Add($"source '{c.Source}' line {c.Line}: the machine text in the file ('{c.Machine}') is not the run's ('{r.MachineText}'); were these corrections made on another run?");
                    continue;
                }
                var image = images.Find(r);
                if (image is null)
                {
                    problems.Add($"source '{c.Source}': image not found at {images.PathOf(c.Source)}");
                    continue;
                }
                Keep(r, c.Text, c.Illegible);
                if (c.Illegible)
                    illegible++;
                else if (image.WholePage)
                    uncut++;
                else
                    lines.Add(new AdaptationLine(c.Source, c.Line, c.Text, image.Bytes, $"{images.PathOf(c.Source)} line {c.Line}"));
            }
        }
        else
        {
            var manifest = Manifest.Read(correctionsPath);
            foreach (var e in manifest.Errors)
                problems.Add(e.Reason.Contains(e.Path, StringComparison.Ordinal) ? e.Reason : $"{e.Path}: {e.Reason}");
            foreach (var e in manifest.Entries)
            {
                var source = e.Column("source") is { Length: > 0 } s ? s : e.RelativePath;
                var lineText = e.Column("line");
                var line = 0;
                if (lineText is { Length: > 0 } && !int.TryParse(lineText, NumberStyles.None, CultureInfo.InvariantCulture, out line))
                {
                    problems.Add($"row {e.LineNumber}: line '{lineText}' is not a whole number, 0 or more");
                    continue;
                }
                if (!index.TryGetValue((source, line), out var r))
                {
                    problems.Add($"row {e.LineNumber}: source '{source}' line {line} is not in the run");
                    continue;
                }
                if (e.Text.Length == 0)
                {
                    unkeyed++;
                    continue;
                }
                if (!File.Exists(e.FullPath))
                {
                    problems.Add($"row {e.LineNumber}: image not found at {e.FullPath}");
                    continue;
                }
                var text = e.Text.Normalize(NormalizationForm.FormC);
                Keep(r, text, false);
                if (e.Column("crop") == "page")
                    uncut++;
                else
                    lines.Add(new AdaptationLine(source, line, text, File.ReadAllBytes(e.FullPath), e.FullPath));
            }
        }
        if (problems.Count > 0)
            throw new InputException(correctionsPath, Stage,
                $"{problems.Count} correction(s) do not fit the run in {runDir}, so nothing was adapted or written: " + string.Join("; ", problems.Take(20))
                + (problems.Count > 20 ? $"; and {problems.Count - 20} more" : ""));
        var duplicates = lines.GroupBy(l => (l.Source, l.Line)).Where(g => g.Count() > 1).Select(g => $"source '{g.Key.Source}' line {g.Key.Line}").ToArray();
        if (duplicates.Length > 0)
            throw new InputException(correctionsPath, Stage, "a line is corrected twice: " + string.Join("; ", duplicates.Take(10)));

        return new CorrectionSet(sha,
            lines.OrderBy(l => l.Source, StringComparer.Ordinal).ThenBy(l => l.Line).ToArray(),
            kept.ToDictionary(p => p.Key, p => (IReadOnlyDictionary<int, LineResult>)p.Value, StringComparer.Ordinal),
            records, illegible, uncut, unkeyed);
    }

    /// <summary>The review page's export starts (after comments) with its own header row; a manifest never does.</summary>
    private static bool IsCorrectionsFile(byte[] bytes)
    {
        var header = string.Join('\t', CorrectionsFile.Columns);
        foreach (var raw in ByteLines.Split(bytes))
        {
            var row = Encoding.UTF8.GetString(raw.Span).TrimEnd('\r');
            if (row.Trim().Length == 0 || row.StartsWith('#'))
                continue;
            return row == header;
        }
        return false;
    }

    private static bool Same(string a, string b) =>
        string.Equals(a.Normalize(NormalizationForm.FormC), b.Normalize(NormalizationForm.FormC), StringComparison.Ordinal);

    /// <summary>Per source holding a checked line, all its lines as the run has them (checked lines with their new text).</summary>
    public IReadOnlyDictionary<string, IReadOnlyList<LineResult>> Earlier() =>
        Records.Where(r => Kept.ContainsKey(r.Source))
            .GroupBy(r => r.Source, StringComparer.Ordinal)
            .ToDictionary(g => g.Key, g => (IReadOnlyList<LineResult>)g.OrderBy(r => r.Line)
                .Select(r => Kept[g.Key].GetValueOrDefault(r.Line) ?? Result(r, r.Text, null)).ToArray(), StringComparer.Ordinal);

    /// <summary>
    /// A run record as a result the batch runner reports exactly as the run holds it; with <paramref name="isIllegible"/>
    /// a checked line, as <c>correct</c> leaves it.
    /// </summary>
    private static LineResult Result(RunRecord r, string text, bool? isIllegible)
    {
        var f = r.Fields;
        var chars = (f["chars"] as JsonArray ?? [])
            .OfType<JsonObject>()
            .Select(c => new CharConfidence(c["char"]?.GetValue<string>() ?? "", Number(c["confidence"]), 0, 0))
            .ToArray();
        var alternatives = (f["alternatives"] as JsonArray ?? [])
            .OfType<JsonObject>()
            .Select(a => new Alternative(a["text"]?.GetValue<string>() ?? "", Number(a["score"]), Number(a["share"])))
            .ToArray();
        return new LineResult(r.Source, r.Line, text, r.Confidence, r.Flagged, chars, Number(f["deskew_deg"]), Number(f["slant_deg"]))
        {
            Alternatives = alternatives,
            MachineText = isIllegible is null ? null : r.MachineText,
            Illegible = isIllegible,
            RotationDegrees = (int)Number(f["rotation_deg"]),
            Layout = f["layout"] is JsonValue layout ? layout.GetValue<string>() : null,
            Box = f["box"] is JsonArray box ? box.Select(x => (int)Number(x)).ToArray() : null,
            Column = f["column"] is JsonValue ? (int)Number(f["column"]) : null,
            Entry = f["entry"] is JsonValue ? (int)Number(f["entry"]) : null,
        };
    }

    private static double Number(JsonNode? node) =>
        node is JsonValue v && v.TryGetValue<double>(out var d) ? d : 0;
}
