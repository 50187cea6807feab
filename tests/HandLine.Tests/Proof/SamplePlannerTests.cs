using HandLine.Proof;
using HandLine.Scoring;

namespace HandLine.Tests.Proof;

public sealed class SamplePlannerTests
{
    [Fact]
    public void ThePlanMatchesTheTextbookSampleSizeForAProportion()
    {
        // Cochran, Sampling Techniques, 3rd ed. (1977), ch. 4, n0 = t² P Q / d² (from memory): the textbook case
        // P = 0.5, d = 0.05 at 95 % gives 1.96² × 0.25 / 0.0025 = 384.16, i.e. 385 with t rounded to 1.96; with the
        // exact z = 1.95996 it is 384.15, still 385 once rounded up.
        var plan = SamplePlanner.Plan(expectedCer: 0.5, halfWidth: 0.05, charsPerLine: 1, designEffect: 1);
        Assert.Equal(384.15, plan.ExactChars, precision: 2);
        Assert.Equal(385, plan.Chars);
        Assert.Equal(385, plan.Lines);
    }

    [Fact]
    public void CharactersTurnIntoLinesThroughTheDesignEffect()
    {
        // Hand-computed: 1.959964² × 0.05 × 0.95 / 0.01² = 1824.69 characters -> 1825; at 40 characters a line,
        // 45.6 lines -> 46 when errors are independent, 1824.69 × 2.5 / 40 = 114.04 -> 115 with a design effect of 2.5.
        var independent = SamplePlanner.Plan(0.05, 0.01, 40, 1);
        Assert.Equal(1825, independent.Chars);
        Assert.Equal(46, independent.Lines);
        Assert.Equal(115, SamplePlanner.Plan(0.05, 0.01, 40, 2.5).Lines);
    }

    [Fact]
    public void DesignEffectIsOneForEvenErrorsAndLargeForErrorsBunchedInFewLines()
    {
        // Every line 1 error in 20: no spread between lines beyond its size -> the floor of 1.
        Assert.Equal(1, DesignEffect.Estimate(Enumerable.Repeat(new EditCounts(1, 0, 0, 19), 50).ToArray()));
        // The same 50 errors all in 5 lines of 20 (10 errors each): hand-computed ratio variance
        // 50/49 × (5 × 9² + 45 × 1²) / 1000² = 4.59e-4 against 0.05 × 0.95 / 1000 = 4.75e-5, 9.667.
        var bunched = Enumerable.Range(0, 50).Select(i => i < 5 ? new EditCounts(10, 0, 0, 10) : new EditCounts(0, 0, 0, 20)).ToArray();
        Assert.Equal(9.67, DesignEffect.Estimate(bunched), precision: 2);
    }

    [Theory]
    [InlineData(0, 0.01, 40, 1)]
    [InlineData(0.05, 0, 40, 1)]
    [InlineData(0.05, 0.01, 0.5, 1)]
    [InlineData(0.05, 0.01, 40, 0.5)]
    public void BadPlanInputsAreRefused(double p, double e, double chars, double deff) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => SamplePlanner.Plan(p, e, chars, deff));
}
