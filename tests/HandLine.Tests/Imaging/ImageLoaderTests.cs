using HandLine.Imaging;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace HandLine.Tests.Imaging;

public sealed class ImageLoaderTests
{
    private static readonly InputLimits Defaults = InputLimits.Default;

    // 37×23, black left half, white right half: odd sizes catch swapped or padded dimensions.
    private static Image<Rgba32> Sample()
    {
        var image = new Image<Rgba32>(37, 23);
        for (int y = 0; y < image.Height; y++)
            for (int x = 0; x < image.Width; x++)
                image[x, y] = x < 18 ? new Rgba32(0, 0, 0, 255) : new Rgba32(255, 255, 255, 255);
        return image;
    }

    private static byte[] Encode(Image image, string format)
    {
        using var stream = new MemoryStream();
        switch (format)
        {
            case "png": image.SaveAsPng(stream); break;
            case "jpeg": image.SaveAsJpeg(stream); break;
            case "tiff": image.SaveAsTiff(stream); break;
            case "bmp": image.SaveAsBmp(stream); break;
            case "gif": image.SaveAsGif(stream); break;
            default: throw new ArgumentException(format);
        }
        return stream.ToArray();
    }

    [Theory]
    [InlineData("png")]
    [InlineData("jpeg")]
    [InlineData("tiff")]
    [InlineData("bmp")]
    [InlineData("gif")]
    public void Loads_supported_formats_as_luminance(string format)
    {
        using var sample = Sample();
        var image = ImageLoader.Load(Encode(sample, format), "ledger." + format, Defaults);
        Assert.Equal(37, image.Width);
        Assert.Equal(23, image.Height);
        // JPEG is lossy: allow a little ringing away from the edge.
        Assert.InRange(image[4, 11], 0f, 0.05f);
        Assert.InRange(image[32, 11], 0.95f, 1f);
    }

    [Fact]
    public void Transparent_pixels_are_composited_over_white()
    {
        using var image = new Image<Rgba32>(3, 1);
        image[0, 0] = new Rgba32(0, 0, 0, 0);
        image[1, 0] = new Rgba32(0, 0, 0, 255);
        image[2, 0] = new Rgba32(0, 0, 0, 128);
        var gray = ImageLoader.Load(Encode(image, "png"), "alpha.png", Defaults);
        Assert.Equal(1f, gray[0, 0], 3);
        Assert.Equal(0f, gray[1, 0], 3);
        Assert.Equal(1f - 128f / 255f, gray[2, 0], 3);
    }

    [Fact]
    public void Loads_from_a_file_path()
    {
        string path = Path.Combine(Path.GetTempPath(), $"handline-{Guid.NewGuid():N}.png");
        using var sample = Sample();
        File.WriteAllBytes(path, Encode(sample, "png"));
        try
        {
            var image = ImageLoader.Load(path, Defaults);
            Assert.Equal((37, 23), (image.Width, image.Height));
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Missing_file_fails_at_read()
    {
        var e = Assert.Throws<InputException>(() => ImageLoader.Load("/nonexistent/parish-register-p1.png", Defaults));
        Assert.Equal("read", e.Stage);
        Assert.Contains("not found", e.Reason);
    }

    [Fact]
    public void Oversized_file_fails_at_limits_before_reading()
    {
        string path = Path.Combine(Path.GetTempPath(), $"handline-{Guid.NewGuid():N}.png");
        File.WriteAllBytes(path, new byte[5000]); // not even an image: the size check must come first
        try
        {
            var e = Assert.Throws<InputException>(() => ImageLoader.Load(path, Defaults with { MaxFileBytes = 1000 }));
            Assert.Equal("limits", e.Stage);
            Assert.Contains("5000 bytes", e.Reason);
            Assert.Contains("1000", e.Reason);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Oversized_bytes_fail_at_limits()
    {
        using var sample = Sample();
        var bytes = Encode(sample, "bmp");
        var e = Assert.Throws<InputException>(() => ImageLoader.Load(bytes, "big.bmp", Defaults with { MaxFileBytes = 100 }));
        Assert.Equal("limits", e.Stage);
        Assert.Contains("over the limit of 100", e.Reason);
    }

    [Fact]
    public void Empty_file_fails_at_decode()
    {
        var e = Assert.Throws<InputException>(() => ImageLoader.Load([], "empty.png", Defaults));
        Assert.Equal("decode", e.Stage);
        Assert.Equal("file is empty", e.Reason);
        Assert.Equal("empty.png", e.Path);
    }

    [Fact]
    public void Truncated_png_fails_at_decode()
    {
        using var sample = Sample();
        var bytes = Encode(sample, "png");
        var e = Assert.Throws<InputException>(() => ImageLoader.Load(bytes[..(bytes.Length / 2)], "cut.png", Defaults));
        Assert.Equal("decode", e.Stage);
        Assert.Contains("cut short", e.Reason);
    }

    [Fact]
    public void Random_bytes_fail_as_unrecognised_format()
    {
        var bytes = new byte[2048];
        new Random(11).NextBytes(bytes);
        bytes[0] = 0x42; // avoid accidentally starting with a real signature byte
        var e = Assert.Throws<InputException>(() => ImageLoader.Load(bytes, "noise.png", Defaults));
        Assert.Equal("decode", e.Stage);
        Assert.Contains("not a recognised image format", e.Reason);
    }

    [Fact]
    public void Too_many_pixels_fail_at_limits()
    {
        using var sample = Sample();
        var e = Assert.Throws<InputException>(() => ImageLoader.Load(Encode(sample, "png"), "wide.png", Defaults with { MaxPixels = 500 }));
        Assert.Equal("limits", e.Stage);
        Assert.Equal("image is 37x23 pixels, over the limit of 500", e.Reason);
    }

    [Fact]
    public void Header_claiming_huge_size_is_refused_before_decoding()
    {
        // A 1×1 PNG whose header is edited to claim 30000×30000: a decompression-bomb shape.
        using var tiny = new Image<Rgba32>(1, 1);
        var bytes = Encode(tiny, "png");
        bytes = PngBytes.WithClaimedSize(bytes, 30000, 30000);

        var e = Assert.Throws<InputException>(() => ImageLoader.Load(bytes, "bomb.png", Defaults));
        Assert.Equal("limits", e.Stage);
        Assert.Equal("image is 30000x30000 pixels, over the limit of 40000000", e.Reason);
    }
}
