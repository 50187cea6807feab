using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>
/// How much clustering of errors within lines widens the uncertainty of a pooled CER, compared with characters in
/// error independently: the variance of the ratio estimator over lines (linearised, with lines as clusters)
/// divided by the binomial variance p(1 - p) / n of the same number of independent characters. 1 means no
/// clustering; a line that is either read well or badly as a whole gives much more. The ratio-estimator variance
/// and the design effect as a variance ratio are from Kish, Survey Sampling (1965) (from memory).
/// </summary>
public static class DesignEffect
{
    /// <summary>The estimate, at least 1 (a smaller value would promise more than independent characters give);
    /// 1 when it cannot be estimated (fewer than 2 lines, or no errors or no hits at all).</summary>
    public static double Estimate(IReadOnlyList<EditCounts> lines)
    {
        ArgumentNullException.ThrowIfNull(lines);
        var n = lines.Count;
        if (n < 2)
            return 1;
        double errors = 0, chars = 0;
        foreach (var l in lines)
        {
            errors += l.Distance;
            chars += l.TruthLength;
        }
        if (chars == 0)
            return 1;
        var p = errors / chars;
        if (p <= 0 || p >= 1)
            return 1;
        double squares = 0;
        foreach (var l in lines)
        {
            var residual = l.Distance - p * l.TruthLength;
            squares += residual * residual;
        }
        var clustered = n / (n - 1.0) * squares / (chars * chars);
        var independent = p * (1 - p) / chars;
        return Math.Max(1, clustered / independent);
    }
}
