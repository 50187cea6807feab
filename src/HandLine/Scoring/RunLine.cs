namespace HandLine.Scoring;

/// <summary>
/// One record of a run's <c>lines.jsonl</c>: the source image as the run named it, the line's 0-based index
/// within it, the recognised text and the line's confidence (null when the record has none).
/// </summary>
public sealed record RunLine(string Source, int Line, string Text, double? Confidence);
