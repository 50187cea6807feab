using HandLine.Formats;
using HandLine.Imaging;

namespace HandLine.Layout;

/// <summary>
/// The upright page as a window of the turned page: which rotation undid the skew and where the window starts, so
/// boxes found upright map back to the scan's own pixels.
/// </summary>
internal sealed class PageFrame
{
    private readonly UprightTransform _t;
    private readonly double _originX, _originY;
    private readonly int _width, _height;

    private PageFrame(UprightTransform t, double originX, double originY, int width, int height, bool identity)
    {
        _t = t; _originX = originX; _originY = originY; _width = width; _height = height; IsIdentity = identity;
    }

    public bool IsIdentity { get; }

    /// <summary>The frame that turns the page upright; no turn when the drift across the page stays under a pixel.</summary>
    public static PageFrame For(GrayImage page, double deskewDegrees)
    {
        var t = UprightTransform.Rotation(page, deskewDegrees);
        if (Math.Abs(Math.Tan(deskewDegrees * Math.PI / 180)) * Math.Max(page.Width, page.Height) < 1)
            return new PageFrame(t, -(page.Width - 1) / 2.0, -(page.Height - 1) / 2.0, page.Width, page.Height, true);
        var (x0, y0, x1, y1) = t.Bounds(0, 0, page.Width - 1, page.Height - 1);
        return new PageFrame(t, Math.Floor(x0), Math.Floor(y0), (int)Math.Ceiling(x1 - x0) + 1, (int)Math.Ceiling(y1 - y0) + 1, false);
    }

    /// <summary>The upright page, paper (1) where the turned page does not reach.</summary>
    public GrayImage Render(GrayImage page) => _t.Render(page, _originX, _originY, _width, _height, 1f);

    /// <summary>Where an upright pixel lies on the page (the inverse of the turn).</summary>
    public (double X, double Y) ToPage(double u, double v)
    {
        if (IsIdentity) return (u, v);
        double r = _t.DeskewDegrees * Math.PI / 180, cos = Math.Cos(r), sin = Math.Sin(r);
        double uu = _originX + u, vv = _originY + v;
        return (cos * uu + sin * vv + _t.CentreX, -sin * uu + cos * vv + _t.CentreY);
    }

    /// <summary>The page-pixel box holding an upright box (inclusive pixel bounds), clipped to the page.</summary>
    public LineBox ToPageBox(int minX, int minY, int maxX, int maxY, int pageWidth, int pageHeight)
    {
        double left = double.MaxValue, top = double.MaxValue, right = double.MinValue, bottom = double.MinValue;
        foreach (var (u, v) in new[] { (minX - 0.5, minY - 0.5), (maxX + 0.5, minY - 0.5), (minX - 0.5, maxY + 0.5), (maxX + 0.5, maxY + 0.5) })
        {
            var (x, y) = ToPage(u, v);
            left = Math.Min(left, x); right = Math.Max(right, x);
            top = Math.Min(top, y); bottom = Math.Max(bottom, y);
        }
        int x0 = Math.Clamp((int)Math.Round(left + 0.5), 0, pageWidth - 1), y0 = Math.Clamp((int)Math.Round(top + 0.5), 0, pageHeight - 1);
        int x1 = Math.Clamp((int)Math.Round(right - 0.5), x0, pageWidth - 1), y1 = Math.Clamp((int)Math.Round(bottom - 0.5), y0, pageHeight - 1);
        return new LineBox(x0, y0, x1 - x0 + 1, y1 - y0 + 1);
    }
}
