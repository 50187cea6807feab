namespace HandLine.Scoring;

/// <summary>
/// Counts from one optimal alignment of a truth sequence against a hypothesis:
/// substitutions, deletions (truth units with no counterpart), insertions (extra hypothesis units)
/// and hits (units matched exactly).
/// </summary>
public readonly record struct EditCounts
{
    public EditCounts(int substitutions, int deletions, int insertions, int hits)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(substitutions);
        ArgumentOutOfRangeException.ThrowIfNegative(deletions);
        ArgumentOutOfRangeException.ThrowIfNegative(insertions);
        ArgumentOutOfRangeException.ThrowIfNegative(hits);
        Substitutions = substitutions;
        Deletions = deletions;
        Insertions = insertions;
        Hits = hits;
    }

    public int Substitutions { get; }

    public int Deletions { get; }

    public int Insertions { get; }

    public int Hits { get; }

    /// <summary>Levenshtein distance: S + D + I.</summary>
    public int Distance => Substitutions + Deletions + Insertions;

    /// <summary>Units in the truth: every truth unit is a hit, a substitution or a deletion.</summary>
    public int TruthLength => Hits + Substitutions + Deletions;

    /// <summary>Units in the hypothesis: every hypothesis unit is a hit, a substitution or an insertion.</summary>
    public int HypothesisLength => Hits + Substitutions + Insertions;

    /// <summary>Sums counts over lines; checked so a huge batch fails loudly instead of wrapping.</summary>
    public static EditCounts operator +(EditCounts a, EditCounts b) => new(
        checked(a.Substitutions + b.Substitutions),
        checked(a.Deletions + b.Deletions),
        checked(a.Insertions + b.Insertions),
        checked(a.Hits + b.Hits));
}
