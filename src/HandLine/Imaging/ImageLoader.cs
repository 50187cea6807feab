using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Bmp;
using SixLabors.ImageSharp.Formats.Gif;
using SixLabors.ImageSharp.Formats.Jpeg;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.Formats.Tiff;
using SixLabors.ImageSharp.Memory;
using SixLabors.ImageSharp.PixelFormats;

namespace HandLine.Imaging;

/// <summary>
/// Reads a user's image file into luminance (0 = black, 1 = white). Every problem with the file
/// becomes an <see cref="InputException"/>; limits are checked before the costly steps
/// (size before reading, header pixel count before decoding) to defuse decompression bombs.
/// </summary>
public static class ImageLoader
{
    private const string Formats = "PNG, JPEG, TIFF, BMP or GIF";

    // Only the formats we support: fewer decoders, less attack surface.
    private static readonly Configuration DecodeConfiguration = new(
        new PngConfigurationModule(),
        new JpegConfigurationModule(),
        new TiffConfigurationModule(),
        new BmpConfigurationModule(),
        new GifConfigurationModule());

    public static GrayImage Load(string path, InputLimits limits) => Load(ReadFile(path, limits), path, limits);

    /// <summary>
    /// Reads an image file's bytes, checking its size first. Special files (pipes, devices) report a size of
    /// 0 and are refused before opening, because reading one could block for ever.
    /// </summary>
    public static byte[] ReadFile(string path, InputLimits limits)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        ArgumentNullException.ThrowIfNull(limits);

        try
        {
            var info = new FileInfo(path);
            if (!info.Exists)
                throw new InputException(path, "read", Directory.Exists(path) ? "is a folder, not an image file" : "file not found");
            if (info.Length == 0)
                throw new InputException(path, "decode", "file is empty");
            if (info.Length > limits.MaxFileBytes)
                throw new InputException(path, "limits", $"file is {info.Length} bytes, over the limit of {limits.MaxFileBytes}");
            return File.ReadAllBytes(path);
        }
        catch (Exception e) when (e is FileNotFoundException or DirectoryNotFoundException)
        {
            // FileInfo.Exists is true for a link whose target is gone.
            throw new InputException(path, "read", "file not found (or a link to a missing file)", e);
        }
        catch (UnauthorizedAccessException e)
        {
            throw new InputException(path, "read", "permission denied: this account may not read the file", e);
        }
        catch (Exception e) when (e is IOException or NotSupportedException or System.Security.SecurityException)
        {
            throw new InputException(path, "read", $"cannot read the file ({e.Message})", e);
        }
    }

    /// <param name="nameForErrors">Shown in error messages (normally the file's path).</param>
    public static GrayImage Load(byte[] bytes, string nameForErrors, InputLimits limits)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        ArgumentNullException.ThrowIfNull(nameForErrors);
        ArgumentNullException.ThrowIfNull(limits);

        if (bytes.Length == 0)
            throw new InputException(nameForErrors, "decode", "file is empty");
        if (bytes.Length > limits.MaxFileBytes)
            throw new InputException(nameForErrors, "limits", $"file is {bytes.Length} bytes, over the limit of {limits.MaxFileBytes}");

        // Before the decoders, which accept a cut-short file without complaint.
        if (ImageIntegrity.Problem(bytes) is { } damage)
            throw new InputException(nameForErrors, "decode", damage);

        IImageInfo? info;
        try
        {
            using var probe = new MemoryStream(bytes, writable: false);
            info = Image.Identify(DecodeConfiguration, probe);
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            throw Wrap(nameForErrors, e);
        }

        if (info is null)
            throw new InputException(nameForErrors, "decode", $"not a recognised image format (expected {Formats})");
        if (info.Width <= 0 || info.Height <= 0)
            throw new InputException(nameForErrors, "decode", $"image header gives an empty size ({info.Width}x{info.Height})");
        long pixels = (long)info.Width * info.Height;
        if (pixels > limits.MaxPixels)
            throw new InputException(nameForErrors, "limits", $"image is {info.Width}x{info.Height} pixels, over the limit of {limits.MaxPixels}");

        try
        {
            using var stream = new MemoryStream(bytes, writable: false);
            using var image = Image.Load<Rgba32>(DecodeConfiguration, stream);
            // The header already passed the limit; a decoder disagreeing with its own header is corrupt data.
            if ((long)image.Width * image.Height > limits.MaxPixels)
                throw new InputException(nameForErrors, "limits", $"image is {image.Width}x{image.Height} pixels, over the limit of {limits.MaxPixels}");
            return ToLuminance(image);
        }
        catch (InputException)
        {
            throw;
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            throw Wrap(nameForErrors, e);
        }
    }

    private static InputException Wrap(string name, Exception e) => e switch
    {
        UnknownImageFormatException => new InputException(name, "decode", $"not a recognised image format (expected {Formats})", e),
        InvalidMemoryOperationException => new InputException(name, "limits", "image needs more memory than allowed to decode", e),
        InvalidImageContentException or ImageFormatException or EndOfStreamException
            => new InputException(name, "decode", $"image data is damaged or incomplete ({e.Message})", e),
        _ => new InputException(name, "decode", $"image could not be decoded ({e.GetType().Name}: {e.Message})", e),
    };

    private static GrayImage ToLuminance(Image<Rgba32> image)
    {
        int w = image.Width;
        var pixels = new float[(long)w * image.Height];
        image.ProcessPixelRows(accessor =>
        {
            for (int y = 0; y < accessor.Height; y++)
            {
                var row = accessor.GetRowSpan(y);
                int o = y * w;
                for (int x = 0; x < row.Length; x++)
                {
                    var p = row[x];
                    // ITU-R BT.601 luma weights on the stored (gamma-encoded) values, as usual for greyscale conversion.
                    float luma = (0.299f * p.R + 0.587f * p.G + 0.114f * p.B) / 255f;
                    float a = p.A / 255f;
                    // Composite over white paper: transparent areas read as blank page, not as ink.
                    pixels[o + x] = a * luma + (1f - a);
                }
            }
        });
        return new GrayImage(w, image.Height, pixels);
    }
}
