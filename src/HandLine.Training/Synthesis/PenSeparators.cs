using System.Text;
using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// Separators in figures drawn as quick pen strokes rather than font glyphs: slash (also the fraction bar of
/// "19/11"), dash, full stop, colon and comma. Each shape varies in length, lean and height from line to line,
/// as a hand's does. Geometry is glyph-local: the foot of the mark at x = 0 on the baseline y = 0 (y down).
/// </summary>
internal static class PenSeparators
{
    public static bool CanDraw(Rune r) => r.Value is '/' or '-' or '.' or ':' or ',';

    /// <summary>Draws the mark with <paramref name="pen"/> and returns its advance in pixels.</summary>
    public static float Draw(InkDrawing ink, Rune r, SKMatrix m, float em, float xHeight, PenStyle pen, Random rng)
    {
        float U(double lo, double hi) => (float)(lo + (hi - lo) * rng.NextDouble());
        var side = 0.06f * em + pen.WidthPx / 2;
        switch (r.Value)
        {
            case '/':
            {
                // From below the baseline up past the figure height; a fraction bar in "3/4" is the same
                // stroke drawn a little longer and steeper.
                // Leaning well past the upright of a figure one, so the two are not confused.
                var rise = U(0.8, 1.05) * em;
                var run = U(0.32, 0.55) * em;
                var bow = U(-0.04, 0.04) * em;
                SKPoint[] p = [new(side, U(0.0, 0.12) * em), new(side + run / 2 + bow, -rise / 2), new(side + run, -rise)];
                pen.Draw(ink, Subdivide(p), m, em, rng);
                return run + 2 * side;
            }
            case '-':
            {
                var len = U(0.22, 0.45) * em;
                var y = -xHeight * U(0.4, 0.6);
                var tilt = U(-0.05, 0.05) * len;
                var sag = U(-0.03, 0.03) * em;
                SKPoint[] p = [new(side, y + tilt), new(side + len / 2, y + sag), new(side + len, y - tilt)];
                pen.Draw(ink, Subdivide(p), m, em, rng);
                return len + 2 * side;
            }
            case '.':
                Dot(ink, side, -U(0.0, 0.06) * em, m, em, pen, rng);
                return 2 * side + pen.WidthPx;
            case ',':
            {
                var top = -U(0.0, 0.06) * em;
                SKPoint[] p = [new(side + 0.03f * em, top), new(side + 0.01f * em, top + 0.08f * em), new(side - 0.04f * em, top + U(0.14, 0.22) * em)];
                pen.Draw(ink, Subdivide(p), m, em, rng);
                return 2 * side + 0.04f * em;
            }
            case ':':
            {
                var dx = U(-0.03, 0.03) * em;
                Dot(ink, side, -U(0.0, 0.06) * em, m, em, pen, rng);
                Dot(ink, side + dx, -xHeight * U(0.65, 0.85), m, em, pen, rng);
                return 2 * side + pen.WidthPx + Math.Max(0, dx);
            }
            default:
                throw new ArgumentException($"No pen shape for U+{r.Value:X4}.", nameof(r));
        }
    }

    /// <summary>A dot is a tiny dab: a short stroke a little wider than the pen.</summary>
    private static void Dot(InkDrawing ink, float x, float y, SKMatrix m, float em, PenStyle pen, Random rng)
    {
        var len = (float)(0.02 + 0.04 * rng.NextDouble()) * em;
        var angle = Math.PI * rng.NextDouble();
        var dot = pen with { WidthPx = pen.WidthPx * 1.4f, JitterPx = 0 };
        SKPoint[] p = [new(x, y), new(x + len * (float)Math.Cos(angle), y - len * (float)Math.Sin(angle))];
        dot.Draw(ink, p, m, em, rng);
    }

    /// <summary>Adds points along each segment so the pen's jitter and pressure can bend and swell the stroke.</summary>
    private static SKPoint[] Subdivide(SKPoint[] p, int perSegment = 4)
    {
        var result = new List<SKPoint>();
        for (var i = 0; i + 1 < p.Length; i++)
            for (var k = 0; k < perSegment; k++)
            {
                var t = k / (float)perSegment;
                result.Add(new SKPoint(p[i].X + (p[i + 1].X - p[i].X) * t, p[i].Y + (p[i + 1].Y - p[i].Y) * t));
            }
        result.Add(p[^1]);
        return result.ToArray();
    }
}
