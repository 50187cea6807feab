namespace HandLine.Imaging;

/// <summary>
/// The affine map from source pixel coordinates to the "upright" frame: undo the line's rotation
/// (turn it clockwise by the deskew angle about the image centre), then undo the slant with a
/// horizontal shear about row <see cref="ShearCentreY"/> of the rotated frame.
/// Sign conventions (screen coordinates, y down): a positive deskew angle is text turned
/// counter-clockwise (baseline rising to the right); a positive slant is strokes leaning right
/// (tops further right than bottoms), as in forward-slanted script.
/// </summary>
internal readonly record struct UprightTransform(double CentreX, double CentreY, double DeskewDegrees, double SlantDegrees, double ShearCentreY)
{
    private double Cos => Math.Cos(DeskewDegrees * Math.PI / 180);
    private double Sin => Math.Sin(DeskewDegrees * Math.PI / 180);
    private double Tan => Math.Tan(SlantDegrees * Math.PI / 180);

    public static UprightTransform Rotation(GrayImage image, double deskewDegrees) =>
        new((image.Width - 1) / 2.0, (image.Height - 1) / 2.0, deskewDegrees, 0, 0);

    public (double X, double Y) Forward(double x, double y)
    {
        double dx = x - CentreX, dy = y - CentreY;
        double rx = dx * Cos - dy * Sin, ry = dx * Sin + dy * Cos;
        return (rx + (ry - ShearCentreY) * Tan, ry);
    }

    /// <summary>Upright-frame bounds of a source rectangle (pixel centres, inclusive).</summary>
    public (double X0, double Y0, double X1, double Y1) Bounds(int x0, int y0, int x1, int y1)
    {
        double minX = double.MaxValue, minY = double.MaxValue, maxX = double.MinValue, maxY = double.MinValue;
        foreach (var (x, y) in new[] { (x0, y0), (x1, y0), (x0, y1), (x1, y1) })
        {
            var (u, v) = Forward(x, y);
            minX = Math.Min(minX, u); maxX = Math.Max(maxX, u);
            minY = Math.Min(minY, v); maxY = Math.Max(maxY, v);
        }
        return (minX, minY, maxX, maxY);
    }

    /// <summary>
    /// Renders the upright-frame window whose top-left pixel centre is (originX, originY), output
    /// pixels <paramref name="step"/> upright units apart (step &gt; 1 renders smaller), sampling the
    /// source bilinearly through the inverse map; outside the source reads as <paramref name="fill"/>.
    /// </summary>
    public GrayImage Render(GrayImage source, double originX, double originY, int width, int height, float fill, double step = 1)
    {
        double cos = Cos, sin = Sin, tan = Tan;
        // Inverse map is affine: x = ax·u + bx·v + cx, y = ay·u + by·v + cy.
        double ax = cos, ay = -sin;
        double bx = -tan * cos + sin, by = tan * sin + cos;
        double sx = ax * step, sy = ay * step;
        double cx = ShearCentreY * tan * cos + CentreX, cy = -ShearCentreY * tan * sin + CentreY;

        int sw = source.Width, sh = source.Height;
        var src = source.Pixels;
        var dst = new float[(long)width * height];
        for (int j = 0; j < height; j++)
        {
            double v = originY + j * step;
            double x = ax * originX + bx * v + cx, y = ay * originX + by * v + cy;
            int o = j * width;
            for (int i = 0; i < width; i++, x += sx, y += sy)
            {
                if (x <= -1 || y <= -1 || x >= sw || y >= sh)
                {
                    dst[o + i] = fill;
                    continue;
                }
                // x, y > −1 here, so truncating x + 1 floors x (cheaper than Math.Floor).
                int x0 = (int)(x + 1) - 1, y0 = (int)(y + 1) - 1;
                float fx = (float)(x - x0), fy = (float)(y - y0);
                if (x0 >= 0 && y0 >= 0 && x0 + 1 < sw && y0 + 1 < sh)
                {
                    int p = y0 * sw + x0;
                    float top = src[p] + (src[p + 1] - src[p]) * fx;
                    float bottom = src[p + sw] + (src[p + sw + 1] - src[p + sw]) * fx;
                    dst[o + i] = top + (bottom - top) * fy;
                }
                else
                {
                    float a = At(src, sw, sh, x0, y0, fill), b = At(src, sw, sh, x0 + 1, y0, fill);
                    float c = At(src, sw, sh, x0, y0 + 1, fill), d = At(src, sw, sh, x0 + 1, y0 + 1, fill);
                    float top = a + (b - a) * fx, bottom = c + (d - c) * fx;
                    dst[o + i] = top + (bottom - top) * fy;
                }
            }
        }
        return new GrayImage(width, height, dst);
    }

    private static float At(float[] src, int w, int h, int x, int y, float fill) =>
        x >= 0 && y >= 0 && x < w && y < h ? src[y * w + x] : fill;
}
