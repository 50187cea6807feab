using System.Text;
using HandLine.Imaging;
using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// Draws a line whose digits are real handwritten MNIST samples and whose other characters come from a
/// handwriting font, then applies the same ink degradations as font lines. Pure: the same inputs give the
/// same pixels.
/// </summary>
public static class DigitLineRenderer
{
    private const int MaxPixels = 16_000_000;

    // MNIST crops have no side bearings; this gap (a share of the font size) keeps digits from touching
    // more often than a writer's would (common practice, no source).
    private const double DigitGapEm = 0.08;

    /// <summary>
    /// Renders <paramref name="text"/>; <paramref name="samples"/> gives the MNIST sample index for each
    /// digit of the text in order, all from <paramref name="split"/>.
    /// </summary>
    public static GrayImage Render(string text, IReadOnlyList<int> samples, MnistDigits digits, MnistSplit split, FontFace font, Degradation d)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(samples);
        ArgumentNullException.ThrowIfNull(digits);
        ArgumentNullException.ThrowIfNull(font);
        ArgumentNullException.ThrowIfNull(d);
        if (text.Trim().Length == 0)
            throw new ArgumentException("Text is empty.", nameof(text));
        d.Validate();
        var runes = text.Normalize(NormalizationForm.FormC).EnumerateRunes().ToArray();
        var digitCount = runes.Count(r => r.Value is >= '0' and <= '9');
        if (samples.Count != digitCount)
            throw new ArgumentException($"{digitCount} digits but {samples.Count} samples.", nameof(samples));

        var master = new Random(d.Seed);
        var rng = new Random(master.Next());
        var size = (float)d.FontSizePx;
        using var skFont = new SKFont(font.Typeface, size);
        var cap = FigureHeight(skFont, size);

        // Layout on a baseline at y = 0 (y grows downwards).
        var placed = new List<(float[] Crop, int Cw, int Ch, float X, float Top, float Scale)>();
        using var path = new SKPath();
        float x = 0, top = -cap, bottom = 0;
        var next = 0;
        foreach (var r in runes)
        {
            var jitter = (float)Math.Max(0.6, 1 + d.GlyphScaleJitter * RasterOps.NextGaussian(rng));
            var dy = (float)(d.GlyphOffsetJitterPx * RasterOps.NextGaussian(rng));
            var spacing = (float)(d.LetterSpacingEm * size);
            if (r.Value is >= '0' and <= '9')
            {
                var (crop, cw, ch) = Crop(digits.Sample(r.Value - '0', samples[next++], split));
                // Digits stand on the baseline as tall as the font's own figures.
                var s = cap * jitter / ch;
                var t = -ch * s + dy;
                placed.Add((crop, cw, ch, x, t, s));
                top = Math.Min(top, t);
                bottom = Math.Max(bottom, dy);
                x += cw * s + spacing + (float)(DigitGapEm * size);
            }
            else if (Rune.IsWhiteSpace(r))
            {
                x += 0.3f * size + spacing;
            }
            else
            {
                var glyph = skFont.GetGlyph(r.Value);
                using var g = skFont.GetGlyphPath(glyph);
                var advance = skFont.GetGlyphWidths([glyph], null)[0];
                if (g is not null && !g.IsEmpty)
                {
                    var m = SKMatrix.CreateTranslation(x, dy).PreConcat(SKMatrix.CreateScale(jitter, jitter, 0, 0));
                    path.AddPath(g, in m);
                    var b = path.Bounds;
                    top = Math.Min(top, b.Top);
                    bottom = Math.Max(bottom, b.Bottom);
                }
                x += advance * jitter + spacing;
            }
        }

        // Canvas: content plus padding, with room for the shear and rotation applied below.
        var shear = (float)Math.Tan(d.ShearDegrees * Math.PI / 180);
        var angle = d.RotationDegrees * Math.PI / 180;
        var (sin, cos) = ((float)Math.Sin(angle), (float)Math.Cos(angle));
        var contentH = bottom - top;
        var margin = (float)(d.StrokeWidthPx / 2 + 3 * d.ElasticAlphaPx + 2 * d.BlurSigmaPx + 1);
        var slack = Math.Abs(shear) * contentH + Math.Abs(sin) * contentH;
        var rise = Math.Abs(sin) * x / 2;
        var left = (float)d.PadLeftPx + margin + slack;
        var w = Math.Max(1, (int)Math.Ceiling(left + x + slack + margin + d.PadRightPx));
        var h = Math.Max(1, (int)Math.Ceiling(d.PadTopPx + margin + rise + contentH + rise + margin + d.PadBottomPx));
        if ((long)w * h > MaxPixels)
            throw new ArgumentException($"Line too large to render ({w}x{h} pixels).", nameof(text));
        var baseY = (float)d.PadTopPx + margin + rise - top;

        path.Transform(SKMatrix.CreateTranslation(left, baseY));
        var ink = LineRenderer.Rasterise(path, w, h, d.StrokeWidthPx);
        foreach (var p in placed)
            Stamp(ink, w, h, p.Crop, p.Cw, p.Ch, left + p.X, baseY + p.Top, p.Scale);
        if (shear != 0 || sin != 0)
        {
            // Each output pixel takes its ink from where the leaning, turned writing put it: undo the turn
            // (anticlockwise on the page, y down) about the line's middle, then the lean about the baseline.
            var cx = left + x / 2;
            var dx = new float[w * h];
            var dyField = new float[w * h];
            for (var yy = 0; yy < h; yy++)
                for (var xx = 0; xx < w; xx++)
                {
                    float u = xx - cx, v = yy - baseY;
                    var su = u * cos - v * sin;
                    var sv = u * sin + v * cos;
                    su += shear * sv;
                    dx[yy * w + xx] = su - u;
                    dyField[yy * w + xx] = sv - v;
                }
            ink = RasterOps.Warp(ink, w, h, dx, dyField);
        }
        // The rule runs under the turned baseline: its start is where the unturned line's start went.
        var bu = -x / 2;
        var startX = left + x / 2 + bu * cos;
        var startY = baseY - bu * sin;
        return LineRenderer.Finish(ink, w, h, d, new LineRenderer.Baseline(startX, startY, angle), master);
    }

    /// <summary>
    /// How tall the font's own figures are: digits are drawn at that height so they sit with the font's
    /// separators. Measured from the glyph outlines because some fonts declare nonsense cap heights (0.15 em
    /// in one of ours, which drew specks instead of digits); kept within 0.45–1 em.
    /// </summary>
    private static float FigureHeight(SKFont font, float size)
    {
        var heights = new List<float>();
        for (var c = '0'; c <= '9'; c++)
        {
            using var p = font.GetGlyphPath(font.GetGlyph(c));
            if (p is not null && !p.IsEmpty) heights.Add(p.Bounds.Height);
        }
        var h = heights.Count > 0 ? heights.Average() : 0.7f * size;
        return Math.Clamp(h, 0.45f * size, size);
    }

    /// <summary>The sample cut to its ink (values above 0.1), so every digit's height can be set alike.</summary>
    private static (float[] Crop, int W, int H) Crop(float[] sample)
    {
        int x0 = MnistDigits.Side, x1 = -1, y0 = MnistDigits.Side, y1 = -1;
        for (var y = 0; y < MnistDigits.Side; y++)
            for (var x = 0; x < MnistDigits.Side; x++)
                if (sample[y * MnistDigits.Side + x] > 0.1f)
                {
                    x0 = Math.Min(x0, x); x1 = Math.Max(x1, x);
                    y0 = Math.Min(y0, y); y1 = Math.Max(y1, y);
                }
        if (x1 < 0) return (sample, MnistDigits.Side, MnistDigits.Side); // blank sample: keep its box
        int cw = x1 - x0 + 1, ch = y1 - y0 + 1;
        var crop = new float[cw * ch];
        for (var y = 0; y < ch; y++)
            Array.Copy(sample, (y0 + y) * MnistDigits.Side + x0, crop, y * cw, cw);
        return (crop, cw, ch);
    }

    /// <summary>Scales the crop bilinearly onto the ink canvas at (left, top), keeping the darker of the two.</summary>
    private static void Stamp(float[] ink, int w, int h, float[] crop, int cw, int ch, float left, float top, float scale)
    {
        var x0 = Math.Max(0, (int)MathF.Floor(left));
        var x1 = Math.Min(w - 1, (int)MathF.Ceiling(left + cw * scale));
        var y0 = Math.Max(0, (int)MathF.Floor(top));
        var y1 = Math.Min(h - 1, (int)MathF.Ceiling(top + ch * scale));
        for (var y = y0; y <= y1; y++)
        {
            var sy = (y + 0.5f - top) / scale - 0.5f;
            for (var x = x0; x <= x1; x++)
            {
                var sx = (x + 0.5f - left) / scale - 0.5f;
                var v = RasterOps.Bilinear(crop, cw, ch, sx, sy);
                var i = y * w + x;
                if (v > ink[i]) ink[i] = v;
            }
        }
    }
}
