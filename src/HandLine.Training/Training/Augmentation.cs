using HandLine.Imaging;
using HandLine.Synthesis;

namespace HandLine.Training;

/// <summary>
/// How strongly training distorts a normalised line each time it is seen, so the network meets wider, narrower,
/// leaning, bolder, fainter and noisier versions of every hand than the renders themselves hold. The ranges are
/// common practice for line recognisers, no source; each effect is drawn independently per line.
/// </summary>
public sealed record Augmentation
{
    /// <summary>Share of lines left exactly as stored.</summary>
    public double KeepShare { get; init; } = 0.25;

    /// <summary>Horizontal stretch factor range (writing width varies between writers).</summary>
    public double MinWidthScale { get; init; } = 0.8;
    public double MaxWidthScale { get; init; } = 1.25;

    /// <summary>Largest residual lean (tangent) after slant correction.</summary>
    public double MaxShear { get; init; } = 0.2;

    /// <summary>Chance of a thicker (3×3 maximum) or thinner (3×3 minimum, half strength) stroke.</summary>
    public double ThickenChance { get; init; } = 0.2;
    public double ThinChance { get; init; } = 0.15;

    /// <summary>Ink strength multiplier range (faded ink, light pencil).</summary>
    public double MinInkGain { get; init; } = 0.6;

    /// <summary>Largest standard deviation of added pixel noise.</summary>
    public double MaxNoise { get; init; } = 0.06;

    public void Validate()
    {
        if (KeepShare is < 0 or > 1) throw new ArgumentException("keep share must be in [0, 1]");
        if (MinWidthScale <= 0 || MaxWidthScale < MinWidthScale) throw new ArgumentException("width scales must satisfy 0 < min <= max");
        if (MaxShear is < 0 or > 1) throw new ArgumentException("shear must be in [0, 1]");
        if (MinInkGain is <= 0 or > 1) throw new ArgumentException("ink gain must be in (0, 1]");
        if (MaxNoise is < 0 or > 0.5) throw new ArgumentException("noise must be in [0, 0.5]");
    }

    /// <summary>A distorted copy of a normalised line (same height). Pure: the same generator state gives the same pixels.</summary>
    public GrayImage Apply(GrayImage ink, Random rng)
    {
        ArgumentNullException.ThrowIfNull(ink);
        ArgumentNullException.ThrowIfNull(rng);
        // Draw every value even when a line is kept, so one line's choice never shifts another's.
        var keep = rng.NextDouble() < KeepShare;
        var scale = MinWidthScale + (MaxWidthScale - MinWidthScale) * rng.NextDouble();
        var shear = MaxShear * (2 * rng.NextDouble() - 1);
        var stroke = rng.NextDouble();
        var gain = MinInkGain + (1 - MinInkGain) * rng.NextDouble();
        var noise = MaxNoise * rng.NextDouble();
        var noiseSeed = rng.Next();
        if (keep) return ink;

        int h = ink.Height, w = ink.Width;
        var slack = (int)Math.Ceiling(Math.Abs(shear) * h / 2);
        var outW = Math.Max(1, (int)Math.Round(w * scale) + 2 * slack);
        var p = new float[outW * h];
        var mid = (h - 1) / 2.0;
        for (var y = 0; y < h; y++)
        {
            // Lean about the middle row: upper rows move right for a positive shear.
            var shift = slack - shear * (y - mid);
            for (var x = 0; x < outW; x++)
            {
                var sx = (x - shift + 0.5) / scale - 0.5;
                var x0 = (int)Math.Floor(sx);
                var t = (float)(sx - x0);
                var a = x0 >= 0 && x0 < w ? ink.Pixels[y * w + x0] : 0f;
                var b = x0 + 1 >= 0 && x0 + 1 < w ? ink.Pixels[y * w + x0 + 1] : 0f;
                p[y * outW + x] = a + (b - a) * t;
            }
        }
        if (stroke < ThickenChance) RasterOps.Dilate(p, outW, h, 1);
        else if (stroke < ThickenChance + ThinChance) RasterOps.Erode(p, outW, h, 0.5);
        var g = new Random(noiseSeed);
        for (var i = 0; i < p.Length; i++)
        {
            var v = p[i] * (float)gain;
            if (noise > 0)
                v += (float)(noise * RasterOps.NextGaussian(g));
            p[i] = Math.Clamp(v, 0f, 1f);
        }
        return new GrayImage(outW, h, p);
    }
}
