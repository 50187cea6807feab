using HandLine.Calibration;
using HandLine.Decoding;
using HandLine.Model;
using HandLine.Tests.Decoding;

namespace HandLine.Tests.Calibration;

public sealed class TemperatureFitTests
{
    private static readonly CharacterSet Ab = CharacterSet.FromString("ab");

    [Fact]
    public void AnOverConfidentModelGetsATemperatureAboveOneThatMakesItsConfidencesHonest()
    {
        // Every line reads "ab" at 0.97 per frame, but a third of the truths are "aa": the second character is right
        // two times in three, so the characters are right 5 times in 6 (83 %) while the model says 97 %.
        var sources = Enumerable.Range(0, 30).Select(i => new TemperatureFit.Source($"s{i}", i % 3 == 0 ? "aa" : "ab",
            [CtcTests.PeakedPosteriors([1, 0, 2, 0], Ab.ClassCount, peak: 0.97)])).ToArray();
        var decoder = new LineDecoder(Ab, DecodingOptions.Greedy);

        var fit = TemperatureFit.Fit(sources, decoder);

        Assert.Equal(1.0, fit.AsGiven.Temperature);
        Assert.True(fit.AsGiven.CharEce > 0.1, $"as given ECE {fit.AsGiven.CharEce}");
        Assert.True(fit.Best.Temperature > 1, $"best temperature {fit.Best.Temperature}");
        Assert.True(fit.Best.CharNll < fit.AsGiven.CharNll);
        // One confidence level is left, so the best NLL puts it near the hit rate 5/6 and the ECE near 0.
        Assert.True(fit.Best.CharEce < 0.03, $"best ECE {fit.Best.CharEce}");
        Assert.Equal(60, fit.Best.Characters);
    }

    [Fact]
    public void NllIsTheMeanNegativeLogLikelihoodOfTheOutcomes()
    {
        // Hand-computed: (−ln 0.8 − ln(1 − 0.6)) / 2.
        var nll = TemperatureFit.Nll([(0.8, true), (0.6, false)]);
        Assert.Equal((-Math.Log(0.8) - Math.Log(0.4)) / 2, nll, 10);
    }
}
