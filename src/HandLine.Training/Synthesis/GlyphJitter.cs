using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// How one glyph strays from the font's design, as a hand's letters do: its own size, height, turn, lean and
/// pen weight, the gap after it, whether it is tucked into its left neighbour, and whether a separator is
/// pen-drawn. Every field is drawn for every character (spaces too), so a text's prefix keeps its glyphs'
/// jitter and the same seed gives the same line.
/// </summary>
internal readonly record struct GlyphJitter(
    float Scale, float OffsetY, float RotationDegrees, float ShearDegrees, float Weight, float Gap, float Tuck, double PenRoll)
{
    public static GlyphJitter Draw(Random rng, Degradation d, float size, bool space)
    {
        var scale = (float)Math.Max(0.5, 1 + d.GlyphScaleJitter * RasterOps.NextGaussian(rng));
        var dy = (float)(d.GlyphOffsetJitterPx * RasterOps.NextGaussian(rng));
        var rot = (float)(d.GlyphRotationJitterDegrees * RasterOps.NextGaussian(rng));
        var shear = (float)(d.GlyphShearJitterDegrees * RasterOps.NextGaussian(rng));
        var weight = (float)(d.GlyphWeightJitterPx * RasterOps.NextGaussian(rng));
        // Word spaces vary more than letter gaps: writers leave anything from a sliver to a wide gap.
        var gap = (float)((space ? 3 : 1) * d.GapJitterEm * size * RasterOps.NextGaussian(rng));
        var touchRoll = rng.NextDouble();
        var depth = rng.NextDouble();
        var tuck = touchRoll < d.TouchProbability ? (float)(d.TouchDepthEm * size * (0.5 + 0.5 * depth)) : 0;
        return new GlyphJitter(scale, dy, rot, shear, weight, gap, tuck, rng.NextDouble());
    }

    /// <summary>
    /// Glyph-local to line coordinates: scale, lean (about the foot) and turn about the foot's middle
    /// <paramref name="cx"/>, then move to (<paramref name="x"/>, <paramref name="y"/>).
    /// </summary>
    public SKMatrix Transform(float x, float y, float cx) =>
        SKMatrix.CreateTranslation(x, y + OffsetY)
            .PreConcat(SKMatrix.CreateRotationDegrees(RotationDegrees, cx, 0))
            .PreConcat(SKMatrix.CreateSkew((float)-Math.Tan(ShearDegrees * Math.PI / 180), 0))
            .PreConcat(SKMatrix.CreateScale(Scale, Scale, cx, 0));
}
