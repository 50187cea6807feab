using HandLine.Features;
using HandLine.Imaging;
using static HandLine.Tests.Imaging.ImagingTestSupport;

namespace HandLine.Tests.Imaging;

public sealed class LineNormaliserTests
{
    private static readonly ImagingOptions Defaults = new();

    private static NormalisedLine Normalise(GrayImage image, ImagingOptions tuning, FeatureConfig? line = null) =>
        NormaliserFor(line ?? new FeatureConfig(), tuning).Normalise(image);

    [Theory]
    [InlineData(-10.0)]
    [InlineData(-4.5)]
    [InlineData(0.0)]
    [InlineData(3.0)]
    [InlineData(8.0)]
    [InlineData(10.0)]
    public void Deskew_recovers_known_rotation(double degrees)
    {
        var line = Render(EstateLine, rotateDegrees: degrees);
        var result = Normalise(line, Defaults);
        Assert.True(result.HasInk);
        // Requirement of the stage (0.5°), not a published figure.
        Assert.InRange(result.DeskewDegrees, degrees - 0.5, degrees + 0.5);
    }

    [Fact]
    public void Deskewed_line_is_as_flat_as_the_unrotated_one()
    {
        var flat = Normalise(Render(EstateLine), Defaults).Ink;
        var turned = Normalise(Render(EstateLine, rotateDegrees: 8), Defaults).Ink;
        // Same text at the same height: after undoing the turn the widths agree closely.
        Assert.InRange(turned.Width, flat.Width * 0.97, flat.Width * 1.03);
    }

    [Fact]
    public void Slant_correction_finds_and_removes_known_shear()
    {
        var options = Defaults;
        var upright = Normalise(Render(EstateLine), options);
        var slanted = Render(EstateLine, slantDegrees: 20);
        var corrected = Normalise(slanted, options);

        // The font's own slant is small; the added 20° must show up on top of it.
        Assert.InRange(corrected.SlantDegrees, 16, 24);
        Assert.InRange(corrected.SlantDegrees - upright.SlantDegrees, 17, 23);

        double before = SlantEstimator.Estimate(Invert(slanted), 0, options.MaxSlantDegrees);
        double after = SlantEstimator.Estimate(corrected.Ink, 0, options.MaxSlantDegrees);
        Assert.True(Math.Abs(after) < Math.Abs(before) - 10, $"slant before {before}°, after {after}°");
    }

    [Fact]
    public void Slant_correction_can_be_switched_off()
    {
        var result = Normalise(Render(EstateLine, slantDegrees: 20), Defaults, new FeatureConfig(CorrectSlant: false));
        Assert.Equal(0, result.SlantDegrees);
    }

    [Fact]
    public void Light_on_dark_line_normalises_like_dark_on_light()
    {
        var line = Render(EstateLine, rotateDegrees: 3, slantDegrees: 10);
        var normal = Normalise(line, Defaults);
        var negative = Normalise(Invert(line), Defaults);

        Assert.Equal(normal.DeskewDegrees, negative.DeskewDegrees, 2);
        Assert.Equal(normal.SlantDegrees, negative.SlantDegrees, 2);
        Assert.Equal(normal.Ink.Width, negative.Ink.Width);
        double diff = normal.Ink.Pixels.Zip(negative.Ink.Pixels, (a, b) => Math.Abs(a - b)).Max();
        Assert.True(diff < 0.02, $"largest difference {diff:F4}");
    }

    [Fact]
    public void Rendered_white_on_black_line_matches_black_on_white_closely()
    {
        // Separately rendered: the rasteriser draws light glyphs a little bolder, so the ink box can
        // differ by a row. Tolerances: common practice, no source.
        var normal = Normalise(Render(EstateLine), Defaults);
        var negative = Normalise(Render(EstateLine, whiteOnBlack: true), Defaults);
        Assert.True(negative.HasInk);
        Assert.Equal(normal.Ink.Height, negative.Ink.Height);
        Assert.InRange(negative.Ink.Width, normal.Ink.Width * 0.95, normal.Ink.Width * 1.05);
        double meanInk = negative.Ink.Pixels.Average(), expected = normal.Ink.Pixels.Average();
        Assert.InRange(meanInk, expected * 0.7, expected * 1.5);
    }

    [Theory]
    [InlineData(12f, 40, 2)] // enlarged
    [InlineData(60f, 40, 2)] // shrunk
    [InlineData(40f, 64, 5)]
    public void Height_is_normalised_keeping_aspect_ratio_and_margin(float fontSize, int lineHeight, int margin)
    {
        var options = Defaults with { Margin = margin };
        var features = new FeatureConfig(LineHeight: lineHeight, CorrectSlant: false);
        var line = Render(EstateLine, fontSize);
        // Measure the source box on the contrast-stretched ink, as the stage crops it.
        var (x0, y0, x1, y1) = Bounds(ContrastNormaliser.ToInk(line, options)!, 0.5f)!.Value;
        double sourceAspect = (double)(x1 - x0 + 1) / (y1 - y0 + 1);

        var ink = Normalise(line, options, features).Ink;

        Assert.Equal(lineHeight, ink.Height);
        int inner = lineHeight - 2 * margin;
        double aspect = (double)(ink.Width - 2 * margin) / inner;
        Assert.InRange(aspect, sourceAspect * 0.97, sourceAspect * 1.03);

        // Margin is clear paper on all four sides; the ink reaches the inner box top and bottom.
        for (int y = 0; y < ink.Height; y++)
            for (int x = 0; x < ink.Width; x++)
                if (y < margin || y >= lineHeight - margin || x < margin || x >= ink.Width - margin)
                    Assert.True(ink[x, y] < 1e-3f, $"ink {ink[x, y]} at ({x},{y}) inside the margin");
        var (_, iy0, _, iy1) = Bounds(ink, 0.05f)!.Value;
        Assert.Equal(margin, iy0);
        Assert.Equal(lineHeight - margin - 1, iy1);
    }

    [Fact]
    public void Isolated_speck_does_not_widen_the_crop()
    {
        var clean = Render(EstateLine, padding: 60);
        var p = (float[])clean.Pixels.Clone();
        for (int y = 5; y < 8; y++)
            for (int x = 5; x < 8; x++)
                p[y * clean.Width + x] = 0f; // 3×3 dust spot in the top-left corner
        var dusty = new GrayImage(clean.Width, clean.Height, p);

        var a = Normalise(clean, Defaults).Ink;
        var b = Normalise(dusty, Defaults).Ink;
        Assert.InRange(b.Width, a.Width - 1, a.Width + 1);
    }

    [Fact]
    public void A_word_in_lighter_ink_is_cropped_like_the_same_word_in_dark_ink()
    {
        // A faint "No." before a bold folio number: the crop once dropped it, because only its darkest
        // pixels counted as ink and they fell apart into specks (the case measured in InkBounds).
        var options = Defaults with { MaxDeskewDegrees = 0 };
        var upright = new FeatureConfig(CorrectSlant: false);
        var faint = Normalise(WordBesideFigure(edge: 0.6f, core: 0.4f), options, upright).Ink;
        var dark = Normalise(WordBesideFigure(edge: 0.05f, core: 0.05f), options, upright).Ink;
        var figureAlone = Normalise(WordBesideFigure(edge: 0.95f, core: 0.95f), options, upright).Ink;
        Assert.InRange(faint.Width, dark.Width - 1, dark.Width + 1);
        Assert.True(dark.Width > 2 * figureAlone.Width, $"the word is not in the crop: {dark.Width} vs {figureAlone.Width}");
    }

    /// <summary>
    /// Paper 0.95; three upright strokes 3 px wide and 20 tall (luminance <paramref name="edge"/> at the sides,
    /// <paramref name="core"/> in the middle), a 30 px gap, then a bold 16 × 32 figure at 0.05.
    /// </summary>
    private static GrayImage WordBesideFigure(float edge, float core)
    {
        const int width = 140, height = 64;
        var p = Enumerable.Repeat(0.95f, width * height).ToArray();
        for (int stroke = 0; stroke < 3; stroke++)
            for (int y = 26; y < 46; y++)
                for (int dx = 0; dx < 3; dx++)
                    p[y * width + 16 + 9 * stroke + dx] = dx == 1 ? core : edge;
        for (int y = 16; y < 48; y++)
            for (int x = 73; x < 89; x++)
                p[y * width + x] = 0.05f;
        return new GrayImage(width, height, p);
    }

    [Fact]
    public void Blank_image_has_no_ink()
    {
        var result = Normalise(GrayImage.Filled(300, 60, 0.93f), Defaults);
        Assert.False(result.HasInk);
        Assert.Equal(new FeatureConfig().LineHeight, result.Ink.Height);
        Assert.All(result.Ink.Pixels, v => Assert.Equal(0f, v));
    }

    [Fact]
    public void Faint_paper_grain_alone_counts_as_blank()
    {
        var rng = new Random(3);
        var grain = new GrayImage(300, 60, Enumerable.Range(0, 18000).Select(_ => 0.9f + 0.06f * (float)rng.NextDouble()).ToArray());
        Assert.False(Normalise(grain, Defaults).HasInk);
    }

    [Theory]
    [InlineData(BinarisationMethod.Otsu)]
    [InlineData(BinarisationMethod.Sauvola)]
    public void Binarised_lines_hold_only_zero_and_one(BinarisationMethod method)
    {
        var options = Defaults with { Margin = 0, MaxUpscale = 1 };
        var features = new FeatureConfig(LineHeight: 200, CorrectSlant: false, Binarisation: method);
        // With MaxUpscale 1 and a line shorter than 200 rows nothing is resampled, so values stay binary.
        var result = Normalise(Render(EstateLine, fontSize: 30), options with { MaxDeskewDegrees = 0 }, features);
        Assert.True(result.HasInk);
        Assert.All(result.Ink.Pixels, v => Assert.True(v is 0f or 1f, $"value {v}"));
        Assert.Contains(1f, result.Ink.Pixels);
    }

    [Fact]
    public void Rejects_bad_arguments()
    {
        Assert.Throws<ArgumentNullException>(() => Normalise(null!, Defaults));
        Assert.Throws<ArgumentException>(() => Normalise(GrayImage.Filled(5, 5, 1f), Defaults, new FeatureConfig(LineHeight: 2)));
    }
}
