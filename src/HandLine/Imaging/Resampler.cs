namespace HandLine.Imaging;

/// <summary>
/// Separable resizing: area averaging along an axis that shrinks (every source pixel contributes
/// in proportion to its overlap, so thin strokes fade rather than vanish or alias) and bilinear
/// interpolation along an axis that grows.
/// </summary>
internal static class Resampler
{
    public static GrayImage Resize(GrayImage source, int width, int height)
    {
        if (width == source.Width && height == source.Height)
            return source;
        var horizontal = ResizeRows(source.Pixels, source.Width, source.Height, width);
        var both = Transpose(ResizeRows(Transpose(horizontal, width, source.Height), source.Height, width, height), height, width);
        return new GrayImage(width, height, both);
    }

    /// <summary>Integer box downscale (each output pixel = mean of a factor×factor block, partial blocks at the edges).</summary>
    public static GrayImage BoxDownscale(GrayImage source, int factor)
    {
        if (factor <= 1)
            return source;
        int sw = source.Width, w = (sw + factor - 1) / factor, h = (source.Height + factor - 1) / factor;
        var result = new float[w * h];
        var rowSum = new float[w];
        var src = source.Pixels;
        for (int oy = 0; oy < h; oy++)
        {
            Array.Clear(rowSum);
            int y1 = Math.Min(source.Height, (oy + 1) * factor);
            for (int y = oy * factor; y < y1; y++)
            {
                int row = y * sw;
                for (int ox = 0, x = 0; ox < w; ox++)
                {
                    int x1 = Math.Min(sw, x + factor);
                    float acc = 0;
                    for (; x < x1; x++) acc += src[row + x];
                    rowSum[ox] += acc;
                }
            }
            int rows = y1 - oy * factor;
            for (int ox = 0; ox < w; ox++)
            {
                int cols = Math.Min(sw, (ox + 1) * factor) - ox * factor;
                result[oy * w + ox] = rowSum[ox] / (rows * cols);
            }
        }
        return new GrayImage(w, h, result);
    }

    private static float[] ResizeRows(float[] src, int srcW, int rows, int dstW)
    {
        var dst = new float[(long)dstW * rows];
        if (dstW == srcW)
        {
            Array.Copy(src, dst, src.Length);
            return dst;
        }
        var (index, weight) = dstW < srcW ? AreaWeights(srcW, dstW) : LinearWeights(srcW, dstW);
        int taps = index.Length / dstW;
        for (int y = 0; y < rows; y++)
        {
            int so = y * srcW, o = y * dstW;
            for (int i = 0; i < dstW; i++)
            {
                float acc = 0;
                for (int t = 0; t < taps; t++)
                    acc += src[so + index[i * taps + t]] * weight[i * taps + t];
                dst[o + i] = acc;
            }
        }
        return dst;
    }

    // Output pixel i covers source [i·s, (i+1)·s) with s = srcW/dstW > 1.
    private static (int[] Index, float[] Weight) AreaWeights(int srcW, int dstW)
    {
        double s = (double)srcW / dstW;
        int taps = (int)Math.Ceiling(s) + 1;
        var index = new int[dstW * taps];
        var weight = new float[dstW * taps];
        for (int i = 0; i < dstW; i++)
        {
            double a = i * s, b = (i + 1) * s;
            int first = (int)Math.Floor(a);
            for (int t = 0; t < taps; t++)
            {
                int k = Math.Min(first + t, srcW - 1);
                double overlap = Math.Max(0, Math.Min(b, first + t + 1) - Math.Max(a, first + t));
                index[i * taps + t] = k;
                weight[i * taps + t] = (float)(overlap / s);
            }
        }
        return (index, weight);
    }

    // Pixel-centre alignment: output centre i maps to source (i + 0.5)·srcW/dstW − 0.5, clamped.
    private static (int[] Index, float[] Weight) LinearWeights(int srcW, int dstW)
    {
        var index = new int[dstW * 2];
        var weight = new float[dstW * 2];
        double s = (double)srcW / dstW;
        for (int i = 0; i < dstW; i++)
        {
            double x = Math.Clamp((i + 0.5) * s - 0.5, 0, srcW - 1);
            int x0 = (int)Math.Floor(x);
            int x1 = Math.Min(x0 + 1, srcW - 1);
            float f = (float)(x - x0);
            index[2 * i] = x0; weight[2 * i] = 1 - f;
            index[2 * i + 1] = x1; weight[2 * i + 1] = f;
        }
        return (index, weight);
    }

    private static float[] Transpose(float[] src, int w, int h)
    {
        var dst = new float[src.Length];
        for (int y = 0; y < h; y++)
            for (int x = 0; x < w; x++)
                dst[x * h + y] = src[y * w + x];
        return dst;
    }
}
