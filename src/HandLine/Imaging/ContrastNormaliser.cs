namespace HandLine.Imaging;

/// <summary>
/// Turns luminance into an ink image (0 paper .. 1 ink): fixes polarity, then stretches so the
/// paper level (a low darkness quantile) maps to 0 and the ink level (a high quantile) to 1.
/// Quantiles rather than min/max keep one stray black or white pixel from setting the scale.
/// </summary>
internal static class ContrastNormaliser
{
    /// <summary>The stretched ink image, or null when the image holds no ink worth the name.</summary>
    public static GrayImage? ToInk(GrayImage luminance, ImagingOptions options)
    {
        var lumHist = Histogram.Build(luminance.Pixels);
        bool invert = !PolarityDetector.IsLightOnDark(lumHist);

        // Darkness histogram = luminance histogram mirrored when ink is dark.
        var hist = new long[256];
        for (int i = 0; i < 256; i++)
            hist[i] = lumHist[invert ? 255 - i : i];

        float paper = Histogram.Quantile(hist, options.BackgroundPercentile);
        float ink = Histogram.Quantile(hist, options.InkPercentile);
        if (ink - paper < options.MinInkContrast)
            ink = Histogram.Quantile(hist, 1.0); // very little ink: its level is the darkest pixel
        if (ink - paper < options.MinInkContrast)
            return null;

        var src = luminance.Pixels;
        var dst = new float[src.Length];
        float scale = 1f / (ink - paper);
        int inkPixels = 0;
        for (int i = 0; i < src.Length; i++)
        {
            float d = invert ? 1f - src[i] : src[i];
            float v = (d - paper) * scale;
            v = v > 0f ? Math.Min(v, 1f) : 0f; // also maps NaN to paper
            dst[i] = v;
            if (v >= 0.5f) inkPixels++;
        }
        return inkPixels < options.MinInkPixels ? null : new GrayImage(luminance.Width, luminance.Height, dst);
    }
}
