namespace HandLine.Imaging;

/// <summary>Global (Otsu) and local (Sauvola) thresholding of images with values in 0..1.</summary>
public static class Binariser
{
    /// <summary>
    /// Otsu's threshold (Otsu 1979, "A threshold selection method from gray-level histograms"):
    /// the split of a 256-bin histogram (bin = round(v·255)) that maximises the between-class
    /// variance σ_B²(k) = (μ_T·ω(k) − μ(k))² / (ω(k)·(1 − ω(k))). Returns the boundary between
    /// bin k* and k*+1, i.e. (k* + 0.5)/255, so values above it form the upper class.
    /// A plateau of equal maxima (empty bins between two modes) resolves to its middle.
    /// A single-valued image returns that value plus half a bin.
    /// </summary>
    public static float Otsu(GrayImage image)
    {
        ArgumentNullException.ThrowIfNull(image);
        var hist = Histogram.Build(image.Pixels);
        return (OtsuBin(hist) + 0.5f) / 255f;
    }

    /// <summary>Otsu's k* on a 256-bin histogram; exposed for the histogram-level tests.</summary>
    internal static int OtsuBin(long[] hist)
    {
        double total = 0, sumAll = 0;
        for (int i = 0; i < hist.Length; i++)
        {
            total += hist[i];
            sumAll += (double)i * hist[i];
        }
        if (total == 0)
            return 0;
        double muT = sumAll / total;

        double omega = 0, mu = 0, best = -1;
        int first = -1, last = -1;
        for (int k = 0; k < hist.Length - 1; k++)
        {
            double p = hist[k] / total;
            omega += p;
            mu += k * p;
            if (omega <= 0 || omega >= 1)
                continue;
            double num = muT * omega - mu;
            double sigmaB = num * num / (omega * (1 - omega));
            // Relative tolerance so that rounding noise does not break a true plateau.
            if (sigmaB > best * (1 + 1e-12))
            {
                best = sigmaB;
                first = last = k;
            }
            else if (sigmaB >= best * (1 - 1e-12))
            {
                last = k;
            }
        }
        if (first < 0)
        {
            // One occupied bin: nothing to split; put the boundary just above it.
            for (int i = 0; i < hist.Length; i++)
                if (hist[i] > 0)
                    return i;
            return 0;
        }
        return (first + last) / 2;
    }

    /// <summary>
    /// Sauvola &amp; Pietikäinen (2000, "Adaptive document image binarization") on a luminance
    /// image (dark ink on light paper): pixel is ink when below T = m·(1 + k·(s/R − 1)), with m and s
    /// the mean and (population) standard deviation in a window×window square, clipped at the borders.
    /// Returns a luminance image: 0 for ink, 1 for paper.
    /// </summary>
    /// <param name="r">Dynamic range of s; 128 of 255 in the paper, hence 0.5 for 0..1 values.</param>
    public static GrayImage Sauvola(GrayImage luminance, int window, double k, double r = 0.5)
    {
        var t = SauvolaThresholds(luminance, window, k, r);
        var src = luminance.Pixels;
        var dst = new float[src.Length];
        for (int i = 0; i < dst.Length; i++)
            dst[i] = src[i] < t.Pixels[i] ? 0f : 1f;
        return new GrayImage(luminance.Width, luminance.Height, dst);
    }

    /// <summary>The per-pixel Sauvola threshold map; O(pixels) via integral images of v and v².</summary>
    public static GrayImage SauvolaThresholds(GrayImage luminance, int window, double k, double r = 0.5)
    {
        ArgumentNullException.ThrowIfNull(luminance);
        if (window < 1 || window % 2 == 0)
            throw new ArgumentOutOfRangeException(nameof(window), window, "Window must be a positive odd number.");
        if (!double.IsFinite(k) || k <= 0 || k >= 1)
            throw new ArgumentOutOfRangeException(nameof(k), k, "k must be between 0 and 1.");
        if (!double.IsFinite(r) || r <= 0)
            throw new ArgumentOutOfRangeException(nameof(r), r, "R must be positive.");

        int w = luminance.Width, h = luminance.Height, stride = w + 1;
        var px = luminance.Pixels;
        // Double sums: float integrals lose the small variances of flat paper over large images.
        var sum = new double[(h + 1) * stride];
        var sq = new double[(h + 1) * stride];
        for (int y = 0; y < h; y++)
        {
            double rowSum = 0, rowSq = 0;
            for (int x = 0; x < w; x++)
            {
                double v = px[y * w + x];
                rowSum += v;
                rowSq += v * v;
                int i = (y + 1) * stride + x + 1;
                sum[i] = sum[i - stride] + rowSum;
                sq[i] = sq[i - stride] + rowSq;
            }
        }

        int half = window / 2;
        var result = new float[px.Length];
        for (int y = 0; y < h; y++)
        {
            int y0 = Math.Max(0, y - half), y1 = Math.Min(h, y + half + 1);
            for (int x = 0; x < w; x++)
            {
                int x0 = Math.Max(0, x - half), x1 = Math.Min(w, x + half + 1);
                double n = (double)(y1 - y0) * (x1 - x0);
                int a = y0 * stride + x0, b = y0 * stride + x1, c = y1 * stride + x0, d = y1 * stride + x1;
                double m = (sum[d] - sum[b] - sum[c] + sum[a]) / n;
                double variance = Math.Max(0, (sq[d] - sq[b] - sq[c] + sq[a]) / n - m * m);
                double s = Math.Sqrt(variance);
                result[y * w + x] = (float)(m * (1 + k * (s / r - 1)));
            }
        }
        return new GrayImage(w, h, result);
    }
}
