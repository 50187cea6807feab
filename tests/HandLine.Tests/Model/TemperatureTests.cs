using HandLine.Model;

namespace HandLine.Tests.Model;

public sealed class TemperatureTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-temp-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Theory]
    [InlineData(0.5)]
    [InlineData(1.7)]
    [InlineData(3.0)]
    public void TemperedPosteriorsAreTheSoftmaxOfTheLogitsDividedByT(double temperature)
    {
        // Temperature scaling as Guo et al. 2017 ("On Calibration of Modern Neural Networks", section 4.2) define
        // it, q = softmax(z / T), computed here straight from the logits z; the network hands over log_softmax(z).
        var rng = new Random(3);
        const int frames = 6, classes = 5;
        var logits = Enumerable.Range(0, frames * classes).Select(_ => rng.NextDouble() * 8 - 4).ToArray();
        var logProbs = new float[logits.Length];
        var expected = new double[logits.Length];
        for (var t = 0; t < frames; t++)
        {
            var z = logits.AsSpan(t * classes, classes).ToArray();
            var norm = Math.Log(z.Sum(Math.Exp));
            var normT = Math.Log(z.Sum(v => Math.Exp(v / temperature)));
            for (var c = 0; c < classes; c++)
            {
                logProbs[t * classes + c] = (float)(z[c] - norm);
                expected[t * classes + c] = z[c] / temperature - normT;
            }
        }
        var tempered = new Posteriors(frames, classes, logProbs).Tempered(temperature);
        for (var i = 0; i < expected.Length; i++) Assert.Equal(expected[i], tempered.LogProbs[i], 4);
        for (var t = 0; t < frames; t++)
            Assert.Equal(ArgMax(logProbs.AsSpan(t * classes, classes)), ArgMax(tempered.LogProbs.AsSpan(t * classes, classes)));
    }

    [Fact]
    public void ATemperatureOfOneLeavesThePosteriorsAsTheyAre()
    {
        var p = new Posteriors(1, 2, [MathF.Log(0.9f), MathF.Log(0.1f)]);
        Assert.Same(p, p.Tempered(1));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.Tempered(0));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.Tempered(double.NaN));
    }

    [Fact]
    public void AModelSavedWithATemperatureReadsTempered_AndTrainingResetsIt()
    {
        using var model = ModelFileTests.SmallModel();
        var input = ModelFileTests.RandomFeatures(9, model.Features.FrameDimension, 4);
        var plain = model.Run(input);
        var withT = Path.Combine(_dir, "t.hlm");
        model.SaveWithTemperature(withT, 2.5, new TemperatureRecord("v.tsv", 10, 100, "beam 8", 0.12, 0.03, "2026-01-01T00:00:00Z"));

        using var loaded = ModelFile.Load(withT);
        Assert.Equal(2.5, loaded.Temperature);
        Assert.Equal(0.03, loaded.Header.TemperatureFit!.CharEceAfter);
        var expected = plain.Tempered(2.5).LogProbs;
        var got = loaded.Run(input).LogProbs;
        for (var i = 0; i < expected.Length; i++) Assert.Equal(expected[i], got[i], 4);
        // The batched inference path that transcribe uses applies it too.
        var expectedLanes = model.RunInLanes([input], 16)[0].Tempered(2.5).LogProbs;
        Assert.Equal(expectedLanes, loaded.RunInLanes([input], 16)[0].LogProbs);

        // New weights need a new fit: a save after training writes temperature 1 and no fit record.
        var trained = Path.Combine(_dir, "trained.hlm");
        loaded.Save(trained, null, null);
        using var again = ModelFile.Load(trained);
        Assert.Equal(1.0, again.Temperature);
        Assert.Null(again.Header.TemperatureFit);
    }

    private static int ArgMax(ReadOnlySpan<float> row)
    {
        var best = 0;
        for (var i = 1; i < row.Length; i++) if (row[i] > row[best]) best = i;
        return best;
    }
}
