using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>
/// Percentile bootstrap interval for a pooled error rate (errors summed over lines / reference units summed over
/// lines), resampling whole lines with replacement (Efron 1979). Lines, not characters, are resampled because
/// errors cluster within lines (a faint or blotted line has many): treating characters as independent would make
/// the interval too narrow.
/// </summary>
public static class BootstrapInterval
{
    /// <summary>
    /// The interval from <paramref name="resamples"/> resamples drawn with a generator seeded by <paramref name="seed"/>
    /// (same input, same interval). For no lines the interval is [0, 0].
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">Fewer than 100 resamples, or a level outside (0, 1).</exception>
    public static ConfidenceInterval Of(IReadOnlyList<EditCounts> lines, int resamples, int seed, double level = 0.95)
    {
        ArgumentNullException.ThrowIfNull(lines);
        // Fewer resamples than this leave the 2.5 % tails resting on two or three values. Common practice, no source.
        ArgumentOutOfRangeException.ThrowIfLessThan(resamples, 100);
        if (!(level > 0 && level < 1))
            throw new ArgumentOutOfRangeException(nameof(level), level, "The level must lie between 0 and 1.");
        if (lines.Count == 0)
            return new ConfidenceInterval(0, 0, level);

        var errors = new long[lines.Count];
        var lengths = new long[lines.Count];
        for (var i = 0; i < lines.Count; i++)
        {
            errors[i] = lines[i].Distance;
            lengths[i] = lines[i].TruthLength;
        }
        var random = new Random(seed);
        var rates = new double[resamples];
        for (var b = 0; b < resamples; b++)
        {
            long e = 0, n = 0;
            for (var i = 0; i < errors.Length; i++)
            {
                var k = random.Next(errors.Length);
                e += errors[k];
                n += lengths[k];
            }
            // Same floor as ErrorRate.Of, so the point estimate and the resamples are the same statistic.
            rates[b] = (double)e / Math.Max(1, n);
        }
        Array.Sort(rates);
        var tail = (1 - level) / 2;
        return new ConfidenceInterval(Quantile(rates, tail), Quantile(rates, 1 - tail), level);
    }

    /// <summary>Quantile of sorted values by linear interpolation between order statistics.</summary>
    internal static double Quantile(double[] sorted, double q)
    {
        var position = q * (sorted.Length - 1);
        var below = (int)Math.Floor(position);
        var above = Math.Min(below + 1, sorted.Length - 1);
        return sorted[below] + (position - below) * (sorted[above] - sorted[below]);
    }
}
