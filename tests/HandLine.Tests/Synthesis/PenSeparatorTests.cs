using HandLine.Formats;
using HandLine.Imaging;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class PenSeparatorTests
{
    private static readonly Lazy<MnistDigits> Digits = new(() => MnistDigits.Load(MnistDigitsTests.FixtureDir));

    [Theory]
    [InlineData('/')]
    [InlineData('-')]
    [InlineData(':')]
    [InlineData('.')]
    public void A_pen_drawn_separator_puts_ink_in_the_gap_between_the_digit_groups(char separator)
    {
        var font = SynthesisFixtures.Font(SynthesisFixtures.Comic);
        var pen = new Degradation { DigitPenSeparatorShare = 1, Seed = 5 };
        int[] samples = [500, 501, 502];
        DigitLine Draw(string t) => new(DigitLineRenderer.Render(t, samples[..t.Count(char.IsAsciiDigit)], Digits.Value, MnistSplit.Validation, font, pen));

        // "12" draws the same in "12" and "12/": the layout of a prefix does not depend on what follows.
        var group = Draw("12");
        var withMark = Draw("12" + separator);
        Assert.Equal(group.FirstInk, withMark.FirstInk);
        var beyond = withMark.DarkRightOf(group.LastInk + 1);
        Assert.True(beyond >= 4, $"'{separator}' drew {beyond} dark pixels right of the 12");

        // Between the groups: "12 7" leaves a wide blank run of columns, "12/7" fills it with the mark.
        var spaced = Draw("12 7");
        var joined = Draw("12" + separator + "7");
        Assert.True(spaced.WidestInnerBlank >= 8, $"blank gap {spaced.WidestInnerBlank}");
        Assert.True(joined.WidestInnerBlank < spaced.WidestInnerBlank, $"'{separator}': {joined.WidestInnerBlank} vs {spaced.WidestInnerBlank}");
        Assert.True(SynthesisFixtures.DarkPixels(joined.Image) > SynthesisFixtures.DarkPixels(Draw("127").Image));
    }

    [Fact]
    public void Pen_separators_in_font_lines_draw_ink_and_the_manifest_keeps_the_text()
    {
        var font = SynthesisFixtures.Font(SynthesisFixtures.Humor);
        var glyphs = new Degradation { PenSeparatorShare = 0 };
        var pen = new Degradation { PenSeparatorShare = 1 };
        // "ab" then the separator: ink grows by the separator in both ways of drawing it.
        foreach (var s in new[] { "/", "-", ".", ":", "," })
        {
            var bare = SynthesisFixtures.DarkPixels(LineRenderer.Render("ab", font, pen));
            Assert.True(SynthesisFixtures.DarkPixels(LineRenderer.Render("ab" + s, font, pen)) > bare, $"pen '{s}'");
            Assert.True(SynthesisFixtures.DarkPixels(LineRenderer.Render("ab" + s, font, glyphs)) > bare, $"glyph '{s}'");
        }

        var dir = SynthesisFixtures.NewTempDir();
        try
        {
            string[] texts = ["19/11/1788", "Recd: 4-6-0.", "3/4 acre, 12/6"];
            var ranges = new DegradationRanges { PenSeparatorShare = new Effect(1, 1, 1), DigitPenSeparatorShare = new Effect(1, 1, 1) };
            LineSynthesiser.Generate(new SynthesisRequest(SynthesisFixtures.Catalog, 3, dir, 9, texts, ranges,
                new DigitSource(Digits.Value, MnistSplit.Validation)), null);
            var manifest = Manifest.Read(Path.Combine(dir, LineSynthesiser.ManifestName));
            Assert.Empty(manifest.Errors);
            Assert.Equal(texts, manifest.Entries.Select(e => e.Text));
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }

    /// <summary>Column measurements of a clean line: where ink starts and ends and the widest blank run inside it.</summary>
    private sealed record DigitLine(GrayImage Image)
    {
        private bool Dark(int x) => Enumerable.Range(0, Image.Height).Any(y => Image[x, y] < 0.5f);

        public int FirstInk => Enumerable.Range(0, Image.Width).First(Dark);

        public int LastInk => Enumerable.Range(0, Image.Width).Last(Dark);

        public int DarkRightOf(int x0) =>
            Enumerable.Range(x0, Math.Max(0, Image.Width - x0)).Sum(x => Enumerable.Range(0, Image.Height).Count(y => Image[x, y] < 0.5f));

        public int WidestInnerBlank
        {
            get
            {
                int best = 0, run = 0;
                for (var x = FirstInk; x <= LastInk; x++)
                {
                    run = Dark(x) ? 0 : run + 1;
                    best = Math.Max(best, run);
                }
                return best;
            }
        }
    }
}
