using HandLine.Imaging;
using HandLine.Training;

namespace HandLine.Tests.Training;

public sealed class AugmentationTests
{
    /// <summary>A 32-row line with three upright strokes.</summary>
    private static GrayImage Strokes()
    {
        var p = new float[32 * 60];
        foreach (var x0 in new[] { 10, 28, 46 })
            for (var y = 6; y < 26; y++)
                for (var x = x0; x < x0 + 3; x++)
                    p[y * 60 + x] = 1f;
        return new GrayImage(60, 32, p);
    }

    [Fact]
    public void SameGeneratorStateGivesSamePixelsAndHeightIsKept()
    {
        var a = new Augmentation { KeepShare = 0 };
        var x = a.Apply(Strokes(), new Random(3));
        var y = a.Apply(Strokes(), new Random(3));
        Assert.Equal(32, x.Height);
        Assert.Equal(x.Pixels, y.Pixels);
        Assert.NotEqual(Strokes().Pixels, x.Pixels);
    }

    [Fact]
    public void WidthFollowsTheStretchAndInkStaysInRange()
    {
        var a = new Augmentation { KeepShare = 0, MaxShear = 0, ThickenChance = 0, ThinChance = 0, MaxNoise = 0, MinInkGain = 1 };
        for (var seed = 0; seed < 20; seed++)
        {
            var o = a.Apply(Strokes(), new Random(seed));
            Assert.InRange(o.Width, (int)(60 * a.MinWidthScale) - 1, (int)(60 * a.MaxWidthScale) + 1);
            Assert.All(o.Pixels, v => Assert.InRange(v, 0f, 1f));
            // Linear resampling keeps ink per row in proportion to the stretch (within the edge pixels).
            var scale = o.Width / 60.0;
            Assert.InRange(o.Pixels.Sum(), 3 * 3 * 20 * scale - 3 * 20, 3 * 3 * 20 * scale + 3 * 20);
        }
    }

    [Fact]
    public void ShearMovesTopAndBottomRowsApart()
    {
        var a = new Augmentation { KeepShare = 0, MinWidthScale = 1, MaxWidthScale = 1, MaxShear = 0.2, ThickenChance = 0, ThinChance = 0, MaxNoise = 0, MinInkGain = 1 };
        var o = a.Apply(Strokes(), new Random(11));
        double Centre(int row) => Enumerable.Range(0, o.Width).Sum(x => x * o[x, row]) / Enumerable.Range(0, o.Width).Sum(x => o[x, row]);
        // 20 rows apart at up to 0.2 lean: the stroke centres differ unless the drawn lean happened to be tiny.
        var shift = Centre(6) - Centre(25);
        var expected = new Random(11);
        expected.NextDouble(); expected.NextDouble();
        var shear = 0.2 * (2 * expected.NextDouble() - 1);
        Assert.Equal(shear * 19, shift, 0.6);
    }

    [Fact]
    public void KeptLinesAreUnchanged()
    {
        var input = Strokes();
        Assert.Same(input, new Augmentation { KeepShare = 1 }.Apply(input, new Random(1)));
    }
}
