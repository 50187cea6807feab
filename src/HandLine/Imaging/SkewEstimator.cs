namespace HandLine.Imaging;

/// <summary>
/// Finds a text line's rotation as the angle whose horizontal projection profile is sharpest
/// (largest sum of squared row sums): when rows run along the text, ink piles into few rows.
/// Coarse 1° search, then 0.1° around the best, then a parabolic fit. Each candidate projects the ink pixels rather than
/// rotating the image, so the cost is (ink pixels × candidates).
/// </summary>
internal static class SkewEstimator
{
    private const double CoarseStep = 1.0, FineStep = 0.1;

    /// <returns>
    /// Degrees the text is turned counter-clockwise (see <see cref="UprightTransform"/>), and the
    /// number of rows in the upright profile holding at least a quarter of the fullest row's ink
    /// (roughly the x-height band, in pixels of <paramref name="ink"/>).
    /// </returns>
    public static (double Degrees, int CoreRows) Estimate(GrayImage ink, double maxDegrees)
    {
        var (xs, ys, ws) = InkPoints(ink);
        if (xs.Length == 0)
            return (0, 0);
        int bins = (int)Math.Ceiling(Math.Sqrt((double)ink.Width * ink.Width + (double)ink.Height * ink.Height)) + 3;
        var profile = new double[bins];

        double Score(double degrees) => Sharpness(xs, ys, ws, ink, degrees, profile);

        double best = 0, bestScore = Score(0);
        if (maxDegrees <= 0)
            return (0, CoreRows(profile));
        for (double a = -maxDegrees; a <= maxDegrees + 1e-9; a += CoarseStep)
        {
            double s = Score(a);
            if (s > bestScore) (best, bestScore) = (a, s);
        }
        double centre = best;
        for (double a = centre - CoarseStep; a <= centre + CoarseStep + 1e-9; a += FineStep)
        {
            if (Math.Abs(a) > maxDegrees + 1e-9) continue;
            double s = Score(a);
            if (s > bestScore) (best, bestScore) = (a, s);
        }
        // Parabola through the best fine step and its neighbours: sub-step precision for free.
        double left = Score(best - FineStep), right = Score(best + FineStep);
        double curvature = left - 2 * bestScore + right;
        if (curvature < 0)
            best += FineStep * Math.Clamp(0.5 * (left - right) / curvature, -0.5, 0.5);
        best = Math.Round(Math.Clamp(best, -maxDegrees, maxDegrees), 2);
        Score(best);
        return (best, CoreRows(profile));
    }

    private static int CoreRows(double[] profile)
    {
        double limit = 0.25 * profile.Max();
        return profile.Count(v => v >= limit);
    }

    // Pixels with some ink, weighted by it; faint halo pixels add little but cost as much.
    private static (float[] X, float[] Y, float[] W) InkPoints(GrayImage ink)
    {
        var xs = new List<float>(); var ys = new List<float>(); var ws = new List<float>();
        var p = ink.Pixels;
        for (int y = 0, i = 0; y < ink.Height; y++)
            for (int x = 0; x < ink.Width; x++, i++)
                if (p[i] >= 0.2f)
                {
                    xs.Add(x); ys.Add(y); ws.Add(p[i]);
                }
        return (xs.ToArray(), ys.ToArray(), ws.ToArray());
    }

    private static double Sharpness(float[] xs, float[] ys, float[] ws, GrayImage ink, double degrees, double[] profile)
    {
        // Row coordinate after turning the text back clockwise by `degrees` (UprightTransform.Forward's ry),
        // shifted so every bin index is positive.
        double r = degrees * Math.PI / 180, sin = Math.Sin(r), cos = Math.Cos(r);
        double cx = (ink.Width - 1) / 2.0, cy = (ink.Height - 1) / 2.0;
        double offset = profile.Length / 2.0;
        Array.Clear(profile);
        for (int i = 0; i < xs.Length; i++)
        {
            double ry = (xs[i] - cx) * sin + (ys[i] - cy) * cos + offset;
            int b = (int)ry;
            double f = ry - b;
            // Split between neighbouring rows so the score varies smoothly with the angle.
            profile[b] += ws[i] * (1 - f);
            profile[b + 1] += ws[i] * f;
        }
        double score = 0;
        foreach (double v in profile) score += v * v;
        return score;
    }
}
