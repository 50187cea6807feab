using HandLine.Formats;

namespace HandLine.Scoring;

/// <summary>Scores transcripts against truth by CER (over NFC code points) and WER (over words).</summary>
public static class Scorer
{
    /// <summary>
    /// Scores each item. A null hypothesis is a line the run did not produce: scored against empty
    /// text, so every truth unit is a deletion, and marked <see cref="LineScore.Missing"/>.
    /// </summary>
    /// <exception cref="ArgumentException">An item is null, has a null id or truth, or repeats an id.</exception>
    public static ScoreReport Score(IEnumerable<ScoreItem> items)
    {
        ArgumentNullException.ThrowIfNull(items);
        var ids = new HashSet<string>(StringComparer.Ordinal);
        var lines = new List<LineScore>();
        foreach (var item in items)
        {
            ArgumentNullException.ThrowIfNull(item, nameof(items));
            if (item.Id is null || item.Truth is null)
                throw new ArgumentException("Every item needs an id and a truth text.", nameof(items));
            // Ids name lines in the report; a repeat would make it ambiguous which line a row is.
            if (!ids.Add(item.Id))
                throw new ArgumentException($"Id '{item.Id}' appears twice.", nameof(items));

            var hypothesis = item.Hypothesis ?? "";
            lines.Add(new LineScore(
                item.Id,
                item.Truth,
                item.Hypothesis,
                EditDistance.AlignCharacters(item.Truth, hypothesis),
                EditDistance.AlignWords(item.Truth, hypothesis),
                Missing: item.Hypothesis is null));
        }
        return new ScoreReport(lines);
    }

    /// <summary>
    /// Scores a run folder against a truth manifest. Entries are matched to run sources by canonical
    /// relative path ('/' separators, case-sensitive); a manifest entry with no run output is missing,
    /// and run sources that are not in the manifest are not scored.
    /// </summary>
    /// <exception cref="InputException">
    /// Stage "read" or "manifest" for the truth file (scoring needs a clean one: every problem is
    /// listed); stage "run" for the run folder.
    /// </exception>
    public static ScoreReport ScoreRun(string truthTsv, string runDir) => ScoreRun(truthTsv, runDir, []);

    /// <summary>
    /// As <see cref="ScoreRun(string, string)"/>, and split by each key in <paramref name="groupBy"/>
    /// (<see cref="ScoreReport.Breakdowns"/>, in the order given, repeats dropped): a key is an extra column
    /// of the manifest's <c>#columns</c> header, or <see cref="ScoreBreakdown.FolderKey"/>, which, unless the
    /// manifest has a column of that name, groups by each image's folder (<see cref="ScoreBreakdown.FolderOf"/>).
    /// </summary>
    /// <exception cref="InputException">As the other overload; also stage "manifest" for a key the manifest lacks.</exception>
    public static ScoreReport ScoreRun(string truthTsv, string runDir, IEnumerable<string> groupBy)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(truthTsv);
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        ArgumentNullException.ThrowIfNull(groupBy);
        var keys = groupBy.Distinct(StringComparer.Ordinal).ToArray();

        var manifest = Manifest.Read(truthTsv);
        if (manifest.Errors.Count > 0)
        {
            var problems = string.Join("; ", manifest.Errors.Select(e => e.Reason));
            throw new InputException(truthTsv, "manifest",
                $"{manifest.Errors.Count} problem(s) in the truth file, fix them before scoring: {problems}");
        }
        foreach (var key in keys)
        {
            ArgumentException.ThrowIfNullOrWhiteSpace(key, nameof(groupBy));
            if (key != ScoreBreakdown.FolderKey && !manifest.Columns.Contains(key))
                throw new InputException(truthTsv, "manifest", $"no column '{key}' to group by: " +
                    (manifest.Columns.Count == 0
                        ? $"the file has no {ManifestColumns.Marker} header"
                        : $"its columns are {string.Join(", ", manifest.Columns)}") +
                    $" ('{ScoreBreakdown.FolderKey}' groups by the images' folders)");
        }

        var hypotheses = ByCanonicalPath(runDir, RunReader.ReadHypotheses(runDir));
        var report = Score(manifest.Entries.Select(entry => new ScoreItem(
            entry.RelativePath,
            entry.Text,
            hypotheses.GetValueOrDefault(entry.RelativePath))));
        if (keys.Length == 0)
            return report;

        // Score keeps the input order, so line i is entry i.
        var values = keys.ToDictionary(key => key, IReadOnlyList<string> (key) => manifest.Entries
            .Select(entry => entry.Column(key) ?? ScoreBreakdown.FolderOf(entry.RelativePath)).ToArray(), StringComparer.Ordinal);
        var breakdowns = keys.Select(key => ScoreBreakdown.Of(key, report.PerLine.Select((line, i) => (line, values[key][i]))));
        return new ScoreReport(report.PerLine) { Breakdowns = breakdowns.ToArray(), GroupValues = values };
    }

    /// <summary>
    /// Re-keys run output by canonical path so "img/a.png", "img\a.png" and "./img/a.png" all meet the
    /// manifest's "img/a.png". Sources that cannot be canonicalised cannot match and are left out.
    /// </summary>
    private static Dictionary<string, string> ByCanonicalPath(string runDir, IReadOnlyDictionary<string, string> hypotheses)
    {
        var result = new Dictionary<string, string>(StringComparer.Ordinal);
        var original = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var (source, text) in hypotheses)
        {
            if (!RelativePaths.TryCanonicalise(source, out var key, out _))
                continue;
            if (!original.TryAdd(key, source))
                throw new InputException(Path.Combine(runDir, RunReader.LinesFileName), "run",
                    $"sources '{original[key]}' and '{source}' name the same image");
            result[key] = text;
        }
        return result;
    }
}
