namespace HandLine.Imaging;

/// <summary>
/// A cheap first look at which way an image's text runs, from the ink alone (no model).
/// <para>Axis: text lines are long and thin. Cut the ink into bands of rows with ink (much as the line finder does) and
/// measure each band's length along the rows against its height: read the right way, a band is a line and many times
/// longer than high; read across, the bands are letters or words of a turned line, or one block spanning a page, and
/// about as long as high or shorter.</para>
/// <para>It cannot tell 0 from 180 (or 90 from 270): the recogniser settles that with the model. (A cue from the ink
/// above and below the letters' bodies, ascenders against descenders, was tried and picked the right one of the pair
/// for only 60 % of 800 turned validation lines, so it is not used.)</para>
/// </summary>
public static class OrientationEstimator
{
    // Common practice, no source: a row belongs to a band when its ink exceeds this share of the fullest row's.
    private const double BandRowFraction = 0.05;

    // Extent of a band along its length: between these quantiles of its ink, so stray specks do not stretch it.
    private const double ExtentQuantile = 0.01;

    /// <summary>The cues for one image (luminance); null when it holds no ink (left to the normal "no ink" error).</summary>
    public static OrientationGuess? Guess(GrayImage luminance, ImagingOptions? tuning = null)
    {
        ArgumentNullException.ThrowIfNull(luminance);
        var options = tuning ?? new ImagingOptions();
        var ink = ContrastNormaliser.ToInk(luminance, options);
        if (ink is null) return null;
        int factor = (int)Math.Max(1, Math.Ceiling(Math.Sqrt((double)ink.Width * ink.Height / options.EstimationPixels)));
        var small = Resampler.BoxDownscale(ink, factor);
        return new OrientationGuess(Elongation(small), Elongation(QuarterTurn.Upright(small, 90)));
    }

    /// <summary>Ink-weighted mean log elongation (length over height) of the bands of rows with ink.</summary>
    private static double Elongation(GrayImage ink)
    {
        int w = ink.Width, h = ink.Height;
        var rows = new double[h];
        for (int y = 0; y < h; y++)
        {
            double s = 0;
            for (int x = 0, o = y * w; x < w; x++) s += ink.Pixels[o + x];
            rows[y] = s;
        }
        double max = rows.Max();
        if (max <= 0) return 0;
        double elongation = 0, mass = 0;
        var columns = new double[w];
        for (int y = 0; y < h; y++)
        {
            if (rows[y] <= BandRowFraction * max) continue;
            int top = y;
            while (y + 1 < h && rows[y + 1] > BandRowFraction * max) y++;
            int bottom = y;

            Array.Clear(columns);
            double bandMass = 0;
            for (int r = top; r <= bottom; r++)
            {
                for (int x = 0, o = r * w; x < w; x++) columns[x] += ink.Pixels[o + x];
                bandMass += rows[r];
            }
            double length = Extent(columns, bandMass);
            elongation += bandMass * Math.Log(Math.Max(length, 1) / (bottom - top + 1));
            mass += bandMass;
        }
        return mass > 0 ? elongation / mass : 0;
    }

    private static double Extent(double[] profile, double total)
    {
        double cut = ExtentQuantile * total, run = 0;
        int first = 0, last = profile.Length - 1;
        for (; first < profile.Length; first++)
        {
            run += profile[first];
            if (run > cut) break;
        }
        run = 0;
        for (; last > first; last--)
        {
            run += profile[last];
            if (run > cut) break;
        }
        return last - first + 1;
    }
}
