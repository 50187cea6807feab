namespace HandLine.Imaging;

/// <summary>
/// Every limit and setting of the imaging stage in one place. Defaults suit scanned lines at
/// roughly 200–400 dpi; call <see cref="Validate"/> before use (the stage's entry points do).
/// </summary>
public sealed record ImagingOptions
{
    /// <summary>Largest image file accepted, in bytes (checked before reading).</summary>
    public long MaxFileBytes { get; init; } = 64L * 1024 * 1024;

    /// <summary>Largest width × height accepted (checked from the header before decoding).</summary>
    public long MaxPixels { get; init; } = 40_000_000;

    /// <summary>Height of every normalised line, in pixels.</summary>
    public int LineHeight { get; init; } = 40;

    /// <summary>Background pixels kept around the ink on all four sides, inside <see cref="LineHeight"/>.</summary>
    public int Margin { get; init; } = 2;

    /// <summary>Rotations are searched within ± this many degrees.</summary>
    public double MaxDeskewDegrees { get; init; } = 15;

    public bool CorrectSlant { get; init; } = true;

    /// <summary>Stroke slants are searched within ± this many degrees.</summary>
    public double MaxSlantDegrees { get; init; } = 40;

    public BinarisationMethod Binarisation { get; init; } = BinarisationMethod.None;

    /// <summary>Side of the square Sauvola window in pixels (odd). Common practice, no source: a few stroke widths.</summary>
    public int SauvolaWindow { get; init; } = 25;

    /// <summary>Sauvola's k; 0.5 is the value in the original paper (recalled from memory); lower keeps thin strokes.</summary>
    public double SauvolaK { get; init; } = 0.3;

    /// <summary>Quantile of darkness taken as the paper level (most of a line image is paper).</summary>
    public double BackgroundPercentile { get; init; } = 0.5;

    /// <summary>Quantile of darkness taken as full ink; robust to a few stray dark pixels.</summary>
    public double InkPercentile { get; init; } = 0.99;

    /// <summary>Ink darker than paper by less than this (0..1) counts as a blank image.</summary>
    public double MinInkContrast { get; init; } = 0.15;

    /// <summary>A line with fewer ink pixels than this (after stretching, at ≥ 0.5) counts as blank.</summary>
    public int MinInkPixels { get; init; } = 8;

    /// <summary>
    /// Connected ink blobs smaller than this fraction of the largest blob are specks and do not
    /// widen the crop. Common practice, no source; a full stop is typically well above 1 %.
    /// </summary>
    public double SpeckFraction { get; init; } = 0.01;

    /// <summary>Most a line may be enlarged; tiny ink (a lone dash) is centred rather than blown up.</summary>
    public double MaxUpscale { get; init; } = 8;

    /// <summary>Widest normalised line accepted; wider means the input is not a single text line.</summary>
    public int MaxLineWidth { get; init; } = 20_000;

    /// <summary>Angle searches run on a box-downscaled copy of at most about this many pixels.</summary>
    public int EstimationPixels { get; init; } = 50_000;

    /// <summary>Line finder: a row holds text when its ink, above the quietest rows' level, exceeds this
    /// fraction of the fullest row's.</summary>
    public double LineRowFraction { get; init; } = 0.03;

    /// <summary>Line finder: a run of text rows is a line only if one of its rows stands out from the paper noise
    /// by six noise deviations or by this fraction of the fullest row's ink, whichever is less; fainter runs are
    /// noise, ruling or show-through.</summary>
    public double LineSeedFraction { get; init; } = 0.15;

    /// <summary>Line finder: gaps shorter than this fraction of the median line height are closed.</summary>
    public double LineGapFraction { get; init; } = 0.25;

    /// <summary>Throws <see cref="ArgumentException"/> when any setting is out of range.</summary>
    public void Validate()
    {
        Check(MaxFileBytes > 0, nameof(MaxFileBytes), "must be positive");
        Check(MaxPixels > 0, nameof(MaxPixels), "must be positive");
        Check(LineHeight is >= 8 and <= 1024, nameof(LineHeight), "must be between 8 and 1024");
        Check(Margin >= 0 && LineHeight - 2 * Margin >= 4, nameof(Margin), "must be non-negative and leave at least 4 rows of ink");
        Check(double.IsFinite(MaxDeskewDegrees) && MaxDeskewDegrees is >= 0 and <= 45, nameof(MaxDeskewDegrees), "must be between 0 and 45");
        Check(double.IsFinite(MaxSlantDegrees) && MaxSlantDegrees is >= 0 and <= 60, nameof(MaxSlantDegrees), "must be between 0 and 60");
        Check(Enum.IsDefined(Binarisation), nameof(Binarisation), "is not a known method");
        Check(SauvolaWindow >= 3 && SauvolaWindow % 2 == 1, nameof(SauvolaWindow), "must be an odd number ≥ 3");
        Check(double.IsFinite(SauvolaK) && SauvolaK is > 0 and < 1, nameof(SauvolaK), "must be between 0 and 1");
        Check(BackgroundPercentile is >= 0 and < 1, nameof(BackgroundPercentile), "must be in [0, 1)");
        Check(InkPercentile > BackgroundPercentile && InkPercentile <= 1, nameof(InkPercentile), "must be above BackgroundPercentile and at most 1");
        Check(MinInkContrast is > 0 and < 1, nameof(MinInkContrast), "must be between 0 and 1");
        Check(MinInkPixels >= 1, nameof(MinInkPixels), "must be at least 1");
        Check(SpeckFraction is >= 0 and < 1, nameof(SpeckFraction), "must be in [0, 1)");
        Check(double.IsFinite(MaxUpscale) && MaxUpscale >= 1, nameof(MaxUpscale), "must be at least 1");
        Check(MaxLineWidth >= LineHeight, nameof(MaxLineWidth), "must be at least LineHeight");
        Check(EstimationPixels >= 10_000, nameof(EstimationPixels), "must be at least 10000");
        Check(LineRowFraction is > 0 and < 1, nameof(LineRowFraction), "must be between 0 and 1");
        Check(LineSeedFraction >= LineRowFraction && LineSeedFraction < 1, nameof(LineSeedFraction), "must be at least LineRowFraction and below 1");
        Check(LineGapFraction is >= 0 and < 2, nameof(LineGapFraction), "must be in [0, 2)");
    }

    private static void Check(bool ok, string name, string problem)
    {
        if (!ok)
            throw new ArgumentException($"ImagingOptions.{name} {problem}.", name);
    }
}
