namespace HandLine.Scoring;

/// <summary>
/// Per-line scores and their totals. Totals are micro-averaged: summed distances over summed truth
/// lengths, so a long line weighs more than a short one.
/// </summary>
public sealed class ScoreReport
{
    public ScoreReport(IEnumerable<LineScore> perLine)
    {
        ArgumentNullException.ThrowIfNull(perLine);
        PerLine = perLine.ToArray();
        foreach (var line in PerLine)
        {
            ArgumentNullException.ThrowIfNull(line, nameof(perLine));
            CharCounts += line.CharCounts;
            WordCounts += line.WordCounts;
            if (line.Missing)
                MissingLines++;
        }
    }

    /// <summary>Line scores in input order.</summary>
    public IReadOnlyList<LineScore> PerLine { get; }

    public EditCounts CharCounts { get; }

    public EditCounts WordCounts { get; }

    /// <summary>Sum of character distances / total truth code points (denominator floored at 1).</summary>
    public double Cer => ErrorRate.Of(CharCounts);

    /// <summary>Sum of word distances / total truth words (denominator floored at 1).</summary>
    public double Wer => ErrorRate.Of(WordCounts);

    public int Lines => PerLine.Count;

    /// <summary>Truth code points.</summary>
    public int Chars => CharCounts.TruthLength;

    /// <summary>Truth words.</summary>
    public int Words => WordCounts.TruthLength;

    public int Substitutions => CharCounts.Substitutions;

    public int Deletions => CharCounts.Deletions;

    public int Insertions => CharCounts.Insertions;

    public int WordSubstitutions => WordCounts.Substitutions;

    public int WordDeletions => WordCounts.Deletions;

    public int WordInsertions => WordCounts.Insertions;

    public int MissingLines { get; }

    /// <summary>
    /// Per breakdown key, the group value of each line in <see cref="PerLine"/> order (empty unless grouped), so
    /// figures per group (intervals, plots) can be drawn from the lines themselves.
    /// </summary>
    public IReadOnlyDictionary<string, IReadOnlyList<string>> GroupValues { get; init; } =
        new Dictionary<string, IReadOnlyList<string>>(StringComparer.Ordinal);

    /// <summary>
    /// The same lines split by one or more keys (empty unless asked for). Each breakdown must cover exactly
    /// these lines, so its groups add up to this report's counts.
    /// </summary>
    /// <exception cref="ArgumentException">A breakdown's totals differ from this report's.</exception>
    public IReadOnlyList<ScoreBreakdown> Breakdowns
    {
        get;
        init
        {
            ArgumentNullException.ThrowIfNull(value);
            foreach (var b in value)
            {
                ArgumentNullException.ThrowIfNull(b, nameof(value));
                if (b.Lines != Lines || b.CharCounts != CharCounts || b.WordCounts != WordCounts)
                    throw new ArgumentException($"The breakdown by '{b.Key}' does not cover the report's lines.", nameof(value));
            }
            field = value.ToArray();
        }
    } = [];
}
