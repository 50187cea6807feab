using HandLine.Proof;
using HandLine.Scoring;
using Xunit.Abstractions;

namespace HandLine.Tests.Proof;

public sealed class BootstrapIntervalTests(ITestOutputHelper output)
{
    /// <summary>
    /// Simulated proof samples with a known true CER: each line is 20-60 characters; 80 % of lines are "clean"
    /// (each character wrong with probability 2 %), 20 % "bad" (15 %), so errors cluster in lines. Length and
    /// quality are independent, so the true CER is 0.8 × 0.02 + 0.2 × 0.15 = 0.046.
    /// </summary>
    private static EditCounts[] SimulatedSample(Random random, int lines)
    {
        var sample = new EditCounts[lines];
        for (var i = 0; i < lines; i++)
        {
            var length = random.Next(20, 61);
            var rate = random.NextDouble() < 0.8 ? 0.02 : 0.15;
            var errors = 0;
            for (var c = 0; c < length; c++)
                if (random.NextDouble() < rate)
                    errors++;
            sample[i] = new EditCounts(errors, 0, 0, length - errors);
        }
        return sample;
    }

    [Fact]
    public void The95PercentIntervalCoversTheTrueCerIn93To97PercentOfTrials()
    {
        // The 93-97 % band is the acceptance figure for a nominal 95 % interval (percentile bootstrap,
        // Efron 1979); 1,000 trials put the binomial standard error of the coverage at about 0.7 points.
        const double trueCer = 0.8 * 0.02 + 0.2 * 0.15;
        const int trials = 1000;
        var random = new Random(20261203);
        var covered = 0;
        for (var t = 0; t < trials; t++)
        {
            var interval = BootstrapInterval.Of(SimulatedSample(random, 150), resamples: 500, seed: t);
            if (interval.Contains(trueCer))
                covered++;
        }
        var coverage = covered / (double)trials;
        output.WriteLine($"coverage {coverage:P1} over {trials} trials (true CER {trueCer})");
        Assert.InRange(coverage, 0.93, 0.97);
    }

    [Fact]
    public void AnIntervalFromTooFewLinesWouldFailTheCoverageCheck()
    {
        // The check above can fail: with 8 lines a sample often has no bad line at all, and the interval misses.
        const double trueCer = 0.046;
        var random = new Random(5);
        var covered = 0;
        for (var t = 0; t < 400; t++)
            if (BootstrapInterval.Of(SimulatedSample(random, 8), resamples: 200, seed: t).Contains(trueCer))
                covered++;
        Assert.True(covered / 400.0 < 0.93, $"coverage {covered / 400.0:P1}");
    }

    [Fact]
    public void SameSeedSameIntervalAndThePointEstimateLiesInside()
    {
        var sample = SimulatedSample(new Random(3), 60);
        var a = BootstrapInterval.Of(sample, 1000, seed: 9);
        var b = BootstrapInterval.Of(sample, 1000, seed: 9);
        Assert.Equal(a, b);
        var cer = ErrorRate.Of(sample.Aggregate(default(EditCounts), (x, y) => x + y));
        Assert.InRange(cer, a.Lower, a.Upper);
        Assert.True(a.Upper > a.Lower);
    }

    [Fact]
    public void LinesWithoutErrorsGiveAZeroWidthIntervalAtZero()
    {
        var clean = Enumerable.Repeat(new EditCounts(0, 0, 0, 40), 30).ToArray();
        Assert.Equal(new ConfidenceInterval(0, 0, 0.95), BootstrapInterval.Of(clean, 200, 1));
    }
}
