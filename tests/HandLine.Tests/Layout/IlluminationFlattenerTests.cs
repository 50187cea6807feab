using HandLine.Imaging;
using HandLine.Layout;

namespace HandLine.Tests.Layout;

public sealed class IlluminationFlattenerTests
{
    [Fact]
    public void AStainWithASharpEdgeComesOutAsPaperRightUpToItsEdgeWhileInkKeepsItsContrast()
    {
        // A drawn case: paper at 0.9; the right half of the page a stain at 0.7 with a sharp edge at x 150; a pen
        // stroke (0.2) 3 px wide down the paper half and one down the stained half. The page stage takes as ink
        // what is darker than halfway from paper (1 after flattening) to ink, so the stain must come out above that
        // everywhere, also beside its edge, where the paper's level used to be carried a window's width into it.
        const int w = 300, h = 300;
        var pixels = new float[w * h];
        for (var y = 0; y < h; y++)
            for (var x = 0; x < w; x++)
                pixels[y * w + x] = (x >= 80 && x < 83) ? 0.2f * 0.9f
                    : (x >= 220 && x < 223) ? 0.2f * 0.7f
                    : x >= 150 ? 0.7f : 0.9f;
        var flat = IlluminationFlattener.Flatten(new GrayImage(w, h, pixels), 40);

        for (var y = 20; y < h - 20; y += 10)
            for (var x = 150; x < w; x++)
            {
                if (x >= 220 && x < 223) continue;
                Assert.True(flat.Pixels[y * w + x] > 0.85f, $"stain at ({x}, {y}) flattened to {flat.Pixels[y * w + x]:F3}");
            }
        // The strokes keep their contrast to the paper around them, on the paper and in the stain.
        Assert.InRange(flat.Pixels[150 * w + 81], 0f, 0.3f);
        Assert.InRange(flat.Pixels[150 * w + 221], 0f, 0.3f);
    }
}
