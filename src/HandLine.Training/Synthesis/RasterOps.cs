using System.Runtime.InteropServices;
using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>Pixel operations on row-major float planes used by the line renderer.</summary>
internal static class RasterOps
{
    /// <summary>Separable Gaussian blur, kernel cut at 3 sigma, edges clamped.</summary>
    public static void GaussianBlur(float[] p, int w, int h, double sigma)
    {
        if (sigma <= 0)
            return;
        var r = Math.Max(1, (int)Math.Ceiling(3 * sigma));
        var k = new float[2 * r + 1];
        double sum = 0;
        for (var i = -r; i <= r; i++)
            sum += k[i + r] = (float)Math.Exp(-i * i / (2 * sigma * sigma));
        for (var i = 0; i < k.Length; i++)
            k[i] = (float)(k[i] / sum);

        // Each row or column is copied into a buffer padded by edge replication, so the inner loop has no bounds logic.
        var line = new float[Math.Max(w, h) + 2 * r];
        for (var y = 0; y < h; y++)
        {
            var row = y * w;
            for (var i = 0; i < w + 2 * r; i++)
                line[i] = p[row + Math.Clamp(i - r, 0, w - 1)];
            for (var x = 0; x < w; x++)
            {
                float acc = 0;
                for (var i = 0; i < k.Length; i++)
                    acc += k[i] * line[x + i];
                p[row + x] = acc;
            }
        }
        for (var x = 0; x < w; x++)
        {
            for (var i = 0; i < h + 2 * r; i++)
                line[i] = p[Math.Clamp(i - r, 0, h - 1) * w + x];
            for (var y = 0; y < h; y++)
            {
                float acc = 0;
                for (var i = 0; i < k.Length; i++)
                    acc += k[i] * line[y + i];
                p[y * w + x] = acc;
            }
        }
    }

    /// <summary>
    /// Approximate Gaussian blur by three box filters (cascaded uniform filters; by the central
    /// limit theorem the variance adds: sigma^2 = n (b^2 - 1) / 12 for n boxes of width b).
    /// O(1) per pixel whatever sigma, which matters for wide elastic fields.
    /// </summary>
    public static void FastBlur(float[] p, int w, int h, double sigma)
    {
        // Box width b = 2r + 1 from sigma^2 = 3 (b^2 - 1) / 12.
        var b = Math.Sqrt(4 * sigma * sigma + 1);
        var radius = Math.Max(1, (int)Math.Round((b - 1) / 2));
        var tmp = new float[Math.Max(w, h)];
        for (var pass = 0; pass < 3; pass++)
        {
            BoxRows(p, w, h, radius, tmp);
            BoxColumns(p, w, h, radius, tmp);
        }
    }

    private static void BoxRows(float[] p, int w, int h, int r, float[] tmp)
    {
        var norm = 1f / (2 * r + 1);
        for (var y = 0; y < h; y++)
        {
            var row = y * w;
            float acc = 0;
            for (var i = -r; i <= r; i++)
                acc += p[row + Math.Clamp(i, 0, w - 1)];
            for (var x = 0; x < w; x++)
            {
                tmp[x] = acc * norm;
                acc += p[row + Math.Min(x + r + 1, w - 1)] - p[row + Math.Max(x - r, 0)];
            }
            Array.Copy(tmp, 0, p, row, w);
        }
    }

    private static void BoxColumns(float[] p, int w, int h, int r, float[] tmp)
    {
        var norm = 1f / (2 * r + 1);
        for (var x = 0; x < w; x++)
        {
            float acc = 0;
            for (var i = -r; i <= r; i++)
                acc += p[Math.Clamp(i, 0, h - 1) * w + x];
            for (var y = 0; y < h; y++)
            {
                tmp[y] = acc * norm;
                acc += p[Math.Min(y + r + 1, h - 1) * w + x] - p[Math.Max(y - r, 0) * w + x];
            }
            for (var y = 0; y < h; y++)
                p[y * w + x] = tmp[y];
        }
    }

    /// <summary>
    /// Smooth random field with zero mean and unit RMS: Gaussian-smoothed uniform noise. Built on a
    /// grid a few times coarser than sigma and bilinearly enlarged, which keeps the low frequencies
    /// the smoothing leaves and costs far less.
    /// </summary>
    public static float[] SmoothField(ref PixelNoise noise, int w, int h, double sigma)
    {
        var cell = Math.Max(1.0, sigma / 3);
        var gw = (int)Math.Ceiling(w / cell) + 2;
        var gh = (int)Math.Ceiling(h / cell) + 2;
        var g = new float[gw * gh];
        for (var i = 0; i < g.Length; i++)
            g[i] = noise.NextSigned();
        FastBlur(g, gw, gh, sigma / cell);
        double mean = 0;
        foreach (var v in g)
            mean += v;
        mean /= g.Length;
        double sq = 0;
        foreach (var v in g)
            sq += (v - mean) * (v - mean);
        var scale = sq > 0 ? 1 / Math.Sqrt(sq / g.Length) : 0;
        for (var i = 0; i < g.Length; i++)
            g[i] = (float)((g[i] - mean) * scale);
        return Enlarge(g, gw, w, h, cell);
    }

    /// <summary>Bilinear enlargement of a coarse grid with the given cell size.</summary>
    private static float[] Enlarge(float[] g, int gw, int w, int h, double cellPx)
    {
        var f = new float[w * h];
        var inv = 1 / cellPx;
        for (var y = 0; y < h; y++)
        {
            var gy = y * inv;
            var y0 = (int)gy;
            var ty = (float)(gy - y0);
            var r0 = y0 * gw;
            var r1 = r0 + gw;
            for (var x = 0; x < w; x++)
            {
                var gx = x * inv;
                var x0 = (int)gx;
                var tx = (float)(gx - x0);
                var a = g[r0 + x0] + (g[r0 + x0 + 1] - g[r0 + x0]) * tx;
                var b = g[r1 + x0] + (g[r1 + x0 + 1] - g[r1 + x0]) * tx;
                f[y * w + x] = a + (b - a) * ty;
            }
        }
        return f;
    }

    /// <summary>Value noise: random values on a coarse grid, bilinearly interpolated, in [-1, 1].</summary>
    public static float[] ValueNoise(ref PixelNoise noise, int w, int h, double cellPx)
    {
        var gw = (int)Math.Ceiling(w / cellPx) + 2;
        var gh = (int)Math.Ceiling(h / cellPx) + 2;
        var g = new float[gw * gh];
        for (var i = 0; i < g.Length; i++)
            g[i] = noise.NextSigned();
        return Enlarge(g, gw, w, h, cellPx);
    }

    /// <summary>
    /// Elastic distortion (Simard, Steinkraus &amp; Platt 2003, "Best practices for convolutional neural networks
    /// applied to visual document analysis", ICDAR): each pixel moves by a smooth random displacement field,
    /// uniform noise smoothed by a Gaussian of <paramref name="sigma"/> and scaled to an RMS of
    /// <paramref name="alpha"/> pixels. Returns the input itself when alpha is 0.
    /// </summary>
    public static float[] Elastic(float[] ink, int w, int h, double alpha, double sigma, ref PixelNoise noise)
    {
        if (alpha <= 0)
            return ink;
        var dx = SmoothField(ref noise, w, h, sigma);
        var dy = SmoothField(ref noise, w, h, sigma);
        var a = (float)alpha;
        for (var i = 0; i < dx.Length; i++)
        {
            dx[i] *= a;
            dy[i] *= a;
        }
        return Warp(ink, w, h, dx, dy);
    }

    /// <summary>Moves each pixel by the displacement field, sampling bilinearly (outside = 0).</summary>
    public static float[] Warp(float[] src, int w, int h, float[] dx, float[] dy)
    {
        var dst = new float[src.Length];
        for (var y = 0; y < h; y++)
        {
            for (var x = 0; x < w; x++)
            {
                var i = y * w + x;
                var sx = x + dx[i];
                var sy = y + dy[i];
                var x0 = (int)MathF.Floor(sx);
                var y0 = (int)MathF.Floor(sy);
                var tx = sx - x0;
                var ty = sy - y0;
                if (x0 >= 0 && y0 >= 0 && x0 + 1 < w && y0 + 1 < h)
                {
                    var k = y0 * w + x0;
                    var a = src[k] + (src[k + 1] - src[k]) * tx;
                    var b = src[k + w] + (src[k + w + 1] - src[k + w]) * tx;
                    dst[i] = a + (b - a) * ty;
                }
                else
                {
                    dst[i] = Bilinear(src, w, h, sx, sy);
                }
            }
        }
        return dst;
    }

    /// <summary>Bilinear sample at (x, y) in pixel-centre coordinates; outside the image is 0.</summary>
    public static float Bilinear(float[] p, int w, int h, float x, float y)
    {
        var x0 = (int)MathF.Floor(x);
        var y0 = (int)MathF.Floor(y);
        var tx = x - x0;
        var ty = y - y0;
        var a = At(p, w, h, x0, y0) + (At(p, w, h, x0 + 1, y0) - At(p, w, h, x0, y0)) * tx;
        var b = At(p, w, h, x0, y0 + 1) + (At(p, w, h, x0 + 1, y0 + 1) - At(p, w, h, x0, y0 + 1)) * tx;
        return a + (b - a) * ty;
    }

    private static float At(float[] p, int w, int h, int x, int y) =>
        (uint)x < (uint)w && (uint)y < (uint)h ? p[y * w + x] : 0;

    /// <summary>3x3 minimum (grey-level erosion of ink), mixed in by the given share.</summary>
    public static void Erode(float[] ink, int w, int h, double share) => Filter3x3(ink, w, h, share, Math.Min);

    /// <summary>3x3 maximum (grey-level dilation of ink), mixed in by the given share.</summary>
    public static void Dilate(float[] ink, int w, int h, double share) => Filter3x3(ink, w, h, share, Math.Max);

    /// <summary>Rank filter over each 3x3 neighbourhood (outside the image is paper, 0), mixed in by the share.</summary>
    private static void Filter3x3(float[] ink, int w, int h, double share, Func<float, float, float> pick)
    {
        if (share <= 0)
            return;
        var src = (float[])ink.Clone();
        var s = (float)share;
        for (var y = 0; y < h; y++)
        {
            for (var x = 0; x < w; x++)
            {
                var k = y * w + x;
                var m = src[k];
                for (var j = -1; j <= 1; j++)
                    for (var i = -1; i <= 1; i++)
                        m = pick(m, At(src, w, h, x + i, y + j));
                ink[k] += (m - ink[k]) * s;
            }
        }
    }

    public static void AddGaussianNoise(float[] p, ref PixelNoise noise, double sigma)
    {
        if (sigma <= 0)
            return;
        var s = (float)sigma;
        for (var i = 0; i < p.Length; i++)
            p[i] += s * noise.NextNormal();
    }

    /// <summary>Standard normal deviate by the Box-Muller transform.</summary>
    public static double NextGaussian(Random rng)
    {
        var u1 = 1 - rng.NextDouble();
        var u2 = rng.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }

    public static void Clamp01(float[] p)
    {
        for (var i = 0; i < p.Length; i++)
            p[i] = Math.Clamp(p[i], 0f, 1f);
    }

    /// <summary>8-bit greyscale bitmap of luminance in [0, 1]; caller disposes.</summary>
    public static SKBitmap ToGray8(float[] p, int w, int h)
    {
        var bmp = new SKBitmap(new SKImageInfo(w, h, SKColorType.Gray8, SKAlphaType.Opaque));
        var row = new byte[bmp.RowBytes];
        var ptr = bmp.GetPixels();
        for (var y = 0; y < h; y++)
        {
            for (var x = 0; x < w; x++)
                row[x] = (byte)Math.Clamp((int)MathF.Round(p[y * w + x] * 255f), 0, 255);
            Marshal.Copy(row, 0, ptr + y * bmp.RowBytes, bmp.RowBytes);
        }
        return bmp;
    }

    /// <summary>Reads an 8-bit single-channel bitmap (Gray8 or Alpha8) into floats in [0, 1].</summary>
    public static float[] FromByteBitmap(SKBitmap bmp)
    {
        var w = bmp.Width;
        var h = bmp.Height;
        var bytes = bmp.GetPixelSpan();
        var stride = bmp.RowBytes;
        var p = new float[w * h];
        const float inv = 1f / 255f;
        for (var y = 0; y < h; y++)
            for (var x = 0; x < w; x++)
                p[y * w + x] = bytes[y * stride + x] * inv;
        return p;
    }

    /// <summary>JPEG encode then decode, leaving the block and ringing artefacts in the pixels.</summary>
    public static float[] JpegRoundTrip(float[] p, int w, int h, int quality)
    {
        using var bmp = ToGray8(p, w, h);
        using var data = bmp.Encode(SKEncodedImageFormat.Jpeg, quality)
            ?? throw new InvalidOperationException("JPEG encoding failed.");
        using var codec = SKCodec.Create(data) ?? throw new InvalidOperationException("JPEG decoding failed.");
        using var decoded = SKBitmap.Decode(codec, new SKImageInfo(w, h, SKColorType.Gray8, SKAlphaType.Opaque))
            ?? throw new InvalidOperationException("JPEG decoding failed.");
        return FromByteBitmap(decoded);
    }

    /// <summary>Lossless 8-bit greyscale PNG.</summary>
    public static byte[] EncodePng(float[] p, int w, int h)
    {
        using var bmp = ToGray8(p, w, h);
        using var data = bmp.Encode(SKEncodedImageFormat.Png, 100)
            ?? throw new InvalidOperationException("PNG encoding failed.");
        return data.ToArray();
    }
}
