using System.Text.Json;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class DigitLineTests : IDisposable
{
    private readonly string _dir = SynthesisFixtures.NewTempDir();

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static readonly Lazy<MnistDigits> Digits = new(() => MnistDigits.Load(MnistDigitsTests.FixtureDir));

    [Fact]
    public void InkGrowsWithTheNumberOfDigits()
    {
        var font = SynthesisFixtures.Font(SynthesisFixtures.Comic);
        var clean = Degradation.Sample(new Random(1), DegradationRanges.None);
        var widths = new[] { "7", "75", "7531", "75310246" }.Select(t =>
        {
            var samples = t.Select((_, i) => 500 + i).ToArray();
            return SynthesisFixtures.InkColumns(DigitLineRenderer.Render(t, samples, Digits.Value, MnistSplit.Validation, font, clean));
        }).ToArray();
        for (var i = 1; i < widths.Length; i++)
            Assert.True(widths[i] > widths[i - 1] * 1.3, string.Join(",", widths));
    }

    [Fact]
    public void SeparatorsComeFromTheFontAndDigitsFromTheSamples()
    {
        var font = SynthesisFixtures.Font(SynthesisFixtures.Comic);
        var clean = Degradation.Sample(new Random(1), DegradationRanges.None);
        var digitsOnly = DigitLineRenderer.Render("12", [500, 501], Digits.Value, MnistSplit.Validation, font, clean);
        var withDash = DigitLineRenderer.Render("1-2", [500, 501], Digits.Value, MnistSplit.Validation, font, clean);
        Assert.True(SynthesisFixtures.DarkPixels(withDash) > SynthesisFixtures.DarkPixels(digitsOnly));
        var other = DigitLineRenderer.Render("12", [502, 503], Digits.Value, MnistSplit.Validation, font, clean);
        Assert.NotEqual(digitsOnly.Pixels, other.Pixels);
        // A training-split index cannot be drawn into a validation line.
        Assert.Throws<ArgumentOutOfRangeException>(() => DigitLineRenderer.Render("1", [3], Digits.Value, MnistSplit.Validation, font, clean));
    }

    [Fact]
    public void SynthesisRecordsTheSamplesItDrewAndRepeatsForTheSameSeed()
    {
        LineSynthesiser.Generate(new SynthesisRequest(SynthesisFixtures.Catalog, 12, Path.Combine(_dir, "a"), 4,
            Digits: new DigitSource(Digits.Value, MnistSplit.Validation)), null);
        LineSynthesiser.Generate(new SynthesisRequest(SynthesisFixtures.Catalog, 12, Path.Combine(_dir, "b"), 4,
            Digits: new DigitSource(Digits.Value, MnistSplit.Validation)), null);
        var rows = File.ReadAllLines(Path.Combine(_dir, "a", LineSynthesiser.DegradationsName)).Select(l => JsonDocument.Parse(l).RootElement).ToArray();
        Assert.Equal(12, rows.Length);
        foreach (var row in rows)
        {
            var text = row.GetProperty("text").GetString()!;
            var samples = row.GetProperty("mnist").EnumerateArray().Select(e => e.GetInt32()).ToArray();
            Assert.Equal(text.Count(char.IsAsciiDigit), samples.Length);
            Assert.All(samples, s => Assert.InRange(s, 500, 559));
            Assert.Equal(File.ReadAllBytes(Path.Combine(_dir, "a", row.GetProperty("path").GetString()!)),
                File.ReadAllBytes(Path.Combine(_dir, "b", row.GetProperty("path").GetString()!)));
        }
        Assert.Equal(File.ReadAllText(Path.Combine(_dir, "a", LineSynthesiser.ManifestName)), File.ReadAllText(Path.Combine(_dir, "b", LineSynthesiser.ManifestName)));
    }

    [Fact]
    public void GeneratedTextUsesEveryDigit()
    {
        var rng = new Random(2);
        var text = string.Concat(Enumerable.Range(0, 200).Select(_ => DigitLineText.Next(rng)));
        for (var d = '0'; d <= '9'; d++)
            Assert.True(text.Count(c => c == d) >= 40, $"digit {d} appears {text.Count(c => c == d)} times");
        Assert.True(HandLine.Model.CharacterSet.Default.CanEncode(text));
    }

    [Fact]
    public void DigitsAreAsTallAsTheFontsOwnFigures()
    {
        // Heights come from the glyph outlines, not the font's declared cap height (which some fonts get wrong).
        static int InkRows(HandLine.Imaging.GrayImage img) =>
            Enumerable.Range(0, img.Height).Count(y => Enumerable.Range(0, img.Width).Any(x => img[x, y] < 0.5f));
        var clean = Degradation.Sample(new Random(1), DegradationRanges.None);
        foreach (var name in new[] { SynthesisFixtures.Comic, SynthesisFixtures.Humor })
        {
            var font = SynthesisFixtures.Font(name);
            var drawn = InkRows(LineRenderer.Render("0", font, clean));
            var mnist = Enumerable.Range(500, 10).Average(i => InkRows(DigitLineRenderer.Render("0", [i], Digits.Value, MnistSplit.Validation, font, clean)));
            Assert.InRange(mnist, drawn * 0.8, drawn * 1.25);
        }
    }
}
