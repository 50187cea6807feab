namespace HandLine.Scoring;

/// <summary>One line to score. A null <paramref name="Hypothesis"/> means the run produced nothing for it.</summary>
public sealed record ScoreItem(string Id, string Truth, string? Hypothesis);
