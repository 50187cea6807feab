using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// The ink of one line before rasterising: filled glyph outlines, each with its own thickening stroke, and pen
/// strokes (polylines whose width varies point by point). Built glyph by glyph, each with its own transform,
/// then moved as a whole.
/// </summary>
internal sealed class InkDrawing : IDisposable
{
    private readonly List<(SKPath Path, float Stroke)> _outlines = [];
    private readonly List<(SKPoint[] Points, float[] Widths)> _strokes = [];

    public bool IsEmpty => _outlines.Count == 0 && _strokes.Count == 0;

    /// <summary>Adds a copy of the outline moved by <paramref name="m"/>, filled and stroked <paramref name="stroke"/> px wide.</summary>
    public void AddOutline(SKPath path, SKMatrix m, float stroke)
    {
        var copy = new SKPath(path);
        copy.Transform(m);
        _outlines.Add((copy, Math.Max(0, stroke)));
    }

    /// <summary>Adds a pen stroke through the points moved by <paramref name="m"/>; widths are per point, in pixels.</summary>
    public void AddStroke(ReadOnlySpan<SKPoint> points, ReadOnlySpan<float> widths, SKMatrix m)
    {
        if (points.Length == 0 || points.Length != widths.Length)
            throw new ArgumentException("A stroke needs one width per point.");
        // MapPoints returns a new array; it does not map in place.
        _strokes.Add((m.MapPoints(points.ToArray()), widths.ToArray()));
    }

    /// <summary>Moves everything; widths are kept (the line transforms scale by about 1).</summary>
    public void Transform(SKMatrix m)
    {
        foreach (var (path, _) in _outlines)
            path.Transform(m);
        for (var i = 0; i < _strokes.Count; i++)
            _strokes[i] = (m.MapPoints(_strokes[i].Points), _strokes[i].Widths);
    }

    /// <summary>The box holding all ink, pen widths included; empty when there is no ink.</summary>
    public SKRect Bounds
    {
        get
        {
            var b = SKRect.Empty;
            var any = false;
            void Union(SKRect r)
            {
                b = any ? SKRect.Union(b, r) : r;
                any = true;
            }
            foreach (var (path, stroke) in _outlines)
                if (!path.IsEmpty)
                {
                    var r = path.Bounds;
                    r.Inflate(stroke / 2, stroke / 2);
                    Union(r);
                }
            foreach (var (points, widths) in _strokes)
                for (var i = 0; i < points.Length; i++)
                {
                    var half = widths[i] / 2;
                    Union(new SKRect(points[i].X - half, points[i].Y - half, points[i].X + half, points[i].Y + half));
                }
            return b;
        }
    }

    /// <summary>Ink coverage in [0, 1]: antialiased fills and their strokes, then the pen strokes segment by segment.</summary>
    public float[] Rasterise(int w, int h)
    {
        if (IsEmpty)
            return new float[w * h];
        using var bmp = new SKBitmap(new SKImageInfo(w, h, SKColorType.Alpha8, SKAlphaType.Premul));
        using (var canvas = new SKCanvas(bmp))
        using (var paint = new SKPaint { IsAntialias = true, Color = SKColors.Black })
        {
            canvas.Clear(SKColors.Transparent);
            paint.StrokeJoin = SKStrokeJoin.Round;
            paint.StrokeCap = SKStrokeCap.Round;
            foreach (var (path, stroke) in _outlines)
            {
                paint.Style = SKPaintStyle.Fill;
                canvas.DrawPath(path, paint);
                if (stroke > 0)
                {
                    paint.Style = SKPaintStyle.Stroke;
                    paint.StrokeWidth = stroke;
                    canvas.DrawPath(path, paint);
                }
            }
            paint.Style = SKPaintStyle.Stroke;
            foreach (var (points, widths) in _strokes)
            {
                if (points.Length == 1)
                {
                    paint.Style = SKPaintStyle.Fill;
                    canvas.DrawCircle(points[0], widths[0] / 2, paint);
                    paint.Style = SKPaintStyle.Stroke;
                    continue;
                }
                // Round-capped segments, each as wide as the mean of its ends, so the width changes along the stroke.
                for (var i = 0; i + 1 < points.Length; i++)
                {
                    paint.StrokeWidth = (widths[i] + widths[i + 1]) / 2;
                    canvas.DrawLine(points[i], points[i + 1], paint);
                }
            }
        }
        return RasterOps.FromByteBitmap(bmp);
    }

    public void Dispose()
    {
        foreach (var (path, _) in _outlines)
            path.Dispose();
        _outlines.Clear();
        _strokes.Clear();
    }
}
