namespace HandLine.Calibration;

/// <summary>
/// Confidence against correctness in equal-width bins, and the expected calibration error
/// ECE = Σ_m (|B_m| / n) · |acc(B_m) − conf(B_m)| (Guo et al. 2017, eq. 3; bins B_m = ((m−1)/M, m/M]).
/// </summary>
public sealed record ReliabilityTable(IReadOnlyList<ReliabilityBin> Bins, int Count, double Ece)
{
    public static ReliabilityTable Build(IEnumerable<(double Confidence, bool Correct)> items, int bins)
    {
        ArgumentNullException.ThrowIfNull(items);
        ArgumentOutOfRangeException.ThrowIfLessThan(bins, 1);
        var count = new int[bins];
        var sumConfidence = new double[bins];
        var right = new int[bins];
        foreach (var (confidence, correct) in items)
        {
            if (confidence is < 0 or > 1 || double.IsNaN(confidence))
                throw new ArgumentException($"Confidence {confidence} is outside [0, 1].", nameof(items));
            // (m-1)/M < c ≤ m/M; the small slack keeps 0.3·10 = 3.0000000000000004 in bin 3 (confidences are rounded to 4 places).
            var m = Math.Clamp((int)Math.Ceiling(confidence * bins - 1e-9), 1, bins) - 1;
            count[m]++;
            sumConfidence[m] += confidence;
            if (correct) right[m]++;
        }
        var n = count.Sum();
        var table = new ReliabilityBin[bins];
        double ece = 0;
        for (var m = 0; m < bins; m++)
        {
            var mean = count[m] == 0 ? 0 : sumConfidence[m] / count[m];
            var accuracy = count[m] == 0 ? 0 : (double)right[m] / count[m];
            table[m] = new ReliabilityBin((double)m / bins, (double)(m + 1) / bins, count[m], mean, accuracy);
            if (n > 0) ece += (double)count[m] / n * Math.Abs(accuracy - mean);
        }
        return new ReliabilityTable(table, n, ece);
    }
}
