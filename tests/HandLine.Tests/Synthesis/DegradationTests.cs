using System.Text.Json;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class DegradationTests
{
    private static IEnumerable<(string Name, double Value, Effect Effect)> Effects(Degradation d, DegradationRanges r) =>
    [
        ("rotation", d.RotationDegrees, r.RotationDegrees),
        ("shear", d.ShearDegrees, r.ShearDegrees),
        ("wobble", d.WobbleAmplitudePx, r.WobbleAmplitudePx),
        ("glyph scale", d.GlyphScaleJitter, r.GlyphScaleJitter),
        ("glyph offset", d.GlyphOffsetJitterPx, r.GlyphOffsetJitterPx),
        ("glyph rotation", d.GlyphRotationJitterDegrees, r.GlyphRotationJitterDegrees),
        ("letter spacing", d.LetterSpacingEm, r.LetterSpacingEm),
        ("stroke", d.StrokeWidthPx, r.StrokeWidthPx),
        ("erosion", d.Erosion, r.Erosion),
        ("elastic", d.ElasticAlphaPx, r.ElasticAlphaPx),
        ("fading", d.Fading, r.Fading),
        ("paper", d.PaperTexture, r.PaperTexture),
        ("lighting", d.Lighting, r.Lighting),
        ("blur", d.BlurSigmaPx, r.BlurSigmaPx),
        ("noise", d.NoiseSigma, r.NoiseSigma),
        ("jpeg", d.JpegQuality, r.JpegQuality),
        ("ruled line", d.RuledLineDarkness, r.RuledLineDarkness),
        ("bleed-through", d.BleedThroughDarkness, r.BleedThroughDarkness),
    ];

    private static IEnumerable<(string Name, double Value, Interval Range)> Intervals(Degradation d, DegradationRanges r) =>
    [
        ("font size", d.FontSizePx, r.FontSizePx),
        ("pad left", d.PadLeftPx, r.PaddingPx),
        ("pad right", d.PadRightPx, r.PaddingPx),
        ("pad top", d.PadTopPx, r.PaddingPx),
        ("pad bottom", d.PadBottomPx, r.PaddingPx),
        ("ink", d.InkLuminance, r.InkLuminance),
        ("paper", d.PaperLuminance, r.PaperLuminance),
        ("wobble period", d.WobblePeriodPx, r.WobblePeriodPx),
        ("elastic sigma", d.ElasticSigmaPx, r.ElasticSigmaPx),
        ("rule offset", d.RuledLineOffsetPx, r.RuledLineOffsetPx),
    ];

    [Fact]
    public void Sampled_values_stay_within_their_ranges()
    {
        var ranges = new DegradationRanges();
        var rng = new Random(1);
        for (var i = 0; i < 2000; i++)
        {
            var d = Degradation.Sample(rng, ranges);
            foreach (var (name, value, effect) in Effects(d, ranges))
                Assert.True(effect.Allows(value), $"{name} = {value}");
            foreach (var (name, value, range) in Intervals(d, ranges))
                Assert.True(range.Contains(value), $"{name} = {value}");
            Assert.InRange(d.WobblePhase, 0, 2 * Math.PI);
        }
    }

    [Fact]
    public void Each_effect_is_applied_about_as_often_as_its_probability()
    {
        const int n = 4000;
        var ranges = new DegradationRanges();
        var rng = new Random(2);
        var samples = Enumerable.Range(0, n).Select(_ => Degradation.Sample(rng, ranges)).ToList();
        foreach (var (name, _, effect) in Effects(samples[0], ranges))
        {
            var on = samples.Count(d => Effects(d, ranges).Single(e => e.Name == name).Value != 0);
            // Binomial count: mean np, standard deviation sqrt(np(1-p)); allow 4 standard deviations.
            var p = effect.Probability;
            var sd = Math.Sqrt(n * p * (1 - p));
            Assert.InRange(on, n * p - 4 * sd - 1, n * p + 4 * sd + 1);
        }
    }

    [Fact]
    public void None_ranges_turn_every_effect_off()
    {
        var rng = new Random(3);
        for (var i = 0; i < 50; i++)
        {
            var d = Degradation.Sample(rng, DegradationRanges.None);
            Assert.All(Effects(d, DegradationRanges.None), e => Assert.Equal(0, e.Value));
            Assert.Equal(new Degradation() with
            {
                Seed = d.Seed,
                WobblePeriodPx = d.WobblePeriodPx,
                WobblePhase = d.WobblePhase,
                ElasticSigmaPx = d.ElasticSigmaPx,
                LightingAngleDegrees = d.LightingAngleDegrees,
                RuledLineOffsetPx = d.RuledLineOffsetPx,
                BleedShift = d.BleedShift,
                BleedOffsetYPx = d.BleedOffsetYPx
            }, d);
        }
    }

    [Fact]
    public void Degradation_round_trips_through_json()
    {
        var d = Degradation.Sample(new Random(4), new DegradationRanges());
        var back = JsonSerializer.Deserialize<Degradation>(JsonSerializer.Serialize(d));
        Assert.Equal(d, back);
    }

    [Fact]
    public void Ranges_reject_reversed_bounds_and_bad_probabilities()
    {
        Assert.Throws<ArgumentException>(() => new Interval(2, 1));
        Assert.Throws<ArgumentException>(() => new Interval(double.NaN, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => new Effect(1.5, 0, 1));
        Assert.Throws<ArgumentOutOfRangeException>(() => new Effect(double.NaN, 0, 1));
        Assert.Throws<ArgumentNullException>(() => Degradation.Sample(null!, new DegradationRanges()));
    }
}
