namespace HandLine.Synthesis;

/// <summary>
/// One Hershey glyph in font units (y grows downwards, 'R' is 0): its left and right bounds, which set the
/// advance, and its pen strokes, each a polyline drawn without lifting the pen.
/// </summary>
public sealed record HersheyGlyph(int Left, int Right, IReadOnlyList<IReadOnlyList<(int X, int Y)>> Strokes)
{
    /// <summary>Advance width in font units.</summary>
    public int Advance => Right - Left;
}
