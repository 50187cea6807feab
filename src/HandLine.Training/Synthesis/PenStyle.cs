using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// How a pen lays a stroke: its width, how much the width swells and thins along the stroke (pressure), and
/// how far the hand strays from the ideal path. Lengths in pixels.
/// </summary>
internal readonly record struct PenStyle(float WidthPx, float WidthVariation, float JitterPx)
{
    /// <summary>
    /// Adds a stroke through <paramref name="local"/> (glyph-local pixels) moved by <paramref name="m"/>. Each
    /// point strays by a Gaussian offset, smoothed along the stroke so the line wavers instead of zigzagging;
    /// the width follows a slow sine of the distance drawn, with its own phase and period per stroke.
    /// </summary>
    public void Draw(InkDrawing ink, ReadOnlySpan<SKPoint> local, SKMatrix m, float emPx, Random rng)
    {
        var n = local.Length;
        var pts = new SKPoint[n];
        var raw = new SKPoint[n];
        for (var i = 0; i < n; i++)
            raw[i] = new SKPoint((float)(JitterPx * RasterOps.NextGaussian(rng)), (float)(JitterPx * RasterOps.NextGaussian(rng)));
        for (var i = 0; i < n; i++)
        {
            // Three-point average of the offsets; the ends keep their own.
            var o = i == 0 || i == n - 1 ? raw[i] : new SKPoint((raw[i - 1].X + raw[i].X + raw[i + 1].X) / 3, (raw[i - 1].Y + raw[i].Y + raw[i + 1].Y) / 3);
            pts[i] = new SKPoint(local[i].X + o.X, local[i].Y + o.Y);
        }
        var phase = 2 * Math.PI * rng.NextDouble();
        var period = emPx * (0.4 + 0.8 * rng.NextDouble());
        var widths = new float[n];
        double s = 0;
        for (var i = 0; i < n; i++)
        {
            if (i > 0)
                s += SKPoint.Distance(pts[i - 1], pts[i]);
            var f = 1 + WidthVariation * Math.Sin(phase + 2 * Math.PI * s / period);
            widths[i] = (float)Math.Max(0.6, WidthPx * f);
        }
        ink.AddStroke(pts, widths, m);
    }
}
