namespace HandLine.Imaging;

/// <summary>
/// The imaging stage's tuning values: how paper, ink, angles and lines are judged. Defaults suit scanned lines
/// at roughly 200–400 dpi. Not here: what the model fixes about a normalised line (height, slant correction,
/// binarisation: <see cref="Features.FeatureConfig"/>) and the safety limits (<see cref="InputLimits"/>).
/// Checked once, when a stage is made from it (<see cref="LineFinder"/>, <see cref="LineNormaliser"/>).
/// </summary>
public sealed record ImagingOptions
{



    /// <summary>Background pixels kept around the ink on all four sides, inside the model's line height.</summary>
    public int Margin { get; init; } = 2;

    /// <summary>Rotations are searched within ± this many degrees.</summary>
    public double MaxDeskewDegrees { get; init; } = 15;

    /// <summary>Stroke slants are searched within ± this many degrees.</summary>
    public double MaxSlantDegrees { get; init; } = 40;

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
        Check(Margin >= 0, nameof(Margin), "must be non-negative");
        Check(double.IsFinite(MaxDeskewDegrees) && MaxDeskewDegrees is >= 0 and <= 45, nameof(MaxDeskewDegrees), "must be between 0 and 45");
        Check(double.IsFinite(MaxSlantDegrees) && MaxSlantDegrees is >= 0 and <= 60, nameof(MaxSlantDegrees), "must be between 0 and 60");
        Check(SauvolaWindow >= 3 && SauvolaWindow % 2 == 1, nameof(SauvolaWindow), "must be an odd number ≥ 3");
        Check(double.IsFinite(SauvolaK) && SauvolaK is > 0 and < 1, nameof(SauvolaK), "must be between 0 and 1");
        Check(BackgroundPercentile is >= 0 and < 1, nameof(BackgroundPercentile), "must be in [0, 1)");
        Check(InkPercentile > BackgroundPercentile && InkPercentile <= 1, nameof(InkPercentile), "must be above BackgroundPercentile and at most 1");
        Check(MinInkContrast is > 0 and < 1, nameof(MinInkContrast), "must be between 0 and 1");
        Check(MinInkPixels >= 1, nameof(MinInkPixels), "must be at least 1");
        Check(SpeckFraction is >= 0 and < 1, nameof(SpeckFraction), "must be in [0, 1)");
        Check(double.IsFinite(MaxUpscale) && MaxUpscale >= 1, nameof(MaxUpscale), "must be at least 1");
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
