using HandLine.Imaging;

namespace HandLine.Tests.Imaging;

public sealed class ResamplerTests
{
    [Fact]
    public void Area_shrink_averages_covered_pixels()
    {
        // Area averaging by hand: 6 → 4 pixels, each output covers 1.5 inputs.
        // out0 = (1·1 + 0.5·0)/1.5 = 0.6667, out1 = (0.5·0 + 1·1)/1.5 = 0.6667,
        // out2 = (1·0 + 0.5·0)/1.5 = 0,      out3 = (0.5·0 + 1·1)/1.5 = 0.6667.
        var row = new GrayImage(6, 1, [1f, 0f, 1f, 0f, 0f, 1f]);
        var shrunk = Resampler.Resize(row, 4, 1);
        Assert.Equal([0.6667f, 0.6667f, 0f, 0.6667f], shrunk.Pixels.Select(v => MathF.Round(v, 4)));
    }

    [Fact]
    public void Area_shrink_keeps_total_ink_per_area()
    {
        var rng = new Random(5);
        var image = new GrayImage(50, 30, Enumerable.Range(0, 1500).Select(_ => (float)rng.NextDouble()).ToArray());
        var shrunk = Resampler.Resize(image, 17, 11);
        Assert.Equal(image.Pixels.Average(), shrunk.Pixels.Average(), 2);
    }

    [Fact]
    public void Bilinear_enlarge_interpolates_between_centres()
    {
        // Pixel-centre alignment: 2 → 4 pixels samples source positions −0.25, 0.25, 0.75, 1.25,
        // clamped to [0, 1]: values 0, 0.25, 0.75, 1 for a 0 → 1 ramp.
        var enlarged = Resampler.Resize(new GrayImage(2, 1, [0f, 1f]), 4, 1);
        Assert.Equal([0f, 0.25f, 0.75f, 1f], enlarged.Pixels);
    }

    [Fact]
    public void Box_downscale_averages_blocks_including_partial_edges()
    {
        var image = new GrayImage(3, 3, [1, 2, 3, 4, 5, 6, 7, 8, 9]);
        var small = Resampler.BoxDownscale(image, 2);
        // Blocks: {1,2,4,5} → 3, {3,6} → 4.5, {7,8} → 7.5, {9} → 9.
        Assert.Equal([3f, 4.5f, 7.5f, 9f], small.Pixels);
    }

    [Fact]
    public void Upright_transform_with_no_angles_is_identity()
    {
        var rng = new Random(9);
        var image = new GrayImage(13, 7, Enumerable.Range(0, 91).Select(_ => (float)rng.NextDouble()).ToArray());
        var t = UprightTransform.Rotation(image, 0);
        var (x0, y0, _, _) = t.Bounds(0, 0, 12, 6);
        var same = t.Render(image, x0, y0, 13, 7, 0f);
        for (int i = 0; i < 91; i++)
            Assert.Equal(image.Pixels[i], same.Pixels[i], 5);
    }

    [Fact]
    public void Upright_transform_turns_counter_clockwise_text_back()
    {
        // A point to the right of centre on text turned 90° counter-clockwise sits above the centre
        // (screen y down); undoing the turn must bring it back to the right.
        var image = GrayImage.Filled(5, 5, 0f);
        var t = UprightTransform.Rotation(image, 90);
        var (u, v) = t.Forward(2, 0); // centre (2, 2); the point is 2 above it
        Assert.Equal(2, u, 6);
        Assert.Equal(0, v, 6);
    }
}
