namespace HandLine.Layout;

/// <summary>A page's analysis: its size, the skew found and undone, the column dividers and the lines in reading order.</summary>
/// <param name="ColumnDividers">x of each column divider in the upright page, left to right.</param>
public sealed record PageLayout(int Width, int Height, double DeskewDegrees, IReadOnlyList<double> ColumnDividers, IReadOnlyList<PageLine> Lines);
