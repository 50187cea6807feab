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
    public static ScoreReport ScoreRun(string truthTsv, string runDir)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(truthTsv);
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);

        var manifest = Manifest.Read(truthTsv);
        if (manifest.Errors.Count > 0)
        {
            var problems = string.Join("; ", manifest.Errors.Select(e => e.Reason));
            throw new InputException(truthTsv, "manifest",
                $"{manifest.Errors.Count} problem(s) in the truth file, fix them before scoring: {problems}");
        }

        var hypotheses = ByCanonicalPath(runDir, RunReader.ReadHypotheses(runDir));
        return Score(manifest.Entries.Select(entry => new ScoreItem(
            entry.RelativePath,
            entry.Text,
            hypotheses.GetValueOrDefault(entry.RelativePath))));
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
