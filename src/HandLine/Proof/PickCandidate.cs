namespace HandLine.Proof;

/// <summary>
/// A run line <see cref="LinePicker"/> may choose: where it is, the machine's text, the line's confidence and each
/// character's (as the run recorded them; empty when the record has none).
/// </summary>
public sealed record PickCandidate(string Source, int Line, string Text, double Confidence, IReadOnlyList<(string Symbol, double Confidence)> Chars);
