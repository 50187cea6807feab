using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Processing;

namespace HandLine.Proof;

/// <summary>Line images as data URIs, so the report is one file that needs nothing else.</summary>
internal static class ReportImages
{
    // A line image wider than this is shrunk: the report is read on a screen. Common practice, no source.
    private const int MaxWidth = 1600;
    private const int MaxEmbeddedBytes = 512 * 1024;

    /// <summary>The image as a data URI, or null when it cannot be read.</summary>
    public static string? DataUri(string path)
    {
        try
        {
            return DataUri(File.ReadAllBytes(path), Path.GetExtension(path));
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }

    /// <summary>An image's bytes as a data URI (<paramref name="extension"/> names its format), or null when they are not an image.</summary>
    public static string? DataUri(byte[] bytes, string extension)
    {
        try
        {
            var type = extension.ToLowerInvariant() switch
            {
                ".png" => "image/png",
                ".jpg" or ".jpeg" => "image/jpeg",
                ".gif" => "image/gif",
                _ => null,
            };
            if (type is not null && bytes.Length <= MaxEmbeddedBytes)
                return $"data:{type};base64,{Convert.ToBase64String(bytes)}";
            // TIFF and BMP are not shown by every browser, and a large scan would swell the file: re-encode as PNG.
            using var image = Image.Load(bytes);
            if (image.Width > MaxWidth)
                image.Mutate(x => x.Resize(MaxWidth, 0));
            using var png = new MemoryStream();
            image.SaveAsPng(png);
            return $"data:image/png;base64,{Convert.ToBase64String(png.ToArray())}";
        }
        catch (Exception e) when (e is UnknownImageFormatException or InvalidImageContentException)
        {
            return null;
        }
    }
}
