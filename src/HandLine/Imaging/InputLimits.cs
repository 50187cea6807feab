namespace HandLine.Imaging;

/// <summary>
/// Safety limits on what a user's image may cost: they decide whether an image is read at all, never what is
/// read from it. Every value is checked as it is set, so an <see cref="InputLimits"/> that exists is valid and no
/// stage checks it again.
/// </summary>
public sealed record InputLimits
{
    private readonly long _maxFileBytes = 64L * 1024 * 1024;
    private readonly long _maxPixels = 40_000_000;
    private readonly int _maxLineWidth = 20_000;

    /// <summary>The defaults: suit scanned pages and lines at roughly 200–400 dpi.</summary>
    public static InputLimits Default { get; } = new();

    /// <summary>Largest image file accepted, in bytes (checked before reading).</summary>
    public long MaxFileBytes
    {
        get => _maxFileBytes;
        init => _maxFileBytes = Positive(value, nameof(MaxFileBytes));
    }

    /// <summary>Largest width × height accepted (checked from the header before decoding).</summary>
    public long MaxPixels
    {
        get => _maxPixels;
        init => _maxPixels = Positive(value, nameof(MaxPixels));
    }

    /// <summary>
    /// Widest normalised line accepted, in pixels; wider means the input is not a single text line. At least the
    /// height of the line it applies to (checked where the two meet, in <see cref="LineNormaliser"/>'s constructor).
    /// </summary>
    public int MaxLineWidth
    {
        get => _maxLineWidth;
        init => _maxLineWidth = (int)Positive(value, nameof(MaxLineWidth));
    }

    private static long Positive(long value, string name) =>
        value > 0 ? value : throw new ArgumentException($"InputLimits.{name} must be positive.", name);
}
