namespace HandLine.Scoring;

/// <summary>
/// Scores split by one key. A pooled CER hides a style the model cannot read when most lines are in styles
/// it reads well, so the breakdown also gives the worst group and the plain (unweighted) mean of the
/// groups' rates, where every group counts once whatever its size.
/// </summary>
public sealed class ScoreBreakdown
{
    /// <summary>The key <c>--by folder</c> groups by when the manifest has no column of that name.</summary>
    public const string FolderKey = "folder";

    /// <summary>The folder value of images at the top of the manifest's folder.</summary>
    public const string TopFolder = ".";

    private ScoreBreakdown(string key, IReadOnlyList<ScoreGroup> groups)
    {
        Key = key;
        Groups = groups;
        foreach (var g in groups)
        {
            CharCounts += g.CharCounts;
            WordCounts += g.WordCounts;
            Lines += g.Lines;
        }
        // Highest CER; ties go to the group with more errors, then by name, so the choice never depends on order.
        Worst = groups.OrderByDescending(g => g.Cer).ThenByDescending(g => g.CharCounts.Distance)
            .ThenBy(g => g.Value, StringComparer.Ordinal).FirstOrDefault();
        MeanCer = groups.Count == 0 ? 0 : groups.Average(g => g.Cer);
        MeanWer = groups.Count == 0 ? 0 : groups.Average(g => g.Wer);
    }

    /// <summary>What the lines were grouped by: a manifest column name or <see cref="FolderKey"/>.</summary>
    public string Key { get; }

    /// <summary>One group per distinct value, in ordinal order of the value.</summary>
    public IReadOnlyList<ScoreGroup> Groups { get; }

    /// <summary>The group with the highest CER; null when there are no lines.</summary>
    public ScoreGroup? Worst { get; }

    /// <summary>Unweighted mean of the groups' CERs.</summary>
    public double MeanCer { get; }

    /// <summary>Unweighted mean of the groups' WERs.</summary>
    public double MeanWer { get; }

    public int Lines { get; }

    /// <summary>Sum over the groups; equals the ungrouped report's counts.</summary>
    public EditCounts CharCounts { get; }

    /// <summary>Sum over the groups; equals the ungrouped report's counts.</summary>
    public EditCounts WordCounts { get; }

    /// <summary>Pooled CER: the same figure as the ungrouped report's.</summary>
    public double Cer => ErrorRate.Of(CharCounts);

    /// <summary>Pooled WER: the same figure as the ungrouped report's.</summary>
    public double Wer => ErrorRate.Of(WordCounts);

    /// <summary>Groups scored lines by the value each is given.</summary>
    /// <exception cref="ArgumentException">The key is empty, or a line or value is null.</exception>
    public static ScoreBreakdown Of(string key, IEnumerable<(LineScore Line, string Value)> lines)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(key);
        ArgumentNullException.ThrowIfNull(lines);
        var byValue = new SortedDictionary<string, (int Lines, int Missing, EditCounts Chars, EditCounts Words)>(StringComparer.Ordinal);
        foreach (var (line, value) in lines)
        {
            ArgumentNullException.ThrowIfNull(line, nameof(lines));
            ArgumentNullException.ThrowIfNull(value, nameof(lines));
            var sum = byValue.GetValueOrDefault(value);
            byValue[value] = (sum.Lines + 1, sum.Missing + (line.Missing ? 1 : 0), sum.Chars + line.CharCounts, sum.Words + line.WordCounts);
        }
        return new ScoreBreakdown(key,
            byValue.Select(p => new ScoreGroup(p.Key, p.Value.Lines, p.Value.Missing, p.Value.Chars, p.Value.Words)).ToArray());
    }

    /// <summary>
    /// The folder of a canonical manifest path: everything before its last '/', e.g. "valid/lines" for
    /// "valid/lines/000001.png", or <see cref="TopFolder"/> for a file at the top.
    /// </summary>
    public static string FolderOf(string relativePath)
    {
        ArgumentNullException.ThrowIfNull(relativePath);
        var slash = relativePath.LastIndexOf('/');
        return slash > 0 ? relativePath[..slash] : TopFolder;
    }
}
