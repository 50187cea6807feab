namespace HandLine.Review;

/// <summary>The review page and what it holds: lines shown, lines in the run, lines shown without an image.</summary>
public sealed record ReviewPageContent(string Html, int Lines, int RunLines, int MissingImages);
