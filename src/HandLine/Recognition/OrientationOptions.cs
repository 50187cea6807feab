using HandLine.Imaging;

namespace HandLine.Recognition;

/// <summary>
/// How the recogniser settles which way an image's text runs (<see cref="QuarterTurn"/> for what a rotation means).
/// <see cref="Fixed"/> set: every image is read at that rotation. Null (auto): the ink cue
/// (<see cref="OrientationEstimator"/>) picks the axis, and the model picks between the two readings left, keeping
/// the one whose characters it is more confident of (the first by a margin); an image whose first reading (0, or 90 for lines running down)
/// is confident enough is not read a second time.
/// </summary>
public sealed record OrientationOptions
{
    /// <summary>Read every image at this rotation (0, 90, 180 or 270); null to detect it.</summary>
    public int? Fixed { get; init; }

    /// <summary>
    /// A first reading whose mean character confidence reaches this is kept without trying the reading turned 180°.
    /// Measured on 200 validation lines (13 font families the default model never saw) turned 0 and 180: 1 % of the
    /// upside-down readings reach 0.9, 40 % of the upright ones do (and on the demo every line does).
    /// </summary>
    public double CheckBelow { get; init; } = 0.9;

    /// <summary>
    /// Another reading replaces the first only when its mean character confidence is higher by more than this: most
    /// batches are upright, and figures read much alike either way up ("1851" upside down reads as figures too).
    /// On 200 validation lines turned 0 and 180 with the default model (`docs/measurements.md`), 0.03 keeps 184
    /// upright lines upright (176 without) and finds 157 of those upside down (172 without); it stops the small
    /// model turning 3 of the 50 MNIST digit lines of its card upside down.
    /// </summary>
    public double PreferFirstBy { get; init; } = 0.03;

    /// <summary>
    /// The ink cue must favour one axis by at least this (difference of mean log elongations) for the other axis's
    /// two readings to be left out; below it all four are tried. On 800 turned validation lines the right axis won
    /// by 0.32 at the least and by 2.84 in the median.
    /// </summary>
    public double SureAxisMargin { get; init; } = 0.2;

    /// <summary>
    /// Whole pages (<see cref="HandLine.Layout.PageAxisGuess.Axis"/>): the spread cue decides the axis when it reaches
    /// this either way. On 10 generated validation pages (seed 2222) turned four ways the wrong sign reached 0.60 at most; on 38
    /// ruled and plain pages of 1 to 8 lines the right one reached 1.19 at the least (docs/measurements.md).
    /// </summary>
    public double SurePageSpread { get; init; } = 1.0;

    /// <summary>
    /// Whole pages: below <see cref="SurePageSpread"/>, the rhythm cue decides when its margin reaches this either way;
    /// below both, a page is compared only with itself upside down. On the 10 validation pages turned four ways the
    /// right axis won by 0.32 at the least.
    /// </summary>
    public double SurePageRhythm { get; init; } = 0.2;

    /// <summary>Detect the rotation (the default).</summary>
    public static OrientationOptions Auto { get; } = new();

    /// <summary>"auto", or the fixed rotation in degrees, as `--rotation` takes it and the run summary reports it.</summary>
    public string Name => Fixed is { } r ? r.ToString(System.Globalization.CultureInfo.InvariantCulture) : "auto";

    /// <summary>Parses `auto`, `0`, `90`, `180` or `270`.</summary>
    /// <exception cref="ArgumentException">Anything else.</exception>
    public static OrientationOptions Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        if (text.Trim().Equals("auto", StringComparison.OrdinalIgnoreCase)) return Auto;
        if (int.TryParse(text.Trim(), System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var d)
            && QuarterTurn.IsRotation(d))
            return new OrientationOptions { Fixed = d };
        throw new ArgumentException($"'{text}' is not a rotation: use auto, 0, 90, 180 or 270");
    }

    /// <summary>Throws <see cref="ArgumentException"/> when a setting is out of range.</summary>
    public void Validate()
    {
        if (Fixed is { } r && !QuarterTurn.IsRotation(r))
            throw new ArgumentException("OrientationOptions.Fixed must be 0, 90, 180 or 270.", nameof(Fixed));
        if (!double.IsFinite(CheckBelow) || CheckBelow is < 0 or > 1.01)
            throw new ArgumentException("OrientationOptions.CheckBelow must be within [0, 1.01].", nameof(CheckBelow));
        if (!double.IsFinite(PreferFirstBy) || PreferFirstBy is < 0 or > 1)
            throw new ArgumentException("OrientationOptions.PreferFirstBy must be within [0, 1].", nameof(PreferFirstBy));
        if (!double.IsFinite(SureAxisMargin) || SureAxisMargin < 0)
            throw new ArgumentException("OrientationOptions.SureAxisMargin must be non-negative.", nameof(SureAxisMargin));
        if (!double.IsFinite(SurePageSpread) || SurePageSpread < 0)
            throw new ArgumentException("OrientationOptions.SurePageSpread must be non-negative.", nameof(SurePageSpread));
        if (!double.IsFinite(SurePageRhythm) || SurePageRhythm < 0)
            throw new ArgumentException("OrientationOptions.SurePageRhythm must be non-negative.", nameof(SurePageRhythm));
    }
}
