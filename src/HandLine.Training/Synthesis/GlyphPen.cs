using System.Text;
using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// One face at one size for one render: gives each character's advance and adds its ink to an
/// <see cref="InkDrawing"/> under a per-glyph transform, as a filled outline (outline fonts) or as pen strokes
/// (Hershey faces). Glyph-local coordinates put the glyph's left edge at x = 0 and its baseline at y = 0 (y down).
/// </summary>
internal sealed class GlyphPen : IDisposable
{
    // Hershey faces have no em; their capitals are scaled to the share of the em that outline fonts' capitals
    // usually take (about 0.7 em; common practice, no source), so the two kinds of face come out alike in size.
    private const float CapHeightEm = 0.7f;

    private readonly SKFont? _font;
    private readonly HersheyFont? _strokes;
    private readonly float _unit;
    private readonly float _baseY;

    public GlyphPen(FontFace face, float size)
    {
        Size = size;
        if (face.StrokeFont is { } strokes)
        {
            _strokes = strokes;
            var (capTop, capBottom) = YRange(strokes.Glyph('H')) ?? (-12, 9);
            _unit = CapHeightEm * size / Math.Max(1, capBottom - capTop);
            _baseY = capBottom;
        }
        else
        {
            _font = new SKFont(face.Typeface!, size);
        }
    }

    public float Size { get; }

    public bool IsStroke => _strokes is not null;

    /// <summary>Advance in pixels; whitespace the face lacks is 0.3 em.</summary>
    public float Advance(Rune r)
    {
        if (_strokes is not null)
        {
            var g = _strokes.Glyph(r.Value);
            return g is null ? (Rune.IsWhiteSpace(r) ? 0.3f * Size : 0) : g.Advance * _unit;
        }
        var glyph = _font!.GetGlyph(r.Value);
        return glyph == 0 && Rune.IsWhiteSpace(r) ? 0.3f * Size : _font.GetGlyphWidths([glyph], null)[0];
    }

    /// <summary>Adds the character's ink; outline glyphs get a thickening stroke, stroke glyphs the pen.</summary>
    public void Draw(InkDrawing ink, Rune r, SKMatrix m, float outlineStroke, PenStyle pen, Random rng)
    {
        if (Rune.IsWhiteSpace(r))
            return;
        if (_strokes is not null)
        {
            var g = _strokes.Glyph(r.Value);
            if (g is null)
                return;
            foreach (var stroke in g.Strokes)
            {
                var local = new SKPoint[stroke.Count];
                for (var i = 0; i < stroke.Count; i++)
                    local[i] = new SKPoint((stroke[i].X - g.Left) * _unit, (stroke[i].Y - _baseY) * _unit);
                pen.Draw(ink, local, m, Size, rng);
            }
            return;
        }
        var glyph = _font!.GetGlyph(r.Value);
        if (glyph == 0)
            return;
        using var path = _font.GetGlyphPath(glyph);
        if (path is not null && !path.IsEmpty)
            ink.AddOutline(path, m, outlineStroke);
    }

    /// <summary>
    /// How tall the face's own figures are. Measured from the glyphs because some fonts declare nonsense cap
    /// heights (0.15 em in one of ours, which drew specks instead of digits); kept within 0.45–1 em.
    /// </summary>
    public float FigureHeight()
    {
        var heights = new List<float>();
        for (var c = '0'; c <= '9'; c++)
        {
            if (_strokes is not null)
            {
                if (YRange(_strokes.Glyph(c)) is { } y)
                    heights.Add((y.Bottom - y.Top) * _unit);
                continue;
            }
            using var p = _font!.GetGlyphPath(_font.GetGlyph(c));
            if (p is not null && !p.IsEmpty) heights.Add(p.Bounds.Height);
        }
        var h = heights.Count > 0 ? heights.Average() : 0.7f * Size;
        return Math.Clamp(h, 0.45f * Size, Size);
    }

    /// <summary>Height of the lower-case x above the baseline (0.5 em when the face has none), for placing dashes and colons.</summary>
    public float XHeight()
    {
        float h;
        if (_strokes is not null)
            h = YRange(_strokes.Glyph('x')) is { } y ? (_baseY - y.Top) * _unit : 0;
        else
        {
            using var p = _font!.GetGlyphPath(_font.GetGlyph('x'));
            h = p is null || p.IsEmpty ? 0 : -p.Bounds.Top;
        }
        return h > 0.2f * Size && h < Size ? h : 0.5f * Size;
    }

    private static (int Top, int Bottom)? YRange(HersheyGlyph? g)
    {
        if (g is null || g.Strokes.Count == 0)
            return null;
        var ys = g.Strokes.SelectMany(s => s).Select(p => p.Y).ToArray();
        return (ys.Min(), ys.Max());
    }

    public void Dispose() => _font?.Dispose();
}
