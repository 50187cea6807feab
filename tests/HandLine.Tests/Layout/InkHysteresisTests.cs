using HandLine.Layout;

namespace HandLine.Tests.Layout;

public sealed class InkHysteresisTests
{
    [Fact]
    public void HysteresisKeepsStrokesWithADarkCoreAndDropsFaintBands()
    {
        // A stroke whose core is dark (0.2) and whose soft edge is just under the low threshold (0.6), and a long
        // faint band (0.6 throughout, a stain's edge) on paper at 1; the high threshold is 0.4.
        const int w = 100, h = 60;
        var lum = Enumerable.Repeat(1f, w * h).ToArray();
        var ink = new byte[w * h];
        for (var y = 10; y < 40; y++)
            for (var x = 10; x < 15; x++)
            {
                lum[y * w + x] = x == 12 ? 0.2f : 0.6f;
                ink[y * w + x] = 1;
            }
        for (var y = 45; y < 50; y++)
            for (var x = 20; x < 95; x++)
            {
                lum[y * w + x] = 0.6f;
                ink[y * w + x] = 1;
            }
        var components = InkHysteresis.Apply(ink, lum, w, h, 0.4f);
        Assert.Equal(1, components.Count);
        Assert.Equal(150, components.Area[1]);
        Assert.Equal(0, ink[47 * w + 50]);
        Assert.Equal(1, ink[20 * w + 10]);
    }
}
