using HandLine.Imaging;

namespace HandLine.Layout;

/// <summary>
/// Whether a page's text lines run across it or down it, from its writing alone (no model), after the local
/// projection-profile idea of Le, Thoma and Wechsler, "Automated page orientation and skew angle detection for binary
/// document images", Pattern Recognition 27(10), 1994 (the idea recalled from memory; the measures below are our own):
/// cut the page into squares, and in each square with writing compare its profile across the rows with its profile
/// across the columns. Two measures, each an ink-weighted mean over the squares:
/// <list type="bullet">
/// <item><b>Rhythm</b> (<see cref="PageAxisGuess.Across"/>, <see cref="PageAxisGuess.Down"/>): taken along the right
/// axis, a square's profile rises and falls once per line pitch, strongly and regularly; along the other it sums letters
/// of several lines that do not line up. Decisive on a full page; a square holding one line has no rhythm across it
/// but some from its letters along it, so on a page of a few lines it leans the wrong way.</item>
/// <item><b>Spread</b> (<see cref="PageAxisGuess.Spread"/>): the log ratio of the two profiles' squared coefficients of
/// variation. Writing is concentrated in its lines' rows and spread along them, so on a page of a few lines it is
/// decisive; on a full table it is misled by squares that straddle a column gap or a margin (weakly: by 0.6 at most
/// on the validation pages of docs/measurements.md, where the rhythm was never wrong).</item>
/// </list>
/// <para>The page is first box-downscaled to at most about <see cref="PageOptions.AxisPixels"/> pixels, flattened and
/// cleaned of its ruled lines (<see cref="PageAnalyser.Writing"/>): a ruled page's rules are regular and concentrated
/// too, and would otherwise decide. Squares are small enough that a page skewed by a few degrees still shows its lines
/// within each. It cannot tell 0 from 180 (or 90 from 270): the recogniser settles that with the model.</para>
/// </summary>
internal static class PageAxisEstimator
{
    // Common practice, no source: a square holds writing worth measuring when at least this share of it is ink.
    private const double MinInkShare = 0.02;

    // Keeps the spread's log ratio finite for a profile that is flat (a square filled evenly).
    private const double SpreadFloor = 1e-3;

    /// <summary>The cue for one page (luminance); null when it holds no writing (left to the normal errors).</summary>
    public static PageAxisGuess? Guess(GrayImage luminance, PageOptions o)
    {
        ArgumentNullException.ThrowIfNull(luminance);
        ArgumentNullException.ThrowIfNull(o);
        var factor = (int)Math.Max(1, Math.Ceiling(Math.Sqrt((double)luminance.Width * luminance.Height / o.AxisPixels)));
        var small = Resampler.BoxDownscale(luminance, factor);
        int w = small.Width, h = small.Height;
        var flat = IlluminationFlattener.Flatten(small, Math.Max(15, (int)(o.FlattenWindowFraction * Math.Min(w, h))));
        if (PageAnalyser.Writing(flat, o, out _) is not { } writing) return null;
        var ink = writing.Ink;

        var side = Math.Max(16, Math.Min(w, h) / o.AxisSquares);
        var rows = new double[side];
        var columns = new double[side];
        double across = 0, down = 0, spread = 0, weight = 0;
        // Squares overlap by half, so a line cut at one square's edge lies whole in the next.
        for (var y0 = 0; y0 + side <= h; y0 += side / 2)
            for (var x0 = 0; x0 + side <= w; x0 += side / 2)
            {
                Array.Clear(rows);
                Array.Clear(columns);
                var count = 0;
                for (var y = 0; y < side; y++)
                    for (int x = 0, i = (y0 + y) * w + x0; x < side; x++, i++)
                    {
                        if (ink[i] == 0) continue;
                        rows[y]++;
                        columns[x]++;
                        count++;
                    }
                if (count < MinInkShare * side * side) continue;
                across += count * Rhythm(rows);
                down += count * Rhythm(columns);
                spread += count * Math.Log((Unevenness(rows) + SpreadFloor) / (Unevenness(columns) + SpreadFloor));
                weight += count;
            }
        return weight > 0 ? new PageAxisGuess(across / weight, down / weight, spread / weight) : null;
    }

    /// <summary>
    /// How strongly a profile repeats itself: the highest normalised autocorrelation past its first fall below zero
    /// (a profile's own width), up to half its length; 0 when it never falls below zero.
    /// </summary>
    internal static double Rhythm(double[] profile)
    {
        var n = profile.Length;
        var mean = profile.Average();
        var d = new double[n];
        double energy = 0;
        for (var i = 0; i < n; i++)
        {
            d[i] = profile[i] - mean;
            energy += d[i] * d[i];
        }
        if (energy <= 0) return 0;
        var fallen = false;
        double best = 0;
        for (var lag = 1; lag <= n / 2; lag++)
        {
            double s = 0;
            for (var i = 0; i + lag < n; i++) s += d[i] * d[i + lag];
            // Scaled to the overlap, so a long lag is not penalised for summing fewer products.
            var r = s / energy * n / (n - lag);
            if (!fallen)
            {
                fallen = r < 0;
                continue;
            }
            best = Math.Max(best, r);
        }
        return best;
    }

    /// <summary>A profile's squared coefficient of variation (variance over the squared mean); 0 for an empty one.</summary>
    internal static double Unevenness(double[] profile)
    {
        var mean = profile.Average();
        if (mean <= 0) return 0;
        double v = 0;
        foreach (var p in profile) v += (p - mean) * (p - mean);
        return v / profile.Length / (mean * mean);
    }
}
