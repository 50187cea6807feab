namespace HandLine.Review;

/// <summary>
/// What <see cref="RunCorrector.Apply"/> did: corrections read, run lines changed by them (0 when the same file is
/// applied again), transcript files rewritten, and the ground-truth manifest with its line count and the corrected
/// lines left out of it (illegible, or a page whose lines could not be cut again).
/// </summary>
public sealed record CorrectionResult(
    int Corrections, int LinesChanged, int TranscriptsWritten, string ManifestPath, int ManifestLines, int Illegible, int Uncut);
