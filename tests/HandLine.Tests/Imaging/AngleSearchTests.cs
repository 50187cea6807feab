using HandLine.Imaging;
using static HandLine.Tests.Imaging.ImagingTestSupport;

namespace HandLine.Tests.Imaging;

/// <summary>
/// The skew and slant searches were made faster by gathering the ink once and computing the products per column and
/// row instead of per pixel (and by not scoring an angle twice). They must give the same bits as the direct form, which
/// each test here spells out again: every pixel projected or sheared on its own, every candidate angle scored.
/// </summary>
public sealed class AngleSearchTests
{
    private const double MaxDeskew = 15, MaxSlant = 40;

    public static TheoryData<double, double, float> Lines => new()
    {
        { 0, 0, 40 }, { 3.3, 0, 40 }, { -7.9, 12, 32 }, { 14.7, 0, 36 }, { -14.95, -8, 36 }, { 9.2, 25, 24 }, { -2.1, 38, 20 },
    };

    [Theory]
    [MemberData(nameof(Lines))]
    public void Skew_search_matches_the_direct_search(double rotate, double slant, float size)
    {
        var ink = Ink(Render(EstateLine, size, rotate, slant));
        Assert.Equal(DirectSkew(ink, MaxDeskew), SkewEstimator.Estimate(ink, MaxDeskew));
    }

    [Theory]
    [MemberData(nameof(Lines))]
    public void Slant_search_matches_the_direct_search(double rotate, double slant, float size)
    {
        var ink = Ink(Render(EstateLine, size, rotate, slant));
        var deskew = SkewEstimator.Estimate(ink, MaxDeskew).Degrees;
        Assert.Equal(DirectSlant(ink, deskew, MaxSlant), SlantEstimator.Estimate(ink, deskew, MaxSlant));
    }

    [Fact]
    public void Both_match_on_a_page_of_lines_and_on_specks()
    {
        var page = Ink(Stack([Render(EstateLine, rotateDegrees: 4), Render("Paid the smith 2 6", rotateDegrees: 4)], 10));
        Assert.Equal(DirectSkew(page, MaxDeskew), SkewEstimator.Estimate(page, MaxDeskew));
        Assert.Equal(DirectSlant(page, 4, MaxSlant), SlantEstimator.Estimate(page, 4, MaxSlant));

        var rng = new Random(7);
        var specks = new float[60 * 20];
        for (int i = 0; i < specks.Length; i++) specks[i] = rng.NextDouble() < 0.05 ? (float)rng.NextDouble() : 0f;
        var speckled = new GrayImage(60, 20, specks);
        Assert.Equal(DirectSkew(speckled, MaxDeskew), SkewEstimator.Estimate(speckled, MaxDeskew));
        Assert.Equal(DirectSkew(speckled, 0), SkewEstimator.Estimate(speckled, 0));
        Assert.Equal(DirectSlant(speckled, 0, MaxSlant), SlantEstimator.Estimate(speckled, 0, MaxSlant));
    }

    private static GrayImage Ink(GrayImage luminance) =>
        new(luminance.Width, luminance.Height, luminance.Pixels.Select(v => 1f - v).ToArray());

    // The skew search as first written: every pixel with ink computes its own projection for every candidate.
    private static (double, int) DirectSkew(GrayImage ink, double maxDegrees)
    {
        var points = new List<(float X, float Y, float W)>();
        for (int y = 0; y < ink.Height; y++)
            for (int x = 0; x < ink.Width; x++)
                if (ink[x, y] >= 0.2f) points.Add((x, y, ink[x, y]));
        if (points.Count == 0) return (0, 0);
        var profile = new double[(int)Math.Ceiling(Math.Sqrt((double)ink.Width * ink.Width + (double)ink.Height * ink.Height)) + 3];
        double Score(double degrees)
        {
            double r = degrees * Math.PI / 180, sin = Math.Sin(r), cos = Math.Cos(r);
            double cx = (ink.Width - 1) / 2.0, cy = (ink.Height - 1) / 2.0, offset = profile.Length / 2.0;
            Array.Clear(profile);
            foreach (var (x, y, w) in points)
            {
                double ry = (x - cx) * sin + (y - cy) * cos + offset;
                int b = (int)ry;
                double f = ry - b;
                profile[b] += w * (1 - f);
                profile[b + 1] += w * f;
            }
            double score = 0;
            foreach (double v in profile) score += v * v;
            return score;
        }
        int CoreRows() => profile.Count(v => v >= 0.25 * profile.Max());

        double best = 0, bestScore = Score(0);
        if (maxDegrees <= 0) return (0, CoreRows());
        for (double a = -maxDegrees; a <= maxDegrees + 1e-9; a += 1.0)
            if (Score(a) is var s && s > bestScore) (best, bestScore) = (a, s);
        double centre = best;
        for (double a = centre - 1.0; a <= centre + 1.0 + 1e-9; a += 0.1)
            if (Math.Abs(a) <= maxDegrees + 1e-9 && Score(a) is var s && s > bestScore) (best, bestScore) = (a, s);
        double left = Score(best - 0.1), right = Score(best + 0.1);
        double curvature = left - 2 * bestScore + right;
        if (curvature < 0) best += 0.1 * Math.Clamp(0.5 * (left - right) / curvature, -0.5, 0.5);
        best = Math.Round(Math.Clamp(best, -maxDegrees, maxDegrees), 2);
        Score(best);
        return (best, CoreRows());
    }

    // The slant search as first written: each candidate shears every source position whose blend can reach the ink level.
    private static double DirectSlant(GrayImage ink, double deskew, double maxDegrees)
    {
        const float level = 0.3f;
        var turned = ink;
        if (Math.Abs(deskew) >= 0.05)
        {
            var t = UprightTransform.Rotation(ink, deskew);
            var (x0, y0, x1, y1) = t.Bounds(0, 0, ink.Width - 1, ink.Height - 1);
            turned = t.Render(ink, Math.Floor(x0), Math.Floor(y0), (int)Math.Ceiling(x1 - x0) + 1, (int)Math.Ceiling(y1 - y0) + 1, 0f);
        }
        var cols = Enumerable.Range(0, turned.Width).Where(x => Enumerable.Range(0, turned.Height).Any(y => turned[x, y] >= level)).ToArray();
        var rows = Enumerable.Range(0, turned.Height).Where(y => Enumerable.Range(0, turned.Width).Any(x => turned[x, y] >= level)).ToArray();
        if (maxDegrees <= 0 || cols.Length == 0) return 0;
        int w = cols[^1] - cols[0] + 1, h = rows[^1] - rows[0] + 1;
        float P(int x, int y) => x >= 0 && x < w ? turned[cols[0] + x, rows[0] + y] : 0f;
        double sum = 0, mass = 0;
        for (int y = 0; y < h; y++)
            for (int x = 0; x < w; x++) { sum += P(x, y) * y; mass += P(x, y); }
        double yc = sum / mass;
        int reach = (int)Math.Ceiling(h * Math.Tan(maxDegrees * Math.PI / 180)) + 2;
        double Score(double degrees)
        {
            double tan = Math.Tan(degrees * Math.PI / 180);
            var count = new int[w + 2 * reach + 2];
            var top = new int[count.Length];
            var bottom = new int[count.Length];
            for (int y = 0; y < h; y++)
            {
                double d = (y - yc) * tan;
                int k = (int)Math.Floor(d);
                float g = (float)(d - k);
                for (int x = 0; x <= w; x++)
                {
                    float right = P(x, y), left = P(x - 1, y);
                    if (Math.Max(left, right) < level || right + (left - right) * g < level) continue;
                    int slot = x + k + reach;
                    if (count[slot]++ == 0) top[slot] = y;
                    bottom[slot] = y;
                }
            }
            double score = 0;
            for (int c = 0; c < count.Length; c++)
                if (count[c] > 1 && count[c] == bottom[c] - top[c] + 1) score += (double)count[c] * count[c];
            return score;
        }
        double best = 0, bestScore = Score(0);
        for (double a = -maxDegrees; a <= maxDegrees + 1e-9; a += 3.0)
            if (Score(a) is var s && s > bestScore) (best, bestScore) = (a, s);
        double centre = best;
        for (double a = centre - 3.0 + 0.5; a < centre + 3.0 - 1e-9; a += 0.5)
            if (Math.Abs(a) <= maxDegrees + 1e-9 && Score(a) is var s && s > bestScore) (best, bestScore) = (a, s);
        return Math.Round(best, 2);
    }
}
