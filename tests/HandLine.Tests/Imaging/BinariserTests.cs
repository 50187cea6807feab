using HandLine.Imaging;

namespace HandLine.Tests.Imaging;

public sealed class BinariserTests
{
    [Fact]
    public void Otsu_matches_hand_worked_four_level_example()
    {
        // Otsu 1979, between-class variance σ_B²(k) = (μ_T·ω(k) − μ(k))² / (ω(k)(1 − ω(k))).
        // Levels 0..3 with counts 4, 2, 1, 3 (N = 10): p = .4 .2 .1 .3, μ_T = 1.3.
        //   k = 0: ω = .4, μ = 0  → (.52)² / .24 = 1.1267
        //   k = 1: ω = .6, μ = .2 → (.58)² / .24 = 1.4017  ← maximum
        //   k = 2: ω = .7, μ = .4 → (.51)² / .21 = 1.2386
        var hist = new long[256];
        hist[0] = 4; hist[1] = 2; hist[2] = 1; hist[3] = 3;
        Assert.Equal(1, Binariser.OtsuBin(hist));

        var pixels = new List<float>();
        for (int level = 0; level < 4; level++)
            pixels.AddRange(Enumerable.Repeat(level / 255f, (int)hist[level]));
        var image = new GrayImage(5, 2, pixels.ToArray());
        // Boundary between bin 1 and bin 2.
        Assert.Equal(1.5f / 255f, Binariser.Otsu(image), 6);
    }

    [Fact]
    public void Otsu_agrees_with_brute_force_minimum_within_class_variance()
    {
        // Otsu 1979 shows σ_W² + σ_B² = σ_T², so the best k also minimises the within-class
        // variance; check that independently on a bimodal histogram (two overlapping humps).
        var hist = new long[256];
        for (int i = 0; i < 256; i++)
            hist[i] = (long)Math.Round(900 * Math.Exp(-Math.Pow((i - 60) / 18.0, 2)) + 400 * Math.Exp(-Math.Pow((i - 170) / 30.0, 2))) + 1;

        int best = -1;
        double bestWithin = double.MaxValue;
        for (int k = 0; k < 255; k++)
        {
            double within = ClassSpread(hist, 0, k) + ClassSpread(hist, k + 1, 255);
            if (within < bestWithin - 1e-9) (best, bestWithin) = (k, within);
        }
        Assert.Equal(best, Binariser.OtsuBin(hist));
    }

    // Σ n_i (i − mean)² over one class: the within-class variance times N.
    private static double ClassSpread(long[] hist, int from, int to)
    {
        double n = 0, sum = 0;
        for (int i = from; i <= to; i++) { n += hist[i]; sum += (double)i * hist[i]; }
        if (n == 0) return 0;
        double mean = sum / n, spread = 0;
        for (int i = from; i <= to; i++) spread += hist[i] * (i - mean) * (i - mean);
        return spread;
    }

    [Fact]
    public void Otsu_splits_a_two_level_image_between_the_levels()
    {
        var p = new float[100];
        for (int i = 0; i < p.Length; i++) p[i] = i % 3 == 0 ? 0.2f : 0.9f;
        float t = Binariser.Otsu(new GrayImage(10, 10, p));
        Assert.InRange(t, 0.2f, 0.9f);
    }

    [Fact]
    public void Sauvola_threshold_matches_formula_by_hand()
    {
        // Sauvola & Pietikäinen 2000: T = m·(1 + k·(s/R − 1)).
        // 3×3 window over 0.2 ×4, 0.8 ×4, 0.5 ×1: m = 4.5/9 = 0.5,
        // variance = (4·0.09 + 4·0.09 + 0)/9 = 0.08, s = 0.282843;
        // k = 0.5, R = 0.5: T = 0.5·(1 + 0.5·(0.565685 − 1)) = 0.391421.
        var image = new GrayImage(3, 3, [0.2f, 0.8f, 0.2f, 0.8f, 0.5f, 0.8f, 0.2f, 0.8f, 0.2f]);
        var t = Binariser.SauvolaThresholds(image, window: 3, k: 0.5, r: 0.5);
        Assert.Equal(0.391421, t[1, 1], 5);

        var binary = Binariser.Sauvola(image, window: 3, k: 0.5, r: 0.5);
        Assert.Equal(1f, binary[1, 1]); // 0.5 ≥ 0.391: paper
    }

    [Fact]
    public void Sauvola_on_flat_paper_gives_mean_times_one_minus_k()
    {
        // Sauvola & Pietikäinen 2000 with s = 0: T = m·(1 − k) = 0.8 · 0.8 = 0.64.
        var t = Binariser.SauvolaThresholds(GrayImage.Filled(6, 5, 0.8f), window: 3, k: 0.2);
        Assert.All(t.Pixels, v => Assert.Equal(0.64f, v, 5));
        Assert.All(Binariser.Sauvola(GrayImage.Filled(6, 5, 0.8f), 3, 0.2).Pixels, v => Assert.Equal(1f, v));
    }

    [Fact]
    public void Sauvola_integral_images_agree_with_direct_window_sums()
    {
        var rng = new Random(7);
        int w = 23, h = 17, win = 7;
        var image = new GrayImage(w, h, Enumerable.Range(0, w * h).Select(_ => (float)rng.NextDouble()).ToArray());
        var t = Binariser.SauvolaThresholds(image, win, k: 0.3, r: 0.5);
        for (int y = 0; y < h; y++)
            for (int x = 0; x < w; x++)
            {
                var values = new List<double>();
                for (int yy = Math.Max(0, y - 3); yy <= Math.Min(h - 1, y + 3); yy++)
                    for (int xx = Math.Max(0, x - 3); xx <= Math.Min(w - 1, x + 3); xx++)
                        values.Add(image[xx, yy]);
                double m = values.Average();
                double s = Math.Sqrt(values.Sum(v => (v - m) * (v - m)) / values.Count);
                Assert.Equal(m * (1 + 0.3 * (s / 0.5 - 1)), t[x, y], 4);
            }
    }

    [Fact]
    public void Sauvola_rejects_even_window()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => Binariser.Sauvola(GrayImage.Filled(4, 4, 1f), 4, 0.3));
    }
}
