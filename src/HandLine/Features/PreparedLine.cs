using HandLine.Imaging;

namespace HandLine.Features;

/// <summary>One text line made ready for the network: its normalised ink and the features taken from it.</summary>
public sealed record PreparedLine(NormalisedLine Line, FeatureSequence Features)
{
    /// <summary>How far the image was turned before its lines were found (0, 90, 180 or 270 degrees).</summary>
    public int RotationDegrees { get; init; }
}
