namespace HandLine.Imaging;

/// <summary>
/// Decides whether a luminance image is light ink on dark ground (negatives, chalk-board photos).
/// Paper is most of a text image, so the median sits at the paper level; whichever tail (darkest
/// or brightest few percent) lies farther from the median is the ink.
/// </summary>
internal static class PolarityDetector
{
    // Common practice, no source: the tails must be smaller than the ink share of a typical line.
    private const double TailFraction = 0.02;

    public static bool IsLightOnDark(long[] luminanceHistogram)
    {
        float median = Histogram.Quantile(luminanceHistogram, 0.5);
        float dark = Histogram.TailMean(luminanceHistogram, TailFraction, fromTop: false);
        float bright = Histogram.TailMean(luminanceHistogram, TailFraction, fromTop: true);
        return bright - median > median - dark;
    }
}
