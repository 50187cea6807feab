namespace HandLine.Formats;

/// <summary>An axis-aligned box in a page's pixel coordinates: left, top, width, height (whole pixels).</summary>
public readonly record struct LineBox(int X, int Y, int Width, int Height)
{
    public int Right => X + Width;

    public int Bottom => Y + Height;

    public long Area => (long)Math.Max(0, Width) * Math.Max(0, Height);

    /// <summary>Intersection over union: the shared area over the area covered by either box (0 when disjoint).</summary>
    public double IoU(LineBox other)
    {
        long iw = Math.Min(Right, other.Right) - Math.Max(X, other.X);
        long ih = Math.Min(Bottom, other.Bottom) - Math.Max(Y, other.Y);
        if (iw <= 0 || ih <= 0) return 0;
        var inter = iw * ih;
        return (double)inter / (Area + other.Area - inter);
    }

    /// <summary>The box as the reports write it: [x, y, w, h].</summary>
    public int[] ToArray() => [X, Y, Width, Height];
}
