namespace HandLine.Imaging;

/// <summary>
/// One text line found on a page.
/// </summary>
/// <param name="Image">Luminance crop holding the line (full page width).</param>
/// <param name="Top">First row of the crop, in the deskewed page (the input page when no rotation was found).</param>
/// <param name="Bottom">Last row of the crop, inclusive, in the same coordinates.</param>
public sealed record LineRegion(GrayImage Image, int Top, int Bottom);
