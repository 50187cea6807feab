namespace HandLine.Batch;

/// <summary>
/// Outcome of <see cref="RunMerge.Merge"/>. When <see cref="Conflicts"/> is not empty nothing was written; each
/// entry names the run folder and the problem.
/// </summary>
public sealed record MergeResult(int Runs, int Sources, int Lines, int Errors, IReadOnlyList<string> Conflicts)
{
    public bool Merged => Conflicts.Count == 0;
}
