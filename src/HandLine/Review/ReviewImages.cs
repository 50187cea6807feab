using HandLine.Proof;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Jpeg;
using SixLabors.ImageSharp.PixelFormats;
using SixLabors.ImageSharp.Processing;

namespace HandLine.Review;

/// <summary>
/// Line images as data URIs small enough for a page of 10,000 lines: an image above <see cref="SmallBytes"/> is
/// scaled to at most <see cref="MaxHeight"/> pixels high and stored as a grey JPEG when that is smaller (a noisy
/// scan compresses badly as PNG: a 442×78 synthetic line is 14 KB as PNG and about a third of that as JPEG).
/// </summary>
internal static class ReviewImages
{
    // Common practice, no source: enough to read a handwritten line on screen.
    private const int SmallBytes = 6 * 1024;
    private const int MaxHeight = 120;
    private const int JpegQuality = 85;

    public static string? DataUri(LineImage image)
    {
        if (image.Bytes.Length <= SmallBytes)
            return ReportImages.DataUri(image.Bytes, image.Extension);
        try
        {
            using var picture = Image.Load<L8>(image.Bytes);
            if (picture.Height > MaxHeight)
                picture.Mutate(x => x.Resize(0, MaxHeight));
            using var jpeg = new MemoryStream();
            picture.SaveAsJpeg(jpeg, new JpegEncoder { Quality = JpegQuality });
            return jpeg.Length < image.Bytes.Length
                ? $"data:image/jpeg;base64,{Convert.ToBase64String(jpeg.ToArray())}"
                : ReportImages.DataUri(image.Bytes, image.Extension);
        }
        catch (Exception e) when (e is UnknownImageFormatException or InvalidImageContentException)
        {
            return null;
        }
    }
}
