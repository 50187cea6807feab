using HandLine.Formats;
using HandLine.Imaging;

namespace HandLine.Features;

/// <summary>One text line made ready for the network: its normalised ink and the features taken from it.</summary>
public sealed record PreparedLine(NormalisedLine Line, FeatureSequence Features)
{
    /// <summary>How far the image was turned before its lines were found (0, 90, 180 or 270 degrees).</summary>
    public int RotationDegrees { get; init; }

    /// <summary>How the image was taken: "line" (a line image or a strip of lines) or "page" (a whole page).</summary>
    public string Layout { get; init; } = "line";

    /// <summary>
    /// Page lines: the line's box in the page's pixels (as the page was given to <see cref="LinePreparer.PrepareImage"/>;
    /// the recogniser maps it back into the image's own pixels when it turned the image).
    /// </summary>
    public LineBox? Box { get; init; }

    /// <summary>Page lines: the column the line stands in.</summary>
    public int? Column { get; init; }

    /// <summary>Page lines: the entry (ruled row) the line belongs to.</summary>
    public int? Entry { get; init; }
}
