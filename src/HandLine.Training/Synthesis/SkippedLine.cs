namespace HandLine.Synthesis;

/// <summary>A line that was not drawn: its position in the request, its text and why.</summary>
public sealed record SkippedLine(int Index, string Text, string Reason);
