using HandLine.Imaging;
using HandLine.Model;
using HandLine.Synthesis;
using static HandLine.Tests.Synthesis.SynthesisFixtures;

namespace HandLine.Tests.Synthesis;

public sealed class LineRendererTests
{
    private static readonly Degradation Clean = new();

    [Theory]
    [InlineData(Comic)]
    [InlineData(Humor)]
    public void Ink_extent_grows_with_each_visible_character_of_the_text(string fontName)
    {
        const string text = "Recd of Wm. Stonebridge 3 4 6 & Jas.";
        var font = Font(fontName);
        var previous = 0;
        for (var n = 1; n <= text.Length; n++)
        {
            var prefix = text[..n];
            var ink = InkColumns(LineRenderer.Render(prefix, font, Clean));
            if (char.IsWhiteSpace(text[n - 1]))
                Assert.Equal(previous, ink);   // a trailing space adds no ink
            else
                Assert.True(ink > previous, $"'{prefix}': {ink} ink columns, not more than {previous}");
            previous = ink;
        }
    }

    [Fact]
    public void Every_symbol_but_space_draws_ink_in_a_fixture_font_that_covers_it()
    {
        foreach (var symbol in CharacterSet.Default.Symbols.Where(s => s != " "))
        {
            var inkedIn = 0;
            foreach (var font in Catalog.Fonts.Where(f => f.Covers(symbol)))
            {
                var dark = DarkPixels(LineRenderer.Render(symbol, font, Clean));
                Assert.True(dark > 0, $"'{symbol}' in {font.Name} drew no ink");
                inkedIn++;
            }
            Assert.True(inkedIn > 0, $"'{symbol}' drew in no fixture font");
        }
    }

    [Fact]
    public void Clean_render_is_black_ink_on_white_with_the_requested_padding()
    {
        var img = LineRenderer.Render("Pd Jas. Millward", Font(Comic), Clean);
        Assert.Equal(1f, img.Pixels.Max());
        Assert.True(img.Pixels.Min() < 0.05f);
        // Clean padding is 8 px plus a 1 px safety margin; allow antialiased edges.
        var firstInkColumn = Enumerable.Range(0, img.Width).First(x => Enumerable.Range(0, img.Height).Any(y => img[x, y] < 0.9f));
        Assert.InRange(firstInkColumn, 8, 11);
        // Cap height of a 40 px font is roughly 0.7 em (common practice, no source), so the crop is
        // at least that plus both paddings.
        Assert.InRange(img.Height, 28 + 16, 40 * 1.6 + 20);
    }

    [Fact]
    public void Same_degradation_same_pixels_and_different_seed_different_pixels()
    {
        var font = Font(Humor);
        const string text = "Buried Ann Quickthorn aged 74";
        var d = Degradation.Sample(new Random(7), new DegradationRanges());
        var a = LineRenderer.Render(text, font, d);
        var b = LineRenderer.Render(text, font, d);
        Assert.Equal(a.Pixels, b.Pixels);

        var other = LineRenderer.Render(text, font, Degradation.Sample(new Random(8), new DegradationRanges()));
        Assert.False(a.Width == other.Width && a.Pixels.AsSpan().SequenceEqual(other.Pixels));

        // Only the noise seed differs: per-glyph jitter and pixel noise must change.
        var noisy = Clean with { NoiseSigma = 0.05, GlyphOffsetJitterPx = 1 };
        var n1 = LineRenderer.Render(text, font, noisy with { Seed = 1 });
        var n2 = LineRenderer.Render(text, font, noisy with { Seed = 2 });
        Assert.False(n1.Width == n2.Width && n1.Pixels.AsSpan().SequenceEqual(n2.Pixels));
    }

    [Fact]
    public void Positive_rotation_raises_the_right_end_by_the_tangent_of_the_angle()
    {
        var font = Font(Humor);
        const string text = "mmmmmmmmmmmmmmmmmm";
        var flat = InkSlope(LineRenderer.Render(text, font, Clean));
        var turned = InkSlope(LineRenderer.Render(text, font, Clean with { RotationDegrees = 5 }));
        // y grows downwards, so rising to the right is a negative slope of -tan(5°) ≈ -0.0875.
        Assert.InRange(flat, -0.01, 0.01);
        Assert.InRange(turned, -0.0875 - 0.015, -0.0875 + 0.015);
    }

    [Fact]
    public void Positive_shear_leans_tall_strokes_right_by_the_tangent_of_the_angle()
    {
        var font = Font(Humor);
        var upright = LineRenderer.Render("llll", font, Clean);
        var leaning = LineRenderer.Render("llll", font, Clean with { ShearDegrees = 20 });
        // Shear x' = x + tan(a) h moves every ink row by tan(a) times its height, so the slope of
        // mean ink x against height grows by exactly tan(20°) ≈ 0.364 (the glyphs' own hooks cancel out).
        Assert.Equal(upright.Height, leaning.Height);
        Assert.InRange(Lean(leaning) - Lean(upright), 0.364 - 0.03, 0.364 + 0.03);
    }

    [Fact]
    public void Full_degradations_give_finite_luminance_in_range_with_text_still_darker()
    {
        var rng = new Random(21);
        var ranges = new DegradationRanges();
        for (var i = 0; i < 30; i++)
        {
            var font = Catalog.Fonts[i % 2];
            var d = Degradation.Sample(rng, ranges);
            var img = LineRenderer.Render("Recd of Zach. Oxenbury £2 10s", font, d);
            Assert.All(img.Pixels, v => Assert.InRange(v, 0f, 1f));
            // Ink stays well below the paper: the darkest 1% is well below the median
            // (rule of thumb for legible lines, common practice, no source).
            var sorted = img.Pixels.Order().ToArray();
            Assert.True(sorted[sorted.Length / 100] < sorted[sorted.Length / 2] - 0.2f, $"line {i}: {d}");
        }
    }

    [Fact]
    public void Jpeg_round_trip_changes_pixels_only_slightly()
    {
        var font = Font(Comic);
        var plain = LineRenderer.Render("Tithe & taxes £4 2s", font, Clean);
        var jpeg = LineRenderer.Render("Tithe & taxes £4 2s", font, Clean with { JpegQuality = 30 });
        var meanAbs = plain.Pixels.Zip(jpeg.Pixels, (a, b) => Math.Abs(a - b)).Average();
        // Quality 30 leaves visible ringing but a small mean error (common practice, no source).
        Assert.InRange(meanAbs, 0.001, 0.05);
    }

    [Fact]
    public void Elastic_distortion_moves_ink_but_keeps_about_the_same_amount()
    {
        var font = Font(Comic);
        var plain = LineRenderer.Render("Married Wm. Haybarn & Rose", font, Clean);
        var warped = LineRenderer.Render("Married Wm. Haybarn & Rose", font, Clean with { ElasticAlphaPx = 2, ElasticSigmaPx = 6, Seed = 3 });
        var inkPlain = plain.Pixels.Sum(v => 1 - v);
        var inkWarped = warped.Pixels.Sum(v => 1 - v);
        // A smooth field with small displacement barely changes area (Jacobian near 1).
        Assert.InRange(inkWarped / inkPlain, 0.85, 1.15);
        Assert.True(warped.Width > plain.Width || !warped.Pixels.AsSpan().SequenceEqual(plain.Pixels));
    }

    [Fact]
    public void Rejects_empty_text_and_impossible_values()
    {
        var font = Font(Comic);
        Assert.Throws<ArgumentException>(() => LineRenderer.Render("", font, Clean));
        Assert.Throws<ArgumentException>(() => LineRenderer.Render("Pd", font, Clean with { FontSizePx = 0 }));
        Assert.Throws<ArgumentException>(() => LineRenderer.Render("Pd", font, Clean with { JpegQuality = 101 }));
        Assert.Throws<ArgumentException>(() => LineRenderer.Render("Pd", font, Clean with { BlurSigmaPx = double.NaN }));
    }

    /// <summary>Least-squares slope of each ink column's mean row against x.</summary>
    private static double InkSlope(GrayImage img)
    {
        var xs = new List<double>();
        var ys = new List<double>();
        for (var x = 0; x < img.Width; x++)
        {
            double sum = 0, w = 0;
            for (var y = 0; y < img.Height; y++)
            {
                var ink = 1 - img[x, y];
                sum += ink * y;
                w += ink;
            }
            if (w > 1)
            {
                xs.Add(x);
                ys.Add(sum / w);
            }
        }
        var mx = xs.Average();
        var my = ys.Average();
        return xs.Zip(ys, (x, y) => (x - mx) * (y - my)).Sum() / xs.Sum(x => (x - mx) * (x - mx));
    }

    /// <summary>Least-squares slope of each ink row's mean column against height (up = positive).</summary>
    private static double Lean(GrayImage img)
    {
        var hs = new List<double>();
        var xs = new List<double>();
        for (var y = 0; y < img.Height; y++)
        {
            double sum = 0, w = 0;
            for (var x = 0; x < img.Width; x++)
            {
                var ink = 1 - img[x, y];
                sum += ink * x;
                w += ink;
            }
            if (w > 1)
            {
                hs.Add(-y);
                xs.Add(sum / w);
            }
        }
        var mh = hs.Average();
        var mx = xs.Average();
        return hs.Zip(xs, (h, x) => (h - mh) * (x - mx)).Sum() / hs.Sum(h => (h - mh) * (h - mh));
    }
}
