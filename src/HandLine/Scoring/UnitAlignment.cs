namespace HandLine.Scoring;

/// <summary>
/// Where one optimal alignment puts each hypothesis unit: <see cref="HypothesisHits"/>[j] is true when
/// hypothesis unit j matches a truth unit exactly; <see cref="DeletionsBefore"/>[j] counts the truth units
/// left unmatched just before hypothesis unit j (index <c>hypothesis.Length</c> holds those at the end);
/// <see cref="TruthIndex"/>[j] is the truth unit that hypothesis unit j is paired with (hit or substitution), or
/// −1 when it is an insertion.
/// </summary>
public sealed record UnitAlignment(
    EditCounts Counts, IReadOnlyList<bool> HypothesisHits, IReadOnlyList<int> DeletionsBefore, IReadOnlyList<int> TruthIndex);
