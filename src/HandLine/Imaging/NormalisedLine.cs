namespace HandLine.Imaging;

/// <summary>
/// A line image ready for feature extraction.
/// </summary>
/// <param name="Ink">Ink image (0 paper .. 1 ink), exactly the model's line height (<see cref="Features.FeatureConfig.LineHeight"/>) rows high.</param>
/// <param name="DeskewDegrees">
/// Rotation found and undone. Positive = the text was turned counter-clockwise as seen on screen
/// (baseline rising to the right); the normaliser turned it back clockwise by this much.
/// 0 when the correction would move no pixel by half a pixel.
/// </param>
/// <param name="SlantDegrees">Shear found and undone (0 when negligible, as above). Positive = strokes leaned right (tops to the right).</param>
/// <param name="HasInk">False when the image was blank; <paramref name="Ink"/> is then an empty square.</param>
public sealed record NormalisedLine(GrayImage Ink, double DeskewDegrees, double SlantDegrees, bool HasInk);
