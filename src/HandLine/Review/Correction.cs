namespace HandLine.Review;

/// <summary>
/// One line of a corrections file: which run line (<paramref name="Source"/> as the run names it, 0-based
/// <paramref name="Line"/>), the editor's text, the machine text the editor saw (so corrections made on another
/// run are caught) and whether the editor marked it illegible.
/// </summary>
public sealed record Correction(string Source, int Line, string Text, string Machine, bool Illegible);
