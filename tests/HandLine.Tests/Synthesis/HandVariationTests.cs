using HandLine.Synthesis;
using static HandLine.Tests.Synthesis.SynthesisFixtures;

namespace HandLine.Tests.Synthesis;

public sealed class HandVariationTests
{
    private static readonly Lazy<MnistDigits> Digits = new(() => MnistDigits.Load(MnistDigitsTests.FixtureDir));

    /// <summary>Every effect of this change at full probability, the others at their defaults.</summary>
    private static readonly DegradationRanges AllOn = new()
    {
        GlyphShearJitterDegrees = new(1, 2, 5),
        GlyphWeightJitterPx = new(1, 0.3, 0.8),
        BaselineDriftPx = new(1, 1, 3),
        GapJitterEm = new(1, 0.02, 0.04),
        TouchProbability = new(1, 0.2, 0.3),
        PressureVariation = new(1, 0.3, 0.5),
        PenSeparatorShare = new(1, 1, 1),
        DigitPenSeparatorShare = new(1, 1, 1),
        PenWidthVariation = new(1, 0.2, 0.3),
        PenJitterPx = new(1, 0.3, 0.6),
        ElasticAlphaPx = new(1, 1, 2),
    };

    [Fact]
    public void Same_seed_gives_identical_pixels_for_font_stroke_and_digit_lines()
    {
        var font = Font(Comic);
        var stroke = StrokeFace();
        for (var i = 0; i < 3; i++)
        {
            var d = Degradation.Sample(new Random(40 + i), AllOn);
            Assert.Equal(LineRenderer.Render("Recd: 4/6, Wm. Gatehouse", font, d).Pixels,
                LineRenderer.Render("Recd: 4/6, Wm. Gatehouse", font, d).Pixels);
            Assert.Equal(LineRenderer.Render("!\" !", stroke, d).Pixels, LineRenderer.Render("!\" !", stroke, d).Pixels);
            Assert.Equal(DigitLineRenderer.Render("12/7-9", [500, 501, 502, 503], Digits.Value, MnistSplit.Validation, font, d).Pixels,
                DigitLineRenderer.Render("12/7-9", [500, 501, 502, 503], Digits.Value, MnistSplit.Validation, font, d).Pixels);
            var other = LineRenderer.Render("Recd: 4/6, Wm. Gatehouse", font, d with { Seed = d.Seed + 1 });
            Assert.NotEqual(LineRenderer.Render("Recd: 4/6, Wm. Gatehouse", font, d).Pixels, other.Pixels);
        }
    }

    [Fact]
    public void Tucked_glyphs_make_a_narrower_line_and_light_pressure_takes_ink_but_leaves_the_text()
    {
        var font = Font(Humor);
        const string text = "Stonebridge Quarter";
        var loose = LineRenderer.Render(text, font, new Degradation { Seed = 2 });
        var tucked = LineRenderer.Render(text, font, new Degradation { Seed = 2, TouchProbability = 1, TouchDepthEm = 0.08 });
        // The crop is the ink plus fixed padding, so its width is the line's length: 17 glyphs each tucked by
        // 1.6-3.2 px make it at least 27 px shorter. (Ink columns shrink less: the blank columns between letters go first.)
        Assert.InRange(loose.Width - tucked.Width, 27, 55);

        var pressed = LineRenderer.Render(text, font, new Degradation { Seed = 2, PressureVariation = 0.6 });
        var inkLoose = loose.Pixels.Sum(v => 1 - v);
        var inkPressed = pressed.Pixels.Sum(v => 1 - v);
        // The field scales ink by 1 - 0.6 * clamp(0.5 + 0.35 f): between 0.4 and 1 everywhere.
        Assert.InRange(inkPressed / inkLoose, 0.4, 0.97);
        Assert.True(pressed.Pixels.Min() < 0.3f);
    }

    [Fact]
    public void Per_glyph_lean_and_turn_change_the_glyphs_but_not_the_line_length_much()
    {
        var font = Font(Comic);
        const string text = "Millward paid";
        var plain = LineRenderer.Render(text, font, new Degradation { Seed = 3 });
        var varied = LineRenderer.Render(text, font, new Degradation { Seed = 3, GlyphShearJitterDegrees = 6, GlyphRotationJitterDegrees = 4, GlyphWeightJitterPx = 0.8 });
        Assert.NotEqual(plain.Pixels, varied.Pixels);
        Assert.InRange(InkColumns(varied), InkColumns(plain) * 0.9, InkColumns(plain) * 1.1);
    }

    private static FontFace StrokeFace()
    {
        var dir = NewTempDir();
        try
        {
            var path = Path.Combine(dir, "tiny.jhf");
            File.WriteAllText(path, "    1  1JZ\n    2  6MWRFRT RRYQZ\n    3  5LXPFTFVHPK\n");
            return Assert.Single(FontCatalog.Load([path]).Fonts);
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }
}
