using System.Text;
using HandLine.Imaging;
using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// Draws one text line glyph by glyph and applies the degradations of a <see cref="Degradation"/>.
/// Pure and in memory: the same inputs give the same pixels, and it is safe to call from many threads.
/// </summary>
public static class LineRenderer
{
    private const int MaxPixels = 16_000_000;

    /// <summary>Renders the text as luminance (0 black, 1 white) on a crop around the ink.</summary>
    public static GrayImage Render(string text, FontFace font, Degradation d) => Render(text, font, d, out _);

    /// <summary>As <see cref="Render(string, FontFace, Degradation)"/>, and the row of the crop the writing stands on
    /// (where the line starts), so a page can set the line on its rule.</summary>
    internal static GrayImage Render(string text, FontFace font, Degradation d, out float baselineY)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(font);
        ArgumentNullException.ThrowIfNull(d);
        if (text.Length == 0)
            throw new ArgumentException("Text is empty.", nameof(text));
        d.Validate();

        // Independent streams, so switching one effect on or off leaves the others' noise unchanged.
        var master = new Random(d.Seed);
        var glyphRng = new Random(master.Next());

        using var ink = Layout(text, font, d, glyphRng, out var baseline, out var b);
        var margin = (float)(d.StrokeWidthPx / 2 + 3 * d.ElasticAlphaPx + 2 * d.BlurSigmaPx + 1);
        var left = b.Left - margin - (float)d.PadLeftPx;
        var top = b.Top - margin - (float)d.PadTopPx;
        var w = Math.Max(1, (int)Math.Ceiling(b.Right + margin + d.PadRightPx - left));
        var h = Math.Max(1, (int)Math.Ceiling(b.Bottom + margin + d.PadBottomPx - top));
        if ((long)w * h > MaxPixels)
            throw new ArgumentException($"Line too large to render ({w}x{h} pixels).", nameof(text));
        ink.Transform(SKMatrix.CreateTranslation(-left, -top));
        baseline = new Baseline(baseline.X - left, baseline.Y - top, baseline.AngleRadians);
        baselineY = baseline.Y;

        return Finish(ink.Rasterise(w, h), w, h, d, baseline, master);
    }

    /// <summary>
    /// The degradations that act on drawn ink, shared by font lines and digit lines: erosion, elastic
    /// distortion, fading, pen pressure, paper, ruling, show-through, lighting, blur, noise and JPEG.
    /// <paramref name="master"/> supplies the effects' independent random streams.
    /// </summary>
    internal static GrayImage Finish(float[] ink, int w, int h, Degradation d, Baseline baseline, Random master)
    {
        var elasticNoise = new PixelNoise(master.Next());
        var paperNoise = new PixelNoise(master.Next());
        var fadeRng = new Random(master.Next());
        var pixelNoise = new PixelNoise(master.Next());
        var pressureNoise = new PixelNoise(master.Next());
        RasterOps.Erode(ink, w, h, d.Erosion);
        ink = RasterOps.Elastic(ink, w, h, d.ElasticAlphaPx, d.ElasticSigmaPx, ref elasticNoise);
        if (d.Fading > 0)
            Fade(ink, w, h, d.Fading, fadeRng);
        if (d.PressureVariation > 0)
            Press(ink, w, h, d.PressureVariation, 0.5 * d.FontSizePx, ref pressureNoise);

        var lum = Compose(ink, w, h, d, baseline, ref paperNoise);
        RasterOps.GaussianBlur(lum, w, h, d.BlurSigmaPx);
        RasterOps.AddGaussianNoise(lum, ref pixelNoise, d.NoiseSigma);
        RasterOps.Clamp01(lum);
        if (d.JpegQuality > 0)
            lum = RasterOps.JpegRoundTrip(lum, w, h, d.JpegQuality);
        return new GrayImage(w, h, lum);
    }

    /// <summary>Where the writing line starts on the canvas and its anticlockwise angle, for ruling.</summary>
    internal readonly record struct Baseline(float X, float Y, double AngleRadians);

    /// <summary>The pen of stroke faces and pen-drawn separators for this line, before per-glyph weight.</summary>
    internal static PenStyle LinePen(Degradation d) =>
        new((float)(d.PenWidthEm * d.FontSizePx + d.StrokeWidthPx), (float)d.PenWidthVariation, (float)d.PenJitterPx);

    /// <summary>All glyphs placed one by one, each with its own transform, in unpadded coordinates.</summary>
    private static InkDrawing Layout(
        string text, FontFace face, Degradation d, Random rng, out Baseline baseline, out SKRect bounds)
    {
        var size = (float)d.FontSizePx;
        using var pen = new GlyphPen(face, size);
        var runes = text.Normalize(NormalizationForm.FormC).EnumerateRunes().ToArray();
        var drift = new BaselineDrift(d, runes.Length, new Random(rng.Next()));
        var linePen = LinePen(d);
        var xHeight = pen.XHeight();

        var spacing = (float)(d.LetterSpacingEm * size);
        var wobbleK = 2 * Math.PI / d.WobblePeriodPx;
        var ink = new InkDrawing();
        float x = 0;
        var previousInk = false;
        for (var i = 0; i < runes.Length; i++)
        {
            var r = runes[i];
            var space = Rune.IsWhiteSpace(r);
            var j = GlyphJitter.Draw(rng, d, size, space);
            if (space)
            {
                x += Math.Max(0.15f * size, pen.Advance(r) * j.Scale + j.Gap) + spacing;
                previousInk = false;
                continue;
            }
            // A tucked glyph moves into its left neighbour, so the two touch or overlap.
            if (previousInk)
                x -= j.Tuck;
            var y = (float)(d.WobbleAmplitudePx * Math.Sin(wobbleK * x + d.WobblePhase)) + drift.At(x);
            var glyphPen = linePen with { WidthPx = Math.Max(0.8f, linePen.WidthPx + j.Weight) };
            float advance;
            if (j.PenRoll < d.PenSeparatorShare && PenSeparators.CanDraw(r))
            {
                advance = PenSeparators.Draw(ink, r, j.Transform(x, y, 0.1f * size), size, xHeight, glyphPen, rng);
            }
            else
            {
                advance = pen.Advance(r);
                // Scale, lean and turn about the glyph's foot so jitter does not shift its spacing.
                pen.Draw(ink, r, j.Transform(x, y, advance / 2), (float)d.StrokeWidthPx + j.Weight, glyphPen, rng);
            }
            x += advance * j.Scale + spacing + j.Gap;
            previousInk = true;
        }

        // Shear leans letters (y grows downwards, so positive slant moves tops to the right),
        // then the whole line turns about its middle; positive rotation is anticlockwise on the page.
        var shear = SKMatrix.CreateSkew((float)-Math.Tan(d.ShearDegrees * Math.PI / 180), 0);
        var turn = SKMatrix.CreateRotationDegrees((float)-d.RotationDegrees, x / 2, -size / 3);
        var global = turn.PreConcat(shear);
        ink.Transform(global);
        var origin = global.MapPoint(0, 0);
        baseline = new Baseline(origin.X, origin.Y, d.RotationDegrees * Math.PI / 180);
        // Only spaces: no ink, but keep a blank crop the size of the line.
        bounds = ink.IsEmpty
            ? global.MapRect(SKRect.Create(0, -size * 0.7f, Math.Max(x, 1), size))
            : ink.Bounds;
        return ink;
    }

    /// <summary>
    /// Pen pressure: the ink is multiplied by a smooth random field (Gaussian-smoothed noise about half an em
    /// across), so strokes come out lighter where the hand pressed less; the heaviest parts keep full ink.
    /// </summary>
    private static void Press(float[] ink, int w, int h, double variation, double sigma, ref PixelNoise noise)
    {
        var field = RasterOps.SmoothField(ref noise, w, h, sigma);
        var v = (float)variation;
        for (var i = 0; i < ink.Length; i++)
            ink[i] *= 1 - v * Math.Clamp(0.5f + 0.35f * field[i], 0f, 1f);
    }

    /// <summary>Ink thins out in stretches along the line, as when the pen ran dry.</summary>
    private static void Fade(float[] ink, int w, int h, double fading, Random rng)
    {
        var cell = 60 + 120 * rng.NextDouble();
        var cells = (int)Math.Ceiling(w / cell) + 2;
        var g = new double[cells];
        for (var i = 0; i < cells; i++)
            g[i] = rng.NextDouble();
        for (var x = 0; x < w; x++)
        {
            var t = x / cell;
            var i0 = (int)t;
            var f = t - i0;
            f = f * f * (3 - 2 * f); // smoothstep, so the fade has no kinks
            var v = g[i0] + (g[i0 + 1] - g[i0]) * f;
            // Only the upper part of the noise fades, so some of the line keeps full ink.
            var loss = (float)(fading * Math.Clamp((v - 0.35) / 0.65, 0, 1));
            for (var y = 0; y < h; y++)
                ink[y * w + x] *= 1 - loss;
        }
    }

    /// <summary>Paper, ruling, show-through and ink, then lighting; returns luminance.</summary>
    private static float[] Compose(float[] ink, int w, int h, Degradation d, Baseline baseline, ref PixelNoise noise)
    {
        var lum = new float[w * h];
        var paper = (float)d.PaperLuminance;
        Array.Fill(lum, paper);

        if (d.PaperTexture > 0)
        {
            // Two scales of grain: fibres and blotches.
            var fine = RasterOps.ValueNoise(ref noise, w, h, 3);
            var coarse = RasterOps.ValueNoise(ref noise, w, h, 40);
            var a = (float)d.PaperTexture;
            for (var i = 0; i < lum.Length; i++)
                lum[i] += a * (0.4f * fine[i] + 0.6f * coarse[i]);
        }

        if (d.RuledLineDarkness > 0)
        {
            // A one-pixel rule parallel to the (rotated) baseline, below it by the offset.
            // y grows downwards, so an anticlockwise turn by a runs along (cos a, -sin a); normal (sin a, cos a).
            var nx = (float)Math.Sin(baseline.AngleRadians);
            var ny = (float)Math.Cos(baseline.AngleRadians);
            var off = (float)d.RuledLineOffsetPx;
            var dark = (float)d.RuledLineDarkness;
            for (var y = 0; y < h; y++)
                for (var x = 0; x < w; x++)
                {
                    var dist = Math.Abs((x - baseline.X) * nx + (y - baseline.Y) * ny - off);
                    var cover = Math.Clamp(1.2f - dist, 0f, 1f);
                    if (cover > 0)
                        lum[y * w + x] *= 1 - dark * cover;
                }
        }

        if (d.BleedThroughDarkness > 0)
        {
            // Writing on the back of the leaf: mirrored, shifted and spread by the paper.
            var shift = (int)(d.BleedShift * w);
            var oy = (int)Math.Round(d.BleedOffsetYPx);
            var back = new float[w * h];
            for (var y = 0; y < h; y++)
            {
                var sy = y - oy;
                if ((uint)sy >= (uint)h)
                    continue;
                for (var x = 0; x < w; x++)
                    back[y * w + x] = ink[sy * w + (w - 1 - (x + shift) % w)];
            }
            RasterOps.FastBlur(back, w, h, 1.2);
            var dark = (float)d.BleedThroughDarkness;
            for (var i = 0; i < lum.Length; i++)
                lum[i] *= 1 - dark * back[i];
        }

        var inkLum = (float)d.InkLuminance;
        for (var i = 0; i < lum.Length; i++)
            lum[i] += (inkLum - lum[i]) * ink[i];

        if (d.Lighting > 0)
        {
            // Linear fall-off across the crop in a random direction.
            var ang = d.LightingAngleDegrees * Math.PI / 180;
            var ux = (float)Math.Cos(ang);
            var uy = (float)Math.Sin(ang);
            var span = Math.Abs(ux) * w + Math.Abs(uy) * h;
            var x0 = ux < 0 ? w : 0;
            var y0 = uy < 0 ? h : 0;
            var drop = (float)d.Lighting;
            for (var y = 0; y < h; y++)
                for (var x = 0; x < w; x++)
                {
                    var t = ((x - x0) * ux + (y - y0) * uy) / span;
                    lum[y * w + x] *= 1 - drop * t;
                }
        }
        return lum;
    }
}
