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
        using var pen = new GlyphPen(font, size);
        var cap = pen.FigureHeight();
        var xHeight = pen.XHeight();
        var drift = new BaselineDrift(d, runes.Length, new Random(rng.Next()));
        var linePen = LineRenderer.LinePen(d);
        var spacing = (float)(d.LetterSpacingEm * size);

        // Layout on a baseline at y = 0 (y grows downwards). Each digit is placed by its own transform from
        // crop pixels; separators and letters go into the ink drawing.
        var placed = new List<(float[] Crop, int Cw, int Ch, SKMatrix ToLine)>();
        using var ink = new InkDrawing();
        var box = SKRect.Create(0, -cap, 0, cap);
        float x = 0;
        var previousInk = false;
        var next = 0;
        foreach (var r in runes)
        {
            var space = Rune.IsWhiteSpace(r);
            var j = GlyphJitter.Draw(rng, d, size, space);
            if (space)
            {
                x += Math.Max(0.15f * size, 0.3f * size * j.Scale + j.Gap) + spacing;
                previousInk = false;
                continue;
            }
            if (previousInk)
                x -= j.Tuck;
            var y = drift.At(x);
            var glyphPen = linePen with { WidthPx = Math.Max(0.8f, linePen.WidthPx + j.Weight) };
            if (r.Value is >= '0' and <= '9')
            {
                var (crop, cw, ch) = Crop(digits.Sample(r.Value - '0', samples[next++], split));
                // Digits stand on the baseline as tall as the face's own figures.
                var s = cap / ch;
                var width = cw * s;
                var m = j.Transform(x, y, width / 2)
                    .PreConcat(SKMatrix.CreateTranslation(0, -ch * s))
                    .PreConcat(SKMatrix.CreateScale(s, s));
                placed.Add((crop, cw, ch, m));
                box = SKRect.Union(box, m.MapRect(SKRect.Create(0, 0, cw, ch)));
                // MNIST crops have no side bearings: a small gap keeps digits apart about as often as a
                // writer's are (common practice, no source); the jitter and tuck make some touch, some stand wide.
                x += width * j.Scale + spacing + (float)(DigitGapEm * size) + j.Gap;
            }
            else if (j.PenRoll < d.DigitPenSeparatorShare && PenSeparators.CanDraw(r))
            {
                x += PenSeparators.Draw(ink, r, j.Transform(x, y, 0.1f * size), size, xHeight, glyphPen, rng) * j.Scale + spacing + j.Gap;
            }
            else
            {
                var advance = pen.Advance(r);
                pen.Draw(ink, r, j.Transform(x, y, advance / 2), (float)d.StrokeWidthPx + j.Weight, glyphPen, rng);
                x += advance * j.Scale + spacing + j.Gap;
            }
            previousInk = true;
        }
        if (!ink.IsEmpty)
            box = SKRect.Union(box, ink.Bounds);
        box = SKRect.Union(box, SKRect.Create(0, box.Top, Math.Max(x, 1), 1));

        // Canvas: content plus padding, with room for the shear and rotation applied below.
        var shear = (float)Math.Tan(d.ShearDegrees * Math.PI / 180);
        var angle = d.RotationDegrees * Math.PI / 180;
        var (sin, cos) = ((float)Math.Sin(angle), (float)Math.Cos(angle));
        var top = box.Top;
        var contentH = box.Bottom - top;
        var contentW = box.Width;
        var margin = (float)(d.StrokeWidthPx / 2 + 3 * d.ElasticAlphaPx + 2 * d.BlurSigmaPx + 1);
        var slack = Math.Abs(shear) * contentH + Math.Abs(sin) * contentH;
        var rise = Math.Abs(sin) * contentW / 2;
        var left = (float)d.PadLeftPx + margin + slack;
        var w = Math.Max(1, (int)Math.Ceiling(left + contentW + slack + margin + d.PadRightPx));
        var h = Math.Max(1, (int)Math.Ceiling(d.PadTopPx + margin + rise + contentH + rise + margin + d.PadBottomPx));
        if ((long)w * h > MaxPixels)
            throw new ArgumentException($"Line too large to render ({w}x{h} pixels).", nameof(text));
        var baseY = (float)d.PadTopPx + margin + rise - top;
        var toCanvas = SKMatrix.CreateTranslation(left - box.Left, baseY);

        ink.Transform(toCanvas);
        var inkPixels = ink.Rasterise(w, h);
        foreach (var p in placed)
            Stamp(inkPixels, w, h, p.Crop, p.Cw, p.Ch, toCanvas.PreConcat(p.ToLine));
        if (shear != 0 || sin != 0)
        {
            // Each output pixel takes its ink from where the leaning, turned writing put it: undo the turn
            // (anticlockwise on the page, y down) about the line's middle, then the lean about the baseline.
            var cx = left + contentW / 2;
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
            inkPixels = RasterOps.Warp(inkPixels, w, h, dx, dyField);
        }
        // The rule runs under the turned baseline: its start is where the unturned line's start went.
        var bu = -contentW / 2;
        var startX = left + contentW / 2 + bu * cos;
        var startY = baseY - bu * sin;
        return LineRenderer.Finish(inkPixels, w, h, d, new LineRenderer.Baseline(startX, startY, angle), master);
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

    /// <summary>
    /// Draws the crop onto the ink canvas through <paramref name="toCanvas"/> (crop pixels to canvas pixels),
    /// sampling bilinearly through the inverse map and keeping the darker of the two.
    /// </summary>
    private static void Stamp(float[] ink, int w, int h, float[] crop, int cw, int ch, SKMatrix toCanvas)
    {
        if (!toCanvas.TryInvert(out var inv))
            return;
        var b = toCanvas.MapRect(SKRect.Create(0, 0, cw, ch));
        var x0 = Math.Max(0, (int)MathF.Floor(b.Left));
        var x1 = Math.Min(w - 1, (int)MathF.Ceiling(b.Right));
        var y0 = Math.Max(0, (int)MathF.Floor(b.Top));
        var y1 = Math.Min(h - 1, (int)MathF.Ceiling(b.Bottom));
        for (var y = y0; y <= y1; y++)
        {
            for (var x = x0; x <= x1; x++)
            {
                var s = inv.MapPoint(x + 0.5f, y + 0.5f);
                var v = RasterOps.Bilinear(crop, cw, ch, s.X - 0.5f, s.Y - 0.5f);
                var i = y * w + x;
                if (v > ink[i]) ink[i] = v;
            }
        }
    }
}
