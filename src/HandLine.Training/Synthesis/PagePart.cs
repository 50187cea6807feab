namespace HandLine.Synthesis;

/// <summary>
/// One piece of writing on a synthetic page and its truth: <paramref name="Entry"/> is the ruled row it belongs to
/// (counted from 0 among the rows that hold writing), <paramref name="Column"/> the space between vertical rules it
/// stands in (0 = left of the first rule), and the box the axis-aligned bounds of its ink in page pixels.
/// </summary>
public sealed record PagePart(int Entry, int Column, string Text, int X, int Y, int Width, int Height);
