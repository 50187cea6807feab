namespace HandLine.Calibration;

/// <summary>
/// One recognised line with its truth-derived facts: the line confidence, each character's confidence and whether
/// the alignment to the truth made it a hit, and the character errors (substitutions, insertions, deletions)
/// that reviewing this line would catch.
/// </summary>
public sealed record CalibrationLine(string Id, double Confidence, IReadOnlyList<double> CharConfidences, IReadOnlyList<bool> CharCorrect, int Errors)
{
    public bool ExactlyRight => Errors == 0;
}
