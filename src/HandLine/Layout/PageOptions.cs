namespace HandLine.Layout;

/// <summary>
/// The page stage's tuning values, in one place. Lengths given as a share of the page scale with the scan's
/// resolution; lengths given in text heights scale with the writing (the median height of the page's ink
/// components). Checked once, when a <see cref="PageAnalyser"/> is made.
/// </summary>
public sealed record PageOptions
{
    /// <summary>The page's rotation is searched within ± this many degrees.</summary>
    public double MaxDeskewDegrees { get; init; } = 5;

    /// <summary>The skew search runs on a box-downscaled copy of at most about this many pixels.</summary>
    public int DeskewPixels { get; init; } = 600_000;

    /// <summary>Side of the window the paper level is taken over, as a share of the page's shorter side (wider than any stroke).</summary>
    public double FlattenWindowFraction { get; init; } = 0.04;

    /// <summary>Share of a page's pixels taken as the level of full ink (the darkest ones); a page holds more writing than this.</summary>
    public double InkQuantile { get; init; } = 0.01;

    /// <summary>
    /// Ink is what is darker than halfway from paper to the ink level; a component counts as writing only when its
    /// darkest pixel reaches at least this share of the way (hysteresis: faint stain edges and shadows drop out).
    /// </summary>
    public double StrongInkShare { get; init; } = 0.75;

    /// <summary>A straight dark run at least this share of the page's width (height) is a horizontal (vertical) rule.</summary>
    public double RuleMinLengthFraction { get; init; } = 0.12;

    /// <summary>Rules are at most this thick in pixels; where the ink across a rule is thicker, writing crosses it and is kept.</summary>
    public int RuleMaxThicknessPx { get; init; } = 6;

    /// <summary>A vertical rule that runs at least this share of the page's height divides the page into columns.</summary>
    public double ColumnRuleFraction { get; init; } = 0.25;

    /// <summary>A clear vertical strip at least this many text heights wide, with writing on both sides, divides columns too.</summary>
    public double ColumnGapHeights { get; init; } = 1.5;

    /// <summary>Within a row and column, writing further apart than this many text heights is two lines.</summary>
    public double PartGapHeights { get; init; } = 4;

    /// <summary>Standard deviation of the Gaussian that smooths a column's row profile, in text heights.</summary>
    public double ProfileSigmaHeights { get; init; } = 0.2;

    /// <summary>Two profile peaks closer than this many text heights are one line.</summary>
    public double MinLineSpacingHeights { get; init; } = 0.6;

    /// <summary>Ink whose middle lies further than this many text heights from its line's profile peak is left out of the line.</summary>
    public double LineReachHeights { get; init; } = 1.2;

    /// <summary>A component with at least this share of its ink in one line's band belongs to it whole; others are cut at the valleys.</summary>
    public double WholeComponentShare { get; init; } = 0.75;

    /// <summary>Context kept around a line's ink in its crop, in text heights.</summary>
    public double CropPadHeights { get; init; } = 0.3;

    /// <summary>Auto layout: an image this tall or taller, and at least half as tall as it is wide, is a page.</summary>
    public int PageMinHeight { get; init; } = 600;

    /// <summary>The text-direction cue (<see cref="PageAxisEstimator"/>) runs on a box-downscaled copy of at most about this many pixels.</summary>
    public int AxisPixels { get; init; } = 400_000;

    /// <summary>The text-direction cue measures squares of the downscaled page this many to its shorter side.</summary>
    public int AxisSquares { get; init; } = 6;

    /// <summary>Throws <see cref="ArgumentException"/> when a value is out of range.</summary>
    public void Validate()
    {
        Check(double.IsFinite(MaxDeskewDegrees) && MaxDeskewDegrees is >= 0 and <= 15, nameof(MaxDeskewDegrees), "must be within 0..15");
        Check(DeskewPixels >= 50_000, nameof(DeskewPixels), "must be at least 50000");
        Check(FlattenWindowFraction is > 0.005 and < 0.5, nameof(FlattenWindowFraction), "must be within 0.005..0.5");
        Check(InkQuantile is > 0 and < 0.5, nameof(InkQuantile), "must be within 0..0.5");
        Check(StrongInkShare is >= 0.5 and < 1, nameof(StrongInkShare), "must be within 0.5..1");
        Check(RuleMinLengthFraction is > 0.02 and < 1, nameof(RuleMinLengthFraction), "must be within 0.02..1");
        Check(RuleMaxThicknessPx is >= 1 and <= 50, nameof(RuleMaxThicknessPx), "must be within 1..50");
        Check(ColumnRuleFraction is > 0 and <= 1, nameof(ColumnRuleFraction), "must be within 0..1");
        Check(ColumnGapHeights > 0, nameof(ColumnGapHeights), "must be positive");
        Check(PartGapHeights > 0, nameof(PartGapHeights), "must be positive");
        Check(ProfileSigmaHeights is > 0 and < 2, nameof(ProfileSigmaHeights), "must be within 0..2");
        Check(MinLineSpacingHeights is > 0 and < 3, nameof(MinLineSpacingHeights), "must be within 0..3");
        Check(LineReachHeights > 0, nameof(LineReachHeights), "must be positive");
        Check(WholeComponentShare is > 0.5 and <= 1, nameof(WholeComponentShare), "must be within 0.5..1");
        Check(CropPadHeights is >= 0 and < 3, nameof(CropPadHeights), "must be within 0..3");
        Check(AxisPixels >= 50_000, nameof(AxisPixels), "must be at least 50000");
        Check(AxisSquares is >= 1 and <= 50, nameof(AxisSquares), "must be within 1..50");
        Check(PageMinHeight >= 1, nameof(PageMinHeight), "must be positive");
    }

    private static void Check(bool ok, string name, string problem)
    {
        if (!ok)
            throw new ArgumentException($"PageOptions.{name} {problem}.", name);
    }
}
