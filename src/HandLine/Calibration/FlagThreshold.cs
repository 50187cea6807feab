namespace HandLine.Calibration;

/// <summary>
/// The smallest <c>--flag-below</c> value whose flagged lines (confidence below it) hold at least
/// <see cref="Target"/> of all character errors, and what it flags and catches.
/// </summary>
public sealed record FlagThreshold(double Target, double FlagBelow, int FlaggedLines, int TotalLines, int CaughtErrors, int TotalErrors)
{
    public double CaughtShare => TotalErrors == 0 ? 1 : (double)CaughtErrors / TotalErrors;

    public double FlaggedShare => TotalLines == 0 ? 0 : (double)FlaggedLines / TotalLines;
}
