using HandLine.Imaging;

namespace HandLine.Features;

/// <summary>A line image after normalisation and feature extraction.</summary>
public sealed record PreparedLine(NormalisedLine Line, FeatureSequence Features);

/// <summary>
/// Image to features exactly as a model expects: the model's feature configuration fixes line height, slant
/// correction and binarisation; the caller's options supply only the safety limits. Training and
/// transcription both come through here, so they cannot drift apart.
/// </summary>
public static class LinePreparation
{
    public static ImagingOptions ImagingFor(FeatureConfig features, ImagingOptions limits) => limits with
    {
        LineHeight = features.LineHeight,
        CorrectSlant = features.CorrectSlant,
        Binarisation = features.Binarisation switch
        {
            "otsu" => BinarisationMethod.Otsu,
            "sauvola" => BinarisationMethod.Sauvola,
            _ => BinarisationMethod.None,
        },
    };

    /// <summary>Normalises a luminance line image and extracts its features.</summary>
    /// <param name="nameForErrors">The image's path, named in any <see cref="InputException"/>.</param>
    public static PreparedLine Prepare(GrayImage luminance, FeatureConfig features, ImagingOptions imaging, string nameForErrors = "line image")
    {
        var line = LineNormaliser.Normalise(luminance, imaging, nameForErrors);
        return new PreparedLine(line, ColumnFeatures.Extract(line, features));
    }
}
