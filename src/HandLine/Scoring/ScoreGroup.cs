namespace HandLine.Scoring;

/// <summary>
/// The pooled scores of the lines that share one value of a grouping key (a manifest column, or a folder):
/// summed character and word edit counts, so the group's CER is its errors over its own reference length.
/// </summary>
public sealed record ScoreGroup(string Value, int Lines, int MissingLines, EditCounts CharCounts, EditCounts WordCounts)
{
    /// <summary>Character errors / reference code points of the group (denominator floored at 1).</summary>
    public double Cer => ErrorRate.Of(CharCounts);

    /// <summary>Word errors / reference words of the group (denominator floored at 1).</summary>
    public double Wer => ErrorRate.Of(WordCounts);
}
