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
    public static GrayImage Render(string text, FontFace font, Degradation d)
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

        using var path = Layout(text, font, d, glyphRng, out var baseline, out var b);
        var margin = (float)(d.StrokeWidthPx / 2 + 3 * d.ElasticAlphaPx + 2 * d.BlurSigmaPx + 1);
        var left = b.Left - margin - (float)d.PadLeftPx;
        var top = b.Top - margin - (float)d.PadTopPx;
        var w = Math.Max(1, (int)Math.Ceiling(b.Right + margin + d.PadRightPx - left));
        var h = Math.Max(1, (int)Math.Ceiling(b.Bottom + margin + d.PadBottomPx - top));
        if ((long)w * h > MaxPixels)
            throw new ArgumentException($"Line too large to render ({w}x{h} pixels).", nameof(text));
        path.Transform(SKMatrix.CreateTranslation(-left, -top));
        baseline = new Baseline(baseline.X - left, baseline.Y - top, baseline.AngleRadians);

        var ink = Rasterise(path, w, h, d.StrokeWidthPx);
        return Finish(ink, w, h, d, baseline, master);
    }

    /// <summary>
    /// The degradations that act on drawn ink, shared by font lines and digit lines: erosion, elastic
    /// distortion, fading, paper, ruling, show-through, lighting, blur, noise and JPEG. <paramref name="master"/>
    /// supplies the effects' independent random streams.
    /// </summary>
    internal static GrayImage Finish(float[] ink, int w, int h, Degradation d, Baseline baseline, Random master)
    {
        var elasticNoise = new PixelNoise(master.Next());
        var paperNoise = new PixelNoise(master.Next());
        var fadeRng = new Random(master.Next());
        var pixelNoise = new PixelNoise(master.Next());
        RasterOps.Erode(ink, w, h, d.Erosion);
        if (d.ElasticAlphaPx > 0)
        {
            // Elastic distortion: smooth random displacement field (Simard, Steinkraus & Platt 2003).
            var dx = RasterOps.SmoothField(ref elasticNoise, w, h, d.ElasticSigmaPx);
            var dy = RasterOps.SmoothField(ref elasticNoise, w, h, d.ElasticSigmaPx);
            var a = (float)d.ElasticAlphaPx;
            for (var i = 0; i < dx.Length; i++)
            {
                dx[i] *= a;
                dy[i] *= a;
            }
            ink = RasterOps.Warp(ink, w, h, dx, dy);
        }
        if (d.Fading > 0)
            Fade(ink, w, h, d.Fading, fadeRng);

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

    /// <summary>All glyph outlines placed on one path, in unpadded coordinates.</summary>
    private static SKPath Layout(
        string text, FontFace face, Degradation d, Random rng, out Baseline baseline, out SKRect bounds)
    {
        var size = (float)d.FontSizePx;
        using var font = new SKFont(face.Typeface, size);
        var runes = text.Normalize(NormalizationForm.FormC).EnumerateRunes().ToArray();
        var glyphs = new ushort[runes.Length];
        for (var i = 0; i < runes.Length; i++)
            glyphs[i] = font.GetGlyph(runes[i].Value);
        var advances = font.GetGlyphWidths(glyphs, null);

        var spacing = (float)(d.LetterSpacingEm * size);
        var wobbleK = 2 * Math.PI / d.WobblePeriodPx;
        var combined = new SKPath();
        float x = 0;
        for (var i = 0; i < runes.Length; i++)
        {
            var advance = glyphs[i] == 0 && Rune.IsWhiteSpace(runes[i]) ? 0.3f * size : advances[i];
            // Jitter is drawn for every glyph (even spaces) so a text prefix keeps its glyphs' jitter.
            var scale = (float)Math.Max(0.5, 1 + d.GlyphScaleJitter * RasterOps.NextGaussian(rng));
            var dy = (float)(d.GlyphOffsetJitterPx * RasterOps.NextGaussian(rng));
            var rot = (float)(d.GlyphRotationJitterDegrees * RasterOps.NextGaussian(rng));
            if (glyphs[i] != 0 && !Rune.IsWhiteSpace(runes[i]))
            {
                using var g = font.GetGlyphPath(glyphs[i]);
                if (g is not null && !g.IsEmpty)
                {
                    var wobble = (float)(d.WobbleAmplitudePx * Math.Sin(wobbleK * x + d.WobblePhase));
                    // Scale and turn about the glyph's foot so jitter does not shift its spacing.
                    var cx = advance / 2;
                    var m = SKMatrix.CreateTranslation(x, wobble + dy)
                        .PreConcat(SKMatrix.CreateRotationDegrees(rot, cx, 0))
                        .PreConcat(SKMatrix.CreateScale(scale, scale, cx, 0));
                    combined.AddPath(g, in m);
                }
            }
            x += advance * scale + spacing;
        }

        // Shear leans letters (y grows downwards, so positive slant moves tops to the right),
        // then the whole line turns about its middle; positive rotation is anticlockwise on the page.
        var shear = SKMatrix.CreateSkew((float)-Math.Tan(d.ShearDegrees * Math.PI / 180), 0);
        var turn = SKMatrix.CreateRotationDegrees((float)-d.RotationDegrees, x / 2, -size / 3);
        var global = turn.PreConcat(shear);
        combined.Transform(global);
        var origin = global.MapPoint(0, 0);
        baseline = new Baseline(origin.X, origin.Y, d.RotationDegrees * Math.PI / 180);
        // Only spaces: no ink, but keep a blank crop the size of the line.
        bounds = combined.IsEmpty
            ? global.MapRect(SKRect.Create(0, -size * 0.7f, Math.Max(x, 1), size))
            : combined.Bounds;
        return combined;
    }

    /// <summary>Ink coverage in [0, 1] from an antialiased fill, plus an outline stroke to thicken.</summary>
    internal static float[] Rasterise(SKPath path, int w, int h, double strokeWidth)
    {
        if (path.IsEmpty)
            return new float[w * h];
        using var bmp = new SKBitmap(new SKImageInfo(w, h, SKColorType.Alpha8, SKAlphaType.Premul));
        using (var canvas = new SKCanvas(bmp))
        using (var paint = new SKPaint { IsAntialias = true, Color = SKColors.Black, Style = SKPaintStyle.Fill })
        {
            canvas.Clear(SKColors.Transparent);
            canvas.DrawPath(path, paint);
            if (strokeWidth > 0)
            {
                paint.Style = SKPaintStyle.Stroke;
                paint.StrokeWidth = (float)strokeWidth;
                paint.StrokeJoin = SKStrokeJoin.Round;
                paint.StrokeCap = SKStrokeCap.Round;
                canvas.DrawPath(path, paint);
            }
        }
        return RasterOps.FromByteBitmap(bmp);
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
