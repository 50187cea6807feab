using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>
/// Draws a random proof sample of recognised lines from a finished run, stratified by source folder (each
/// volume gets its share, <see cref="StratifiedAllocation"/>), and lays it out for keying:
/// <c>lines/NNNN.png</c> crops, <c>keying.tsv</c> (a truth manifest whose transcript column is empty),
/// <c>machine/lines.jsonl</c> (the machine's text of the same crops, shaped as a run folder so that
/// <c>score --run</c> reads it) and <c>sample.json</c> (what was drawn, from what, with which seed).
/// </summary>
public static class ProofSampler
{
    public const string KeyingFileName = "keying.tsv";
    public const string MachineFolderName = "machine";
    public const string CropFolderName = "lines";
    public const string SampleFileName = "sample.json";

    private const string Stage = "sample";

    /// <exception cref="InputException">The run cannot be read or has no lines, an image is missing, or the
    /// output folder already holds a sample (a keyed manifest must never be overwritten).</exception>
    /// <exception cref="ArgumentException">Bad options, or more lines asked for than the run has.</exception>
    public static ProofSample Draw(string runDir, string outDir, ProofSampleOptions options)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        ArgumentException.ThrowIfNullOrWhiteSpace(outDir);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();

        var keying = Path.Combine(outDir, KeyingFileName);
        if (File.Exists(keying))
            throw new InputException(keying, Stage, "the output folder already holds a sample (perhaps keyed): choose another folder");
        if (!Directory.Exists(options.ImagesRoot))
            throw new InputException(options.ImagesRoot, Stage, "no such images folder (--images)");

        var all = RunReader.ReadLines(runDir);
        if (all.Count == 0)
            throw new InputException(Path.Combine(runDir, RunReader.LinesFileName), "run", "the run has no recognised lines");
        var linesPerSource = all.GroupBy(l => l.Source, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.Count(), StringComparer.Ordinal);

        var strata = all
            .GroupBy(l => ScoreBreakdown.FolderOf(Canonical(runDir, l.Source)), StringComparer.Ordinal)
            .OrderBy(g => g.Key, StringComparer.Ordinal)
            .Select(g => (Folder: g.Key, Lines: g.OrderBy(l => l.Source, StringComparer.Ordinal).ThenBy(l => l.Line).ToArray()))
            .ToArray();
        var drawn = new List<(RunLine Line, string Folder)>();
        if (options.Pick is { } pick)
        {
            var byKey = all.ToDictionary(l => (l.Source, l.Line));
            foreach (var c in LinePicker.Pick(LinePicker.ReadCandidates(runDir), pick, options.Seed))
                drawn.Add((byKey[(c.Source, c.Line)], ScoreBreakdown.FolderOf(Canonical(runDir, c.Source))));
            if (drawn.Count == 0)
                throw new InputException(Path.Combine(runDir, RunReader.LinesFileName), "run", "every line of the run has been checked already: nothing to pick");
        }
        var shares = options.Pick is null
            ? StratifiedAllocation.Allocate(strata.Select(s => s.Lines.Length).ToArray(), options.SizeFor(all.Count))
            : new int[strata.Length];

        // One generator walks the strata in name order, so the same seed and run always give the same sample.
        var random = new Random(options.Seed);
        for (var s = 0; s < strata.Length; s++)
        {
            var pool = (RunLine[])strata[s].Lines.Clone();
            // Partial Fisher-Yates shuffle: the first k places end up a uniform random k-subset.
            for (var i = 0; i < shares[s]; i++)
            {
                var j = random.Next(i, pool.Length);
                (pool[i], pool[j]) = (pool[j], pool[i]);
                drawn.Add((pool[i], strata[s].Folder));
            }
        }
        drawn.Sort((a, b) => a.Line.Source != b.Line.Source
            ? string.CompareOrdinal(a.Line.Source, b.Line.Source)
            : a.Line.Line.CompareTo(b.Line.Line));

        Directory.CreateDirectory(Path.Combine(outDir, CropFolderName));
        Directory.CreateDirectory(Path.Combine(outDir, MachineFolderName));
        var sampled = new List<SampledLine>();
        for (var i = 0; i < drawn.Count; i++)
        {
            var (line, folder) = drawn[i];
            var image = Path.Combine(options.ImagesRoot, line.Source);
            if (!File.Exists(image))
                throw new InputException(image, Stage, $"image of source '{line.Source}' not found under the images folder (--images)");
            var stem = Path.Combine(CropFolderName, (i + 1).ToString("0000", CultureInfo.InvariantCulture)).Replace('\\', '/');
            var crop = linesPerSource[line.Source] == 1 ? null : LineCrops.TryCut(image, line.Line, linesPerSource[line.Source]);
            string cropPath;
            if (crop is null)
            {
                // A line image is its own crop; a page whose lines cannot be found again goes whole, marked so.
                cropPath = stem + Path.GetExtension(line.Source).ToLowerInvariant();
                AtomicFile.WriteAllBytes(Path.Combine(outDir, cropPath), File.ReadAllBytes(image));
            }
            else
            {
                cropPath = stem + ".png";
                AtomicFile.WriteAllBytes(Path.Combine(outDir, cropPath), crop);
            }
            sampled.Add(new SampledLine(cropPath, line.Source, line.Line, folder, line.Text, line.Confidence,
                WholeImage: crop is null && linesPerSource[line.Source] > 1));
        }

        var counts = drawn.GroupBy(d => d.Folder, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.Count(), StringComparer.Ordinal);
        var sample = new ProofSample(sampled,
            strata.Select(s => (s.Folder, s.Lines.Length, counts.GetValueOrDefault(s.Folder))).ToArray());
        AtomicFile.WriteAllText(Path.Combine(outDir, MachineFolderName, RunReader.LinesFileName), MachineLines(sampled));
        AtomicFile.WriteAllText(Path.Combine(outDir, SampleFileName), Summary(runDir, options, all.Count, sample));
        // The keying manifest last: its presence says the sample is complete.
        AtomicFile.WriteAllText(keying, KeyingManifest(sampled, options.WithMachineText));
        return sample;
    }

    private static string Canonical(string runDir, string source) =>
        RelativePaths.TryCanonicalise(source, out var canonical, out var reason)
            ? canonical
            : throw new InputException(Path.Combine(runDir, RunReader.LinesFileName), "run", $"source '{source}': {reason}");

    private static string KeyingManifest(IReadOnlyList<SampledLine> lines, bool withMachineText)
    {
        var text = new StringBuilder();
        text.Append("# Proof sample for keying: type what each image in column 'path' says into column 'text' (after the first tab).\n");
        text.Append("# Type exactly what is written; leave a line empty only if the image holds no text. Do not change the other columns.\n");
        text.Append(ManifestColumns.Marker).Append("\tpath\ttext\tfolder\tsource\tline\tcrop");
        if (withMachineText)
            text.Append("\tmachine");
        text.Append('\n');
        foreach (var l in lines)
        {
            text.Append(l.CropPath).Append("\t\t").Append(Field(l.Folder)).Append('\t').Append(Field(l.Source)).Append('\t')
                .Append(l.Line.ToString(CultureInfo.InvariantCulture)).Append('\t').Append(l.WholeImage ? "page" : "line");
            if (withMachineText)
                text.Append('\t').Append(Field(l.MachineText));
            text.Append('\n');
        }
        return text.ToString();
    }

    /// <summary>A manifest field cannot hold a tab or line break; a run's text never does, a file name might.</summary>
    private static string Field(string value) => value.Replace('\t', ' ').Replace('\r', ' ').Replace('\n', ' ');

    private static readonly JsonWriterOptions JsonOptions = new()
    {
        Indented = false,
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    private static string MachineLines(IReadOnlyList<SampledLine> lines)
    {
        var text = new StringBuilder();
        foreach (var l in lines)
        {
            using var buffer = new MemoryStream();
            using (var json = new Utf8JsonWriter(buffer, JsonOptions))
            {
                json.WriteStartObject();
                json.WriteString("source", l.CropPath);
                json.WriteNumber("line", 0);
                json.WriteString("text", l.MachineText);
                if (l.Confidence is { } c)
                    json.WriteNumber("confidence", c);
                json.WriteString("run_source", l.Source);
                json.WriteNumber("run_line", l.Line);
                json.WriteEndObject();
            }
            text.Append(Encoding.UTF8.GetString(buffer.ToArray())).Append('\n');
        }
        return text.ToString();
    }

    private static string Summary(string runDir, ProofSampleOptions options, int runLines, ProofSample sample)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer, JsonOptions with { Indented = true }))
        {
            json.WriteStartObject();
            json.WriteString("run", Path.GetFullPath(runDir));
            json.WriteString("images", Path.GetFullPath(options.ImagesRoot));
            json.WriteNumber("seed", options.Seed);
            if (options.Count is { } count) json.WriteNumber("count", count);
            if (options.Fraction is { } fraction) json.WriteNumber("fraction", fraction);
            if (options.Pick is { } pick) json.WriteNumber("pick", pick);
            json.WriteNumber("run_lines", runLines);
            json.WriteNumber("drawn", sample.Lines.Count);
            json.WriteNumber("whole_images", sample.Lines.Count(l => l.WholeImage));
            json.WriteBoolean("with_machine_text", options.WithMachineText);
            json.WriteStartArray("folders");
            foreach (var (folder, lines, drawn) in sample.Strata)
            {
                json.WriteStartObject();
                json.WriteString("folder", folder);
                json.WriteNumber("run_lines", lines);
                json.WriteNumber("drawn", drawn);
                json.WriteEndObject();
            }
            json.WriteEndArray();
            json.WriteEndObject();
        }
        return Encoding.UTF8.GetString(buffer.ToArray()) + "\n";
    }
}
