namespace HandLine.Adaptation;

/// <summary>A corrected run line to train or check on: which line, the editor's text and the line's image bytes.</summary>
public sealed record AdaptationLine(string Source, int Line, string Text, byte[] Image, string NameForErrors);
