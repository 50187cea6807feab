namespace HandLine.Adaptation;

/// <summary>
/// What an adaptation did: the corrected lines trained on and held back, the general lines replayed, the held-back
/// CER before and after (greedy decoding, as training validates), whether it was refused (the held-back lines read
/// worse: nothing written) or stopped, the model written and the re-read run's counts.
/// </summary>
public sealed record AdaptResult(
    int TrainedLines,
    int HeldBackLines,
    int ReplayLines,
    double HeldBackCerBefore,
    double HeldBackCerAfter,
    bool Refused,
    bool Cancelled,
    string? ModelPath,
    string? ModelId,
    bool ModelReused,
    double TrainingMinutes,
    int SkippedLines)
{
    /// <summary>Sources in the re-read run, those read again by the adapted model, its lines and errors.</summary>
    public int Sources { get; init; }
    public int SourcesRead { get; init; }
    public int Lines { get; init; }
    public int Flagged { get; init; }
    public int Errors { get; init; }
    public double ReReadSeconds { get; init; }
}
