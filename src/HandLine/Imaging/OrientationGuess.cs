namespace HandLine.Imaging;

/// <summary>
/// The ink cue of <see cref="OrientationEstimator"/> for one image: how line-like the ink's bands are with the lines
/// taken as running across the image (<see cref="Across"/>: rotation 0 or 180) or down it (<see cref="Down"/>: 90 or
/// 270), each as an ink-weighted mean natural log of a band's length over its height.
/// </summary>
public sealed record OrientationGuess(double Across, double Down)
{
    /// <summary>Across minus Down: positive when the lines run across.</summary>
    public double AxisMargin => Across - Down;
}
