namespace HandLine.Scoring;

/// <summary>Scores of one line: character and word counts, and whether the run had no output for it.</summary>
public sealed record LineScore(
    string Id,
    string Truth,
    string? Hypothesis,
    EditCounts CharCounts,
    EditCounts WordCounts,
    bool Missing)
{
    /// <summary>Character error rate of this line; see <see cref="ErrorRate.Of"/> for an empty truth.</summary>
    public double Cer => ErrorRate.Of(CharCounts);

    /// <summary>Word error rate of this line; see <see cref="ErrorRate.Of"/> for an empty truth.</summary>
    public double Wer => ErrorRate.Of(WordCounts);
}
