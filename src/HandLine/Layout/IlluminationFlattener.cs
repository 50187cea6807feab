using HandLine.Imaging;

namespace HandLine.Layout;

/// <summary>
/// Illumination flattening by background division: the paper's level is estimated everywhere as a grey-level
/// closing (a maximum filter, then a minimum filter) of the luminance over a window wider than any stroke, smoothed, and each pixel is
/// divided by it, so uneven light, stains and yellowed paper all come out as paper of level 1 while ink keeps its
/// contrast to the paper around it (common practice, no source). The maximum runs on blocks of a quarter window,
/// so the cost and the memory beyond the output are small even for a large page.
/// </summary>
internal static class IlluminationFlattener
{
    /// <summary>The flattened page: paper 1, ink darker; dark-on-light (a light-on-dark page is inverted first).</summary>
    public static GrayImage Flatten(GrayImage luminance, int window)
    {
        ArgumentNullException.ThrowIfNull(luminance);
        int w = luminance.Width, h = luminance.Height;
        var src = luminance.Pixels;
        var invert = PolarityDetector.IsLightOnDark(Histogram.Build(src));
        var block = Math.Max(2, window / 4);
        int gw = (w + block - 1) / block, gh = (h + block - 1) / block;

        // Brightest pixel of each block, then the brightest block within two blocks: the paper under the window.
        var blockMax = new float[gw * gh];
        for (var y = 0; y < h; y++)
        {
            var row = (y / block) * gw;
            for (var x = 0; x < w; x++)
            {
                var v = invert ? 1 - src[y * w + x] : src[y * w + x];
                ref var m = ref blockMax[row + x / block];
                if (v > m) m = v;
            }
        }
        var paper = new float[gw * gh];
        for (var by = 0; by < gh; by++)
            for (var bx = 0; bx < gw; bx++)
            {
                float m = 0;
                for (var dy = -2; dy <= 2; dy++)
                    for (var dx = -2; dx <= 2; dx++)
                    {
                        int x = bx + dx, y = by + dy;
                        if ((uint)x < (uint)gw && (uint)y < (uint)gh && blockMax[y * gw + x] > m) m = blockMax[y * gw + x];
                    }
                paper[by * gw + bx] = m;
            }
        // Then the darkest of those within three blocks (a grey-level closing: the maximum, then the minimum): the
        // maximum alone carries the paper's level over a window's width into a stain or a shadow, whose edge then
        // stands out as dark as ink; the minimum brings the level back to where the stain begins. It reaches one
        // block further than the maximum, because the block that straddles a stain's edge has the paper's level:
        // paper just outside a stain then comes out brighter than paper (clipped to 1) rather than the stain's
        // edge darker. Dark areas narrower than the maximum's reach (ink) are filled by it and stay filled.
        var closed = new float[gw * gh];
        for (var by = 0; by < gh; by++)
            for (var bx = 0; bx < gw; bx++)
            {
                var m = float.MaxValue;
                for (var dy = -3; dy <= 3; dy++)
                    for (var dx = -3; dx <= 3; dx++)
                    {
                        int x = bx + dx, y = by + dy;
                        if ((uint)x < (uint)gw && (uint)y < (uint)gh && paper[y * gw + x] < m) m = paper[y * gw + x];
                    }
                closed[by * gw + bx] = m;
            }
        paper = Smooth(closed, gw, gh);

        var dst = new float[src.Length];
        for (var y = 0; y < h; y++)
        {
            // Block centres sit at (i + 0.5) * block: interpolate between the four around each pixel.
            var gy = Math.Clamp((y + 0.5f) / block - 0.5f, 0, gh - 1);
            int y0 = (int)gy, y1 = Math.Min(gh - 1, y0 + 1);
            var fy = gy - y0;
            for (var x = 0; x < w; x++)
            {
                var gx = Math.Clamp((x + 0.5f) / block - 0.5f, 0, gw - 1);
                int x0 = (int)gx, x1 = Math.Min(gw - 1, x0 + 1);
                var fx = gx - x0;
                var top = paper[y0 * gw + x0] + (paper[y0 * gw + x1] - paper[y0 * gw + x0]) * fx;
                var bottom = paper[y1 * gw + x0] + (paper[y1 * gw + x1] - paper[y1 * gw + x0]) * fx;
                var level = Math.Max(0.05f, top + (bottom - top) * fy);
                var v = invert ? 1 - src[y * w + x] : src[y * w + x];
                dst[y * w + x] = Math.Min(1f, v / level);
            }
        }
        return new GrayImage(w, h, dst);
    }

    /// <summary>Two passes of a 3x3 mean, so the paper level has no steps at block edges.</summary>
    private static float[] Smooth(float[] g, int gw, int gh)
    {
        for (var pass = 0; pass < 2; pass++)
        {
            var next = new float[g.Length];
            for (var y = 0; y < gh; y++)
                for (var x = 0; x < gw; x++)
                {
                    float s = 0;
                    var n = 0;
                    for (var dy = -1; dy <= 1; dy++)
                        for (var dx = -1; dx <= 1; dx++)
                        {
                            int xx = x + dx, yy = y + dy;
                            if ((uint)xx >= (uint)gw || (uint)yy >= (uint)gh) continue;
                            s += g[yy * gw + xx];
                            n++;
                        }
                    next[y * gw + x] = s / n;
                }
            g = next;
        }
        return g;
    }
}
