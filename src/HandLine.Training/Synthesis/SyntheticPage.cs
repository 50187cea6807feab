using HandLine.Imaging;

namespace HandLine.Synthesis;

/// <summary>
/// A drawn page (luminance), its parts in reading order (entries top to bottom, each entry's parts left to right),
/// and for each part the same writing drawn alone on the same paper, skew and light: the line image to compare a
/// page's transcription with.
/// </summary>
public sealed record SyntheticPage(
    GrayImage Image,
    PageKind Kind,
    FontFace Font,
    double SkewDegrees,
    bool TouchingRows,
    IReadOnlyList<PagePart> Parts,
    IReadOnlyList<GrayImage> LineImages);
