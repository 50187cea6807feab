using System.Text.Json.Serialization;
using HandLine.Imaging;

namespace HandLine.Features;

/// <summary>
/// How an image becomes a normalised line and the line a feature sequence, as far as the model decides it. Stored
/// in every model file so that inference always prepares lines exactly as training did; it is the only owner of
/// these settings (the imaging stage's tuning values and the input limits have no say over them).
/// </summary>
/// <param name="LineHeight">Normalised line height in pixels (rows per column).</param>
/// <param name="Geometric">Append the nine geometric column features to each pixel column.</param>
/// <param name="FrameStride">Adjacent columns concatenated into one frame; shortens sequences for the LSTM.</param>
/// <param name="CorrectSlant">Undo the shear of upright strokes before extracting features.</param>
/// <param name="Binarisation">Thresholding applied during normalisation; stored as "none", "otsu" or "sauvola", and a
/// file naming any other method is refused.</param>
public sealed record FeatureConfig(
    [property: JsonPropertyName("line_height")] int LineHeight = 40,
    [property: JsonPropertyName("geometric")] bool Geometric = false,
    [property: JsonPropertyName("frame_stride")] int FrameStride = 2,
    [property: JsonPropertyName("correct_slant")] bool CorrectSlant = true,
    [property: JsonPropertyName("binarisation"), JsonConverter(typeof(BinarisationNames))]
    BinarisationMethod Binarisation = BinarisationMethod.None)
{
    /// <summary>Values per column: the pixel column plus, optionally, the geometric features.</summary>
    [JsonIgnore]
    public int ColumnDimension => LineHeight + (Geometric ? GeometricColumnFeatures.Count : 0);

    /// <summary>Values per frame (what the network sees at each time step).</summary>
    [JsonIgnore]
    public int FrameDimension => ColumnDimension * FrameStride;

    public void Validate()
    {
        if (LineHeight is < 8 or > 256)
            throw new ArgumentException($"line height {LineHeight} is outside 8..256");
        if (FrameStride is < 1 or > 8)
            throw new ArgumentException($"frame stride {FrameStride} is outside 1..8");
        if (!Enum.IsDefined(Binarisation))
            throw new ArgumentException($"unknown binarisation {(int)Binarisation} (none, otsu, sauvola)");
    }
}
