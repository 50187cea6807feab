using HandLine.Imaging;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace HandLine.Proof;

/// <summary>
/// Cuts the text lines of a page again, for the commands that show or keep a run's lines (proof samples, the review
/// page, corrected lines): a run folder records each line's index within its image, not where it lies.
/// </summary>
internal static class LineCrops
{
    private static readonly LineFinder Finder = new();

    /// <summary>
    /// Finds the lines of a page again with the default imaging settings and returns each as PNG, or null when the
    /// page now splits into a different number of lines than the run read (the run may have used other settings),
    /// so a wrong line is never handed out as the right one. <paramref name="rotation"/> is the run's
    /// <c>rotation_deg</c> for the image: the page is turned upright first, as the run read it.
    /// </summary>
    public static byte[][]? TryCutAll(string image, int expectedLines, int rotation = 0)
    {
        if (!QuarterTurn.IsRotation(rotation))
            return null;
        try
        {
            var regions = Finder.Split(QuarterTurn.Upright(ImageLoader.Load(image, new InputLimits()), rotation));
            if (regions.Count != expectedLines)
                return null;
            return regions.Select(r => Png(r.Image)).ToArray();
        }
        catch (InputException)
        {
            return null;
        }
    }

    /// <summary>Line <paramref name="index"/> of the page as PNG, or null as for <see cref="TryCutAll"/>.</summary>
    public static byte[]? TryCut(string image, int index, int expectedLines) =>
        index < expectedLines && TryCutAll(image, expectedLines) is { } all ? all[index] : null;

    private static byte[] Png(GrayImage region)
    {
        using var png = new Image<L8>(region.Width, region.Height);
        for (var y = 0; y < region.Height; y++)
            for (var x = 0; x < region.Width; x++)
                png[x, y] = new L8((byte)Math.Clamp(Math.Round(region[x, y] * 255), 0, 255));
        using var buffer = new MemoryStream();
        png.SaveAsPng(buffer);
        return buffer.ToArray();
    }
}
