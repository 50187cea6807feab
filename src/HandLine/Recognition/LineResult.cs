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

    /// <summary>
    /// Null for a machine reading. Set on a line an editor has checked, carried into a new run (<c>adapt</c>): then
    /// <see cref="Text"/> is the editor's and this the machine's, as <c>correct</c> left them.
    /// </summary>
    public string? MachineText { get; init; }

    /// <summary>With <see cref="MachineText"/>: whether the editor marked the line illegible; null otherwise.</summary>
    public bool? Illegible { get; init; }
}
