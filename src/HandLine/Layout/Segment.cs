namespace HandLine.Layout;

/// <summary>One line found on the upright page: its ink bounds (inclusive), column, entry, and the band's peak row.</summary>
internal sealed record Segment(int Id, int Column, int Band, double PeakY, int MinX, int MinY, int MaxX, int MaxY)
{
    public int Entry { get; set; }
}
