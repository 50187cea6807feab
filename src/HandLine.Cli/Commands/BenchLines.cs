using System.Globalization;
using HandLine.Imaging;
using HandLine.Synthesis;

namespace HandLine.Cli.Commands;

/// <summary>
/// Line images for `handline bench`: windows of seeded random widths (40 % to 100 % of the source line) cut from
/// the demo lines, so the widths spread like a page's lines do, from a short entry to a full line. Without the
/// demo folder (an installed tool), a drawn row of loops stands in.
/// </summary>
internal static class BenchLines
{
    public static (IReadOnlyList<byte[]> Images, string Note) Make(int count, int seed)
    {
        var sources = DemoLines();
        var note = sources.Count > 0 ? $"windows of {sources.Count} demo lines" : "windows of a drawn line";
        if (sources.Count == 0) sources = [Drawn()];
        var rng = new Random(seed);
        var images = new List<byte[]>(count);
        for (var i = 0; i < count; i++)
        {
            var line = sources[i % sources.Count];
            var width = Math.Max(line.Height, (int)(line.Width * (0.4 + 0.6 * rng.NextDouble())));
            var x0 = rng.Next(line.Width - width + 1);
            var pixels = new float[width * line.Height];
            for (var y = 0; y < line.Height; y++)
                Array.Copy(line.Pixels, y * line.Width + x0, pixels, y * width, width);
            images.Add(LineSynthesiser.EncodePng(new GrayImage(width, line.Height, pixels)));
        }
        return (images, note);
    }

    /// <summary>Writes the images as line-NNNNNN.png into a folder, for a real transcription run.</summary>
    public static void Write(IReadOnlyList<byte[]> images, string folder)
    {
        Directory.CreateDirectory(folder);
        for (var i = 0; i < images.Count; i++)
            File.WriteAllBytes(Path.Combine(folder, string.Create(CultureInfo.InvariantCulture, $"line-{i:D6}.png")), images[i]);
    }

    private static List<GrayImage> DemoLines()
    {
        foreach (var start in new[] { Directory.GetCurrentDirectory(), AppContext.BaseDirectory })
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                var folder = Path.Combine(dir.FullName, "fixtures", "demo");
                if (File.Exists(Path.Combine(folder, "lines.tsv")))
                    return Directory.GetFiles(folder, "*.png").Order(StringComparer.Ordinal)
                        .Select(p => ImageLoader.Load(p, InputLimits.Default)).ToList();
            }
        return [];
    }

    /// <summary>A row of joined loops about fourteen line-heights long, like a line of small letters.</summary>
    private static GrayImage Drawn()
    {
        const int w = 1100, h = 80;
        var p = new float[w * h];
        Array.Fill(p, 1f);
        for (var x = 10; x < w - 10; x++)
        {
            var t = (x - 10) / 14.0;
            var yc = 46 - 14 * Math.Sin(t * Math.PI) * (1 + 0.3 * Math.Sin(t / 2.3));
            for (var y = (int)yc - 2; y <= (int)yc + 2; y++)
                if (y >= 0 && y < h) p[y * w + x] = 0.1f;
        }
        return new GrayImage(w, h, p);
    }
}
