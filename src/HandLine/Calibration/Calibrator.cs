namespace HandLine.Calibration;

/// <summary>Reliability of character and line confidences, and the line threshold that catches a share of the errors.</summary>
public static class Calibrator
{
    public const int DefaultBins = 10;
    public const double DefaultCatch = 0.9;

    /// <summary>
    /// Character table: every recognised character, right when the alignment made it a hit. Line table: the line
    /// confidence against "the line is exactly right". Threshold: see <see cref="ChooseThreshold"/>.
    /// </summary>
    public static CalibrationReport Evaluate(IReadOnlyList<CalibrationLine> lines, double catchShare = DefaultCatch, int bins = DefaultBins,
        int unmatchedTruthSources = 0, int unmatchedErrors = 0)
    {
        ArgumentNullException.ThrowIfNull(lines);
        var characters = ReliabilityTable.Build(
            lines.SelectMany(l => l.CharConfidences.Zip(l.CharCorrect, (c, ok) => (c, ok))), bins);
        var lineTable = ReliabilityTable.Build(lines.Select(l => (l.Confidence, l.ExactlyRight)), bins);
        return new CalibrationReport(characters, lineTable, ChooseThreshold(lines, catchShare), unmatchedTruthSources, unmatchedErrors);
    }

    /// <summary>
    /// Flagging is by line confidence, so the lines flagged by any threshold are a lowest-confidence group; the
    /// fewest lines that hold <paramref name="catchShare"/> of the errors are the shortest such group. Lines with
    /// equal confidence go together. The threshold is placed halfway to the next higher confidence (rounded to
    /// 5 places), so it still separates the groups after the 4-place rounding of the reports.
    /// </summary>
    public static FlagThreshold ChooseThreshold(IReadOnlyList<CalibrationLine> lines, double catchShare)
    {
        ArgumentNullException.ThrowIfNull(lines);
        if (catchShare is <= 0 or > 1 || double.IsNaN(catchShare))
            throw new ArgumentOutOfRangeException(nameof(catchShare), "must be within (0, 1]");
        var total = lines.Sum(l => l.Errors);
        var levels = lines.Select(l => l.Confidence).Distinct().Order().ToArray();
        var threshold = 0.0;
        if (total > 0)
        {
            var need = catchShare * total;
            var caught = 0;
            threshold = 1.0;
            for (var g = 0; g < levels.Length; g++)
            {
                caught += lines.Where(l => l.Confidence == levels[g]).Sum(l => l.Errors);
                if (caught < need - 1e-9) continue;
                threshold = g + 1 < levels.Length ? Math.Round((levels[g] + levels[g + 1]) / 2, 5) : Math.Min(1, levels[g] + 1e-5);
                break;
            }
        }
        var flagged = lines.Where(l => l.Confidence < threshold).ToArray();
        return new FlagThreshold(catchShare, threshold, flagged.Length, lines.Count, flagged.Sum(l => l.Errors), total);
    }
}
