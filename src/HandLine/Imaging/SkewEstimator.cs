namespace HandLine.Imaging;

/// <summary>
/// Finds a text line's rotation as the angle whose horizontal projection profile is sharpest
/// (largest sum of squared row sums): when rows run along the text, ink piles into few rows.
/// Coarse 1° search, then 0.1° around the best, then a parabolic fit. Each candidate projects the ink pixels rather than
/// rotating the image, so the cost is (ink pixels × candidates).
/// <para>Speed: the ink pixels are gathered once, grouped by row, and a candidate computes its products once per column
/// and once per row; what is added up for each pixel, and in which order, is unchanged, so every score is the same
/// bits as when each pixel computed its own products.</para>
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
        var projection = new Projection(ink);
        if (projection.Count == 0)
            return (0, 0);
        double Score(double degrees) => projection.Sharpness(degrees);

        double best = 0, bestScore = Score(0);
        if (maxDegrees <= 0)
            return (0, CoreRows(projection.Profile));
        // An angle already scored gets the same bits again, which cannot replace the best: 0 (scored first) in the
        // coarse search, and the fine search's first step, which is the coarse angle below the centre.
        var coarse = new List<double>();
        for (double a = -maxDegrees; a <= maxDegrees + 1e-9; a += CoarseStep)
        {
            coarse.Add(a);
            if (a == 0) continue;
            double s = Score(a);
            if (s > bestScore) (best, bestScore) = (a, s);
        }
        double centre = best;
        for (double a = centre - CoarseStep; a <= centre + CoarseStep + 1e-9; a += FineStep)
        {
            if (Math.Abs(a) > maxDegrees + 1e-9) continue;
            if (a == centre - CoarseStep && coarse.Contains(a)) continue;
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
        return (best, CoreRows(projection.Profile));
    }

    private static int CoreRows(double[] profile)
    {
        double max = 0;
        foreach (double v in profile) max = Math.Max(max, v);
        double limit = 0.25 * max;
        int count = 0;
        foreach (double v in profile)
            if (v >= limit) count++;
        return count;
    }

    /// <summary>
    /// The ink pixels (those with some ink, weighted by it; faint halo pixels add little but cost as much), grouped
    /// by row, and the profile they are projected into.
    /// </summary>
    private sealed class Projection
    {
        private readonly int _width, _height;
        private readonly int[] _rowStart;
        private readonly int[] _x;
        private readonly double[] _w;
        private readonly double[] _columnTerm;

        public Projection(GrayImage ink)
        {
            _width = ink.Width;
            _height = ink.Height;
            var p = ink.Pixels;
            int n = 0;
            foreach (float v in p)
                if (v >= 0.2f) n++;
            _x = new int[n];
            _w = new double[n];
            _rowStart = new int[_height + 1];
            int k = 0;
            for (int y = 0, i = 0; y < _height; y++)
            {
                _rowStart[y] = k;
                for (int x = 0; x < _width; x++, i++)
                    if (p[i] >= 0.2f)
                    {
                        _x[k] = x;
                        _w[k] = p[i];
                        k++;
                    }
            }
            _rowStart[_height] = k;
            Count = k;
            int bins = (int)Math.Ceiling(Math.Sqrt((double)_width * _width + (double)_height * _height)) + 3;
            Profile = new double[bins];
            _columnTerm = new double[_width];
        }

        public int Count { get; }

        /// <summary>The profile of the last <see cref="Sharpness"/> call.</summary>
        public double[] Profile { get; }

        public double Sharpness(double degrees)
        {
            // Row coordinate after turning the text back clockwise by `degrees` (UprightTransform.Forward's ry),
            // shifted so every bin index is positive: ((x − cx)·sin + (y − cy)·cos) + offset, each product computed
            // once per column or row.
            double r = degrees * Math.PI / 180, sin = Math.Sin(r), cos = Math.Cos(r);
            double cx = (_width - 1) / 2.0, cy = (_height - 1) / 2.0;
            var profile = Profile;
            double offset = profile.Length / 2.0;
            Array.Clear(profile);
            var columnTerm = _columnTerm;
            for (int x = 0; x < columnTerm.Length; x++) columnTerm[x] = (x - cx) * sin;
            var xs = _x;
            var ws = _w;
            for (int y = 0; y < _height; y++)
            {
                int end = _rowStart[y + 1];
                int k = _rowStart[y];
                if (k == end) continue;
                double rowTerm = (y - cy) * cos;
                for (; k < end; k++)
                {
                    double ry = columnTerm[xs[k]] + rowTerm + offset;
                    int b = (int)ry;
                    double f = ry - b;
                    double w = ws[k];
                    // Split between neighbouring rows so the score varies smoothly with the angle.
                    profile[b] += w * (1 - f);
                    profile[b + 1] += w * f;
                }
            }
            double score = 0;
            foreach (double v in profile) score += v * v;
            return score;
        }
    }
}
