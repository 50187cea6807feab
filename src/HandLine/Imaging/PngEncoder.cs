using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace HandLine.Imaging;

/// <summary>A luminance image as an 8-bit greyscale PNG.</summary>
public static class PngEncoder
{
    public static byte[] Encode(GrayImage image)
    {
        ArgumentNullException.ThrowIfNull(image);
        using var png = new Image<L8>(image.Width, image.Height);
        for (var y = 0; y < image.Height; y++)
            for (var x = 0; x < image.Width; x++)
                png[x, y] = new L8((byte)Math.Clamp(Math.Round(image[x, y] * 255), 0, 255));
        using var buffer = new MemoryStream();
        png.SaveAsPng(buffer);
        return buffer.ToArray();
    }
}
