namespace HandLine.Decoding;

/// <summary>One recognised character: its symbol, confidence in [0,1] and the frames that produced it.</summary>
public sealed record CharConfidence(string Symbol, double Confidence, int FirstFrame, int LastFrame);

/// <summary>A decoded line: text, per-character confidences and a line confidence in [0,1].</summary>
public sealed record Hypothesis(string Text, IReadOnlyList<CharConfidence> Chars, double Confidence)
{
    /// <summary>The best texts found, best first (the chosen text is the first); empty for greedy decoding.</summary>
    public IReadOnlyList<Alternative> Alternatives { get; init; } = [];
}
