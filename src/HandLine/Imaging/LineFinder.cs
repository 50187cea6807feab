namespace HandLine.Imaging;

/// <summary>
/// Splits a page (or a strip) of several text lines into line images from the horizontal
/// projection profile of the deskewed ink. Limits: one column of text lines, roughly parallel,
/// separated by at least a little clear space (touching descenders/ascenders merge the two lines);
/// no column layouts, tables or marginal notes; every crop spans the full page width; a line of one narrow
/// mark (a lone "1") beside full lines has too little ink to count.
/// Made once from the tuning values (checked then) and used for every page.
/// </summary>
public sealed class LineFinder
{
    // Common practice, no source: bands under this share of the median line height are dots,
    // accents or underlines and belong to their nearest line.
    private const double FragmentFraction = 0.35;

    // Common practice, no source: context kept above and below a line, as a share of its height.
    private const double PadFraction = 0.25;

    private readonly ImagingOptions _options;

    /// <param name="tuning">The imaging stage's tuning values; null for the defaults.</param>
    /// <exception cref="ArgumentException">A tuning value is out of range.</exception>
    public LineFinder(ImagingOptions? tuning = null)
    {
        var options = tuning ?? new ImagingOptions();
        options.Validate();
        _options = options;
    }

    /// <returns>Lines top to bottom; empty for a blank page; exactly one for a single line.</returns>
    public IReadOnlyList<LineRegion> Split(GrayImage luminance)
    {
        ArgumentNullException.ThrowIfNull(luminance);
        var options = _options;

        var ink = ContrastNormaliser.ToInk(luminance, options);
        if (ink is null)
            return [];

        int factor = (int)Math.Max(1, Math.Ceiling(Math.Sqrt((double)ink.Width * ink.Height / options.EstimationPixels)));
        double deskew = SkewEstimator.Estimate(Resampler.BoxDownscale(ink, factor), options.MaxDeskewDegrees).Degrees;
        var page = luminance;
        // Turn the page only if the drift across it reaches a whole row.
        if (Math.Abs(Math.Tan(deskew * Math.PI / 180)) * ink.Width >= 1)
        {
            var t = UprightTransform.Rotation(ink, deskew);
            var (x0, y0, x1, y1) = t.Bounds(0, 0, ink.Width - 1, ink.Height - 1);
            int w = (int)Math.Ceiling(x1 - x0) + 1, h = (int)Math.Ceiling(y1 - y0) + 1;
            // Fill uncovered corners with the paper level so they read as background in either polarity.
            float paper = Histogram.Quantile(Histogram.Build(luminance.Pixels), 0.5);
            page = t.Render(luminance, Math.Floor(x0), Math.Floor(y0), w, h, paper);
            ink = t.Render(ink, Math.Floor(x0), Math.Floor(y0), w, h, 0f);
        }

        var bands = Bands(RowProfile(ink), options);
        var regions = new List<LineRegion>(bands.Count);
        for (int i = 0; i < bands.Count; i++)
        {
            var (top, bottom) = bands[i];
            int pad = (int)Math.Ceiling(PadFraction * (bottom - top + 1));
            int above = i == 0 ? top : (top - bands[i - 1].Bottom - 1) / 2;
            int below = i == bands.Count - 1 ? page.Height - 1 - bottom : (bands[i + 1].Top - bottom - 1) / 2;
            top -= Math.Min(pad, above);
            bottom += Math.Min(pad, below);
            regions.Add(new LineRegion(Rows(page, top, bottom), top, bottom));
        }
        return regions;
    }

    private static double[] RowProfile(GrayImage ink)
    {
        var profile = new double[ink.Height];
        for (int y = 0; y < ink.Height; y++)
        {
            double s = 0;
            for (int x = 0, o = y * ink.Width; x < ink.Width; x++) s += ink.Pixels[o + x];
            profile[y] = s;
        }
        return profile;
    }

    private static List<(int Top, int Bottom)> Bands(double[] profile, ImagingOptions options)
    {
        // Summed over a wide page, paper noise, uneven lighting and show-through put every row some way above zero,
        // and rows of them crossing a threshold set from the fullest row alone became bands of their own, read as
        // lines of junk. So: a short moving average (noise varies row to row, writing does not); thresholds
        // measured up from the quietest rows' level; and hysteresis (Canny 1986, "A Computational Approach to
        // Edge Detection", IEEE PAMI 8(6)): a band is a run of rows above the low threshold that reaches the
        // high one somewhere, so writing keeps its faint ascender and descender rows and noise makes no band.
        // The high threshold stands NoiseDeviations of the quiet rows' standard deviations above their level,
        // capped at LineSeedFraction of the fullest row, so on clean paper (no deviation) a short line (a total,
        // "Amen") is kept however long the others are.
        profile = Smooth(profile, SmoothingRows);
        var sorted = profile.Order().ToArray();
        double floor = Quantile(sorted, FloorQuantile);
        double range = sorted[^1] - floor;
        double low = floor + options.LineRowFraction * range;
        double deviation = (Quantile(sorted, SpreadQuantile) - floor) / (FloorDeviations - SpreadDeviations);
        double high = Math.Max(low, floor + Math.Min(options.LineSeedFraction * range, NoiseDeviations * deviation));
        var bands = new List<(int Top, int Bottom)>();
        for (int y = 0; y < profile.Length; y++)
        {
            if (profile[y] <= low) continue;
            int start = y;
            bool reachesHigh = profile[y] > high;
            while (y + 1 < profile.Length && profile[y + 1] > low)
                reachesHigh |= profile[++y] > high;
            if (reachesHigh) bands.Add((start, y));
        }
        if (bands.Count <= 1)
            return bands;

        // Close gaps small relative to the typical line (e.g. between i-dots and the letters).
        double median = Median(bands);
        var merged = new List<(int Top, int Bottom)> { bands[0] };
        foreach (var b in bands.Skip(1))
        {
            var last = merged[^1];
            if (b.Top - last.Bottom - 1 < options.LineGapFraction * median)
                merged[^1] = (last.Top, b.Bottom);
            else
                merged.Add(b);
        }

        // Fold thin fragments into the nearer neighbour.
        median = Median(merged);
        for (int i = 0; i < merged.Count && merged.Count > 1;)
        {
            var b = merged[i];
            if (b.Bottom - b.Top + 1 >= FragmentFraction * median) { i++; continue; }
            int gapUp = i > 0 ? b.Top - merged[i - 1].Bottom : int.MaxValue;
            int gapDown = i + 1 < merged.Count ? merged[i + 1].Top - b.Bottom : int.MaxValue;
            if (gapUp <= gapDown)
                merged[i - 1] = (merged[i - 1].Top, b.Bottom);
            else
                merged[i + 1] = (b.Top, merged[i + 1].Bottom);
            merged.RemoveAt(i);
            i = Math.Max(0, i - 1);
        }
        return merged;
    }

    // Common practice, no source: a five-row average, and the level of the quietest tenth of the rows as the
    // paper's (a page, or a line image with any margin, has that many rows between or around its lines).
    private const int SmoothingRows = 5;
    private const double FloorQuantile = 0.1;

    // The quiet rows' standard deviation comes from two quantiles, assuming normal noise: the 10th and 30th
    // percentiles lie 1.2816 and 0.5244 deviations below the mean (standard normal table).
    private const double SpreadQuantile = 0.3, FloorDeviations = 1.2816, SpreadDeviations = 0.5244;

    // Common practice, no source: well beyond chance for noise over a page's few hundred quiet rows.
    private const double NoiseDeviations = 6;

    private static double[] Smooth(double[] profile, int window)
    {
        var smooth = new double[profile.Length];
        int half = window / 2;
        for (int y = 0; y < profile.Length; y++)
        {
            int lo = Math.Max(0, y - half), hi = Math.Min(profile.Length - 1, y + half);
            double s = 0;
            for (int i = lo; i <= hi; i++) s += profile[i];
            smooth[y] = s / (hi - lo + 1);
        }
        return smooth;
    }

    private static double Quantile(double[] sorted, double q) => sorted[(int)(q * (sorted.Length - 1))];

    private static double Median(List<(int Top, int Bottom)> bands)
    {
        var heights = bands.Select(b => b.Bottom - b.Top + 1).Order().ToArray();
        return heights.Length % 2 == 1 ? heights[heights.Length / 2] : (heights[heights.Length / 2 - 1] + heights[heights.Length / 2]) / 2.0;
    }

    private static GrayImage Rows(GrayImage page, int top, int bottom)
    {
        int h = bottom - top + 1;
        var p = new float[page.Width * h];
        Array.Copy(page.Pixels, top * page.Width, p, 0, p.Length);
        return new GrayImage(page.Width, h, p);
    }
}
