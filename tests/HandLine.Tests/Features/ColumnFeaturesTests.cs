using HandLine.Features;
using HandLine.Imaging;

namespace HandLine.Tests.Features;

public sealed class ColumnFeaturesTests
{
    private static NormalisedLine Line(int width, int height, Func<int, int, float> ink)
    {
        var p = new float[width * height];
        for (var y = 0; y < height; y++)
            for (var x = 0; x < width; x++)
                p[y * width + x] = ink(x, y);
        return new NormalisedLine(new GrayImage(width, height, p), 0, 0, true);
    }

    [Fact]
    public void FramesConcatenateColumnsAndPadTheLastFrame()
    {
        var line = Line(5, 8, (x, y) => x * 0.1f + y * 0.01f);
        var f = ColumnFeatures.Extract(line, new FeatureConfig(LineHeight: 8, FrameStride: 2));
        Assert.Equal(3, f.Frames);
        Assert.Equal(16, f.Dimension);
        Assert.Equal(0.2f + 0.03f, f.Values[1 * 16 + 0 * 8 + 3], 5); // frame 1 = columns 2,3; column 2 row 3
        Assert.Equal(0.3f + 0.07f, f.Values[1 * 16 + 1 * 8 + 7], 5);  // column 3 row 7
        Assert.All(f.Values[(2 * 16 + 8)..], v => Assert.Equal(0f, v)); // padding column 5
    }

    [Fact]
    public void GeometricFeaturesOfAColumnMatchHandComputation()
    {
        // Column (height 10) with ink at rows 2,3 and 6 (value 1): Marti & Bunke (2001) features computed by hand.
        var line = Line(1, 10, (_, y) => y is 2 or 3 or 6 ? 1f : 0f);
        var f = ColumnFeatures.Extract(line, new FeatureConfig(LineHeight: 10, FrameStride: 1, Geometric: true));
        var g = f.Values[10..];
        Assert.Equal(3 / 10f, g[0], 5);                         // ink fraction
        Assert.Equal((2 + 3 + 6) / 3f / 10f, g[1], 5);           // centre of gravity / height
        Assert.Equal((4 + 9 + 36) / 3f / 100f, g[2], 5);         // second moment / height²
        Assert.Equal(0.2f, g[3], 5);                             // upper contour row 2
        Assert.Equal(0.6f, g[4], 5);                             // lower contour row 6
        Assert.Equal(0.2f - 0.5f, g[5], 5);                      // gradient from the neutral start (0.5)
        Assert.Equal(0.6f - 0.5f, g[6], 5);
        Assert.Equal(4 / 10f, g[7], 5);                          // transitions: 0→1 at 2, 1→0 at 4, 0→1 at 6, 1→0 at 7
        Assert.Equal(3 / 5f, g[8], 5);                           // ink rows between contours (2..6): 3 of 5
    }

    [Fact]
    public void AHeightMismatchIsRejected()
    {
        var line = Line(4, 12, (_, _) => 0);
        Assert.Throws<ArgumentException>(() => ColumnFeatures.Extract(line, new FeatureConfig(LineHeight: 10)));
    }
}
