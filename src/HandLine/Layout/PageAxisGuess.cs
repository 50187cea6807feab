namespace HandLine.Layout;

/// <summary>
/// The cue of <see cref="PageAxisEstimator"/> for one page. <see cref="Across"/> and <see cref="Down"/>: how regularly
/// the writing rises and falls taken across the page's rows (lines running across: rotation 0 or 180) and across its
/// columns (lines running down: 90 or 270), each an ink-weighted mean over the page's squares of an autocorrelation
/// peak (0..1). <see cref="Spread"/>: the ink-weighted mean log ratio of the row profile's unevenness to the column
/// profile's, positive when the lines run across.
/// </summary>
public sealed record PageAxisGuess(double Across, double Down, double Spread)
{
    /// <summary>Across minus Down: positive when the lines run across.</summary>
    public double RhythmMargin => Across - Down;

    /// <summary>
    /// +1 when the lines run across, −1 when they run down, 0 when the cue is unsure: the spread decides when it
    /// reaches <paramref name="sureSpread"/> either way (a page of a few lines), else the rhythm when its margin reaches
    /// <paramref name="sureRhythm"/> (a full page).
    /// </summary>
    public int Axis(double sureSpread, double sureRhythm) =>
        Math.Abs(Spread) >= sureSpread ? Math.Sign(Spread)
        : Math.Abs(RhythmMargin) >= sureRhythm ? Math.Sign(RhythmMargin)
        : 0;
}
