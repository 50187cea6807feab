namespace HandLine.Imaging;

/// <summary>
/// A single-channel raster, row-major, one float per pixel. Loaded images hold luminance
/// (0 = black, 1 = white); normalised lines hold ink (0 = background, 1 = full ink).
/// Treat as immutable: every stage returns a new image.
/// </summary>
public sealed class GrayImage
{
    public GrayImage(int width, int height, float[] pixels)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(width);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(height);
        ArgumentNullException.ThrowIfNull(pixels);
        if (pixels.Length != (long)width * height)
            throw new ArgumentException($"Expected {width}x{height} pixels, got {pixels.Length}.", nameof(pixels));
        Width = width;
        Height = height;
        Pixels = pixels;
    }

    public int Width { get; }
    public int Height { get; }

    /// <summary>Row-major pixel values; do not modify after construction.</summary>
    public float[] Pixels { get; }

    public float this[int x, int y] => Pixels[y * Width + x];

    public static GrayImage Filled(int width, int height, float value)
    {
        var p = new float[width * height];
        Array.Fill(p, value);
        return new GrayImage(width, height, p);
    }
}
