using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class RasterOpsTests
{
    /// <summary>Blurs a single bright pixel and returns the horizontal variance of the result.</summary>
    private static double ImpulseVariance(Action<float[], int, int> blur)
    {
        const int w = 81, h = 81;
        var p = new float[w * h];
        p[40 * w + 40] = 1;
        blur(p, w, h);
        double sum = 0, m2 = 0;
        for (var y = 0; y < h; y++)
            for (var x = 0; x < w; x++)
            {
                sum += p[y * w + x];
                m2 += p[y * w + x] * (x - 40) * (x - 40);
            }
        Assert.Equal(1, sum, 3);   // blurs preserve total brightness
        return m2 / sum;
    }

    [Theory]
    [InlineData(0.7)]
    [InlineData(1.4)]
    [InlineData(3)]
    public void Gaussian_blur_of_an_impulse_has_variance_sigma_squared(double sigma)
    {
        // A Gaussian kernel's variance is sigma^2; cutting it at 3 sigma loses about 2.7% of it
        // (truncated-normal variance 1 - 6 phi(3) / (2 Phi(3) - 1), value recalled from memory).
        var v = ImpulseVariance((p, w, h) => RasterOps.GaussianBlur(p, w, h, sigma));
        Assert.InRange(v, 0.95 * sigma * sigma, 1.01 * sigma * sigma);
    }

    [Theory]
    [InlineData(4)]
    [InlineData(8)]
    public void Three_box_blur_approximates_the_requested_sigma(double sigma)
    {
        // n boxes of width b have variance n (b^2 - 1) / 12; b is rounded to an odd width.
        var v = ImpulseVariance((p, w, h) => RasterOps.FastBlur(p, w, h, sigma));
        Assert.InRange(Math.Sqrt(v), 0.85 * sigma, 1.15 * sigma);
    }

    [Fact]
    public void Pixel_noise_normal_deviates_have_zero_mean_and_unit_variance()
    {
        var noise = new PixelNoise(42);
        const int n = 200_000;
        double sum = 0, sq = 0, beyond2 = 0;
        for (var i = 0; i < n; i++)
        {
            double z = noise.NextNormal();
            sum += z;
            sq += z * z;
            if (Math.Abs(z) > 2) beyond2++;
        }
        Assert.InRange(sum / n, -0.01, 0.01);
        Assert.InRange(sq / n, 0.98, 1.02);
        // Standard normal: P(|Z| > 2) = 0.0455 (normal table); four-uniform sums come close.
        Assert.InRange(beyond2 / n, 0.035, 0.055);
    }

    [Fact]
    public void Smooth_field_has_unit_rms_and_is_smooth()
    {
        var noise = new PixelNoise(1);
        const int w = 300, h = 60;
        var f = RasterOps.SmoothField(ref noise, w, h, 6);
        var rms = Math.Sqrt(f.Average(v => (double)v * v));
        Assert.InRange(rms, 0.9, 1.1);
        // Neighbouring pixels of a field smoothed over 6 px differ far less than the field's spread.
        var step = Enumerable.Range(0, h).SelectMany(y => Enumerable.Range(0, w - 1).Select(x => Math.Abs(f[y * w + x + 1] - f[y * w + x]))).Average();
        Assert.True(step < 0.3, $"mean neighbour step {step}");
    }

    [Fact]
    public void Erosion_thins_a_bar_by_one_pixel_each_side()
    {
        const int w = 20, h = 9;
        var ink = new float[w * h];
        for (var y = 2; y <= 6; y++)
            for (var x = 0; x < w; x++)
                ink[y * w + x] = 1;
        RasterOps.Erode(ink, w, h, 1);
        // Grey-level erosion by a 3x3 square: a 5-row bar keeps its middle 3 rows.
        Assert.Equal(3 * (w - 2), ink.Count(v => v == 1));   // the end columns touch the blank border
        Assert.Equal(0, ink[2 * w + 5]);
        Assert.Equal(1, ink[3 * w + 5]);
    }

    [Fact]
    public void Elastic_distortion_of_zero_strength_is_the_identity_and_otherwise_moves_ink_but_keeps_its_total()
    {
        const int w = 160, h = 48;
        var ink = new float[w * h];
        for (var y = 14; y < 34; y++)
            for (var x = 10; x < 150; x++)
                if ((x / 6) % 3 == 0 || y is 14 or 15 or 32 or 33)
                    ink[y * w + x] = 1;
        var noise = new PixelNoise(4);
        Assert.Same(ink, RasterOps.Elastic(ink, w, h, 0, 6, ref noise));

        noise = new PixelNoise(4);
        var warped = RasterOps.Elastic(ink, w, h, 2, 6, ref noise);
        var moved = ink.Zip(warped, (a, b) => Math.Abs(a - b)).Sum();
        Assert.True(moved > 0.05 * ink.Sum(), $"moved {moved} of {ink.Sum()}");
        // A smooth field with an RMS displacement well below its smoothing scale changes area little (the
        // Jacobian stays near 1; Simard, Steinkraus & Platt 2003 describe the field; the 15 % bound is a rule of
        // thumb, common practice, no source).
        Assert.InRange(warped.Sum() / ink.Sum(), 0.85, 1.15);

        var again = new PixelNoise(4);
        Assert.Equal(warped, RasterOps.Elastic(ink, w, h, 2, 6, ref again));
    }
}
