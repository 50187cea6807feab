namespace HandLine.Imaging;

/// <summary>
/// Estimates the slant of upright strokes. For each candidate angle the deskewed line is sheared
/// (rows shifted by fractional amounts with linear interpolation, so no rounding jitter) and
/// thresholded; column by column the ink count h and the span from first to last ink row are
/// taken, only columns whose ink forms one unbroken run (h = span) count, and the angle with the
/// largest Σ h² wins: a stroke made vertical fills one column with one long run.
/// The criterion follows Vinciarelli &amp; Luettin 2001 (Pattern Recognition Letters), recalled from memory.
/// </summary>
internal static class SlantEstimator
{
    // Coarse steps well inside the criterion's peak (a few degrees wide for usual stroke proportions).
    private const double CoarseStep = 3.0, FineStep = 0.5;

    // Below the usual 0.5: on the downscaled copy thin strokes are averaged with paper and would
    // otherwise break into pieces. Common practice, no source.
    private const float InkLevel = 0.3f;

    /// <param name="ink">Ink image, not yet deskewed (any scale: angles do not depend on it).</param>
    /// <returns>Degrees the strokes lean to the right (see <see cref="UprightTransform"/>).</returns>
    public static double Estimate(GrayImage ink, double deskewDegrees, double maxDegrees)
    {
        if (maxDegrees <= 0 || Upright(ink, deskewDegrees) is not { } line)
            return 0;

        double sum = 0, mass = 0;
        for (int y = 0; y < line.Height; y++)
            for (int x = 0; x < line.Width; x++)
            {
                float v = line.Pixels[y * line.Width + x];
                sum += v * y;
                mass += v;
            }
        double yc = sum / mass;

        // Columns reachable by any candidate shear.
        int reach = (int)Math.Ceiling(line.Height * Math.Tan(maxDegrees * Math.PI / 180)) + 2;
        var state = new ColumnState(line.Width + 2 * reach + 2);

        double Score(double degrees) => state.Score(line, yc, Math.Tan(degrees * Math.PI / 180), reach);

        double best = 0, bestScore = Score(0);
        for (double a = -maxDegrees; a <= maxDegrees + 1e-9; a += CoarseStep)
        {
            double s = Score(a);
            if (s > bestScore) (best, bestScore) = (a, s);
        }
        double centre = best;
        for (double a = centre - CoarseStep + FineStep; a < centre + CoarseStep - 1e-9; a += FineStep)
        {
            if (Math.Abs(a) > maxDegrees + 1e-9) continue;
            double s = Score(a);
            if (s > bestScore) (best, bestScore) = (a, s);
        }
        return Math.Round(best, 2);
    }

    // The deskewed ink, cropped to the rows and columns holding any ink.
    private static GrayImage? Upright(GrayImage ink, double deskewDegrees)
    {
        var upright = ink;
        if (Math.Abs(deskewDegrees) >= 0.05)
        {
            var t = UprightTransform.Rotation(ink, deskewDegrees);
            var (x0, y0, x1, y1) = t.Bounds(0, 0, ink.Width - 1, ink.Height - 1);
            int w = (int)Math.Ceiling(x1 - x0) + 1, h = (int)Math.Ceiling(y1 - y0) + 1;
            upright = t.Render(ink, Math.Floor(x0), Math.Floor(y0), w, h, 0f);
        }
        int bx0 = int.MaxValue, by0 = int.MaxValue, bx1 = -1, by1 = -1;
        var p = upright.Pixels;
        for (int y = 0; y < upright.Height; y++)
            for (int x = 0; x < upright.Width; x++)
                if (p[y * upright.Width + x] >= InkLevel)
                {
                    bx0 = Math.Min(bx0, x); bx1 = Math.Max(bx1, x);
                    by0 = Math.Min(by0, y); by1 = Math.Max(by1, y);
                }
        if (bx1 < 0)
            return null;
        int cw = bx1 - bx0 + 1, ch = by1 - by0 + 1;
        var crop = new float[cw * ch];
        for (int y = 0; y < ch; y++)
            Array.Copy(p, (by0 + y) * upright.Width + bx0, crop, y * cw, cw);
        return new GrayImage(cw, ch, crop);
    }

    private sealed class ColumnState(int columns)
    {
        private readonly int[] _count = new int[columns];
        private readonly int[] _top = new int[columns];
        private readonly int[] _bottom = new int[columns];
        private Candidates? _candidates;

        public double Score(GrayImage line, double yc, double tan, int reach)
        {
            var candidates = _candidates ??= new Candidates(line);
            var count = _count;
            var top = _top;
            var bottom = _bottom;
            Array.Clear(count);
            var rowStart = candidates.RowStart;
            var xs = candidates.X;
            var rights = candidates.Right;
            var lefts = candidates.Left;
            for (int y = 0; y < line.Height; y++)
            {
                int j = rowStart[y], end = rowStart[y + 1];
                if (j == end) continue;
                // Undo a rightward lean: output column c = x + (y − yc)·tan (UprightTransform's shear),
                // so output c blends source x = c − k (weight 1 − g) and x − 1 (weight g).
                double d = (y - yc) * tan;
                int k = (int)Math.Floor(d);
                float g = (float)(d - k);
                int shift = k + reach;
                for (; j < end; j++)
                {
                    float right = rights[j];
                    if (right + (lefts[j] - right) * g < InkLevel) continue;
                    int slot = xs[j] + shift;
                    if (count[slot]++ == 0) top[slot] = y;
                    bottom[slot] = y;
                }
            }
            double score = 0;
            for (int c = 0; c < count.Length; c++)
            {
                int h = count[c];
                // Rows arrive in order and each adds at most one pixel per column, so h = span means unbroken.
                if (h > 1 && h == bottom[c] - top[c] + 1)
                    score += (double)h * h;
            }
            return score;
        }
    }

    /// <summary>
    /// Per row, the source positions x (0..w) whose blend of x and x − 1 can reach the ink level, with the two
    /// values blended (0 beyond the edges): a blend never exceeds the larger of the two, so everything else is paper
    /// at any shear. Gathered once for all candidate angles.
    /// </summary>
    private sealed class Candidates
    {
        public Candidates(GrayImage line)
        {
            int w = line.Width;
            var p = line.Pixels;
            var xs = new List<int>();
            var rights = new List<float>();
            var lefts = new List<float>();
            RowStart = new int[line.Height + 1];
            for (int y = 0; y < line.Height; y++)
            {
                RowStart[y] = xs.Count;
                for (int x = 0; x <= w; x++)
                {
                    float right = x < w ? p[y * w + x] : 0f;
                    float left = x > 0 ? p[y * w + x - 1] : 0f;
                    if (Math.Max(left, right) < InkLevel) continue;
                    xs.Add(x);
                    rights.Add(right);
                    lefts.Add(left);
                }
            }
            RowStart[line.Height] = xs.Count;
            X = xs.ToArray();
            Right = rights.ToArray();
            Left = lefts.ToArray();
        }

        /// <summary>Where each row's candidates start in <see cref="X"/> (one more entry than rows).</summary>
        public int[] RowStart { get; }

        public int[] X { get; }

        public float[] Right { get; }

        public float[] Left { get; }
    }
}
