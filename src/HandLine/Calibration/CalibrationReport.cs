namespace HandLine.Calibration;

/// <summary>How well a run's confidences predict correctness, and the review threshold for a chosen catch rate.</summary>
public sealed record CalibrationReport(
    ReliabilityTable Characters,
    ReliabilityTable Lines,
    FlagThreshold Threshold,
    int UnmatchedTruthSources,
    int UnmatchedErrors);
