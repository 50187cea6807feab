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

    /// <summary>How the image was taken: "line" (a line image or a strip of lines) or "page" (a whole page).</summary>
    public string? Layout { get; init; }

    /// <summary>Page lines: the line's box [x, y, w, h] in the page's pixels.</summary>
    public int[]? Box { get; init; }

    /// <summary>Page lines: the column the line stands in (0 = left of the first column divider).</summary>
    public int? Column { get; init; }

    /// <summary>Page lines: the entry (ruled row) the line belongs to, counted from 0 down the page.</summary>
    public int? Entry { get; init; }

    /// <summary>
    /// Null for a machine reading. Set on a line an editor has checked, carried into a new run (<c>adapt</c>): then
    /// <see cref="Text"/> is the editor's and this the machine's, as <c>correct</c> left them.
    /// </summary>
    public string? MachineText { get; init; }

    /// <summary>With <see cref="MachineText"/>: whether the editor marked the line illegible; null otherwise.</summary>
    public bool? Illegible { get; init; }
}
