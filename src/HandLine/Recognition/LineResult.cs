using HandLine.Decoding;

namespace HandLine.Recognition;

/// <summary>One recognised line of one source, as written to the reports.</summary>
public sealed record LineResult(
    string Source,
    int Line,
    string Text,
    double Confidence,
    bool Flagged,
    IReadOnlyList<CharConfidence> Chars,
    double DeskewDegrees,
    double SlantDegrees)
{
    /// <summary>The beam's best texts with scores, best first; empty for greedy decoding.</summary>
    public IReadOnlyList<Alternative> Alternatives { get; init; } = [];

    /// <summary>How far the image's text was turned clockwise from upright (0, 90, 180 or 270); it was read turned back.</summary>
    public int RotationDegrees { get; init; }
}
