using HandLine.Imaging;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

/// <summary>Committed test fonts and small image measurements shared by the synthesis tests.</summary>
internal static class SynthesisFixtures
{
    private static readonly Lazy<FontCatalog> LazyCatalog = new(() => FontCatalog.Load([FontsDir]));

    public static string RepoRoot => TestPaths.RepoRoot;

    public static string FontsDir => Path.Combine(RepoRoot, "fixtures", "fonts");

    /// <summary>ComicNeue-Regular.otf and Humor-Sans.ttf; shared, never disposed (read-only use).</summary>
    public static FontCatalog Catalog => LazyCatalog.Value;

    public static FontFace Font(string name) => Catalog.Fonts.Single(f => f.Name == name);

    public const string Comic = "ComicNeue-Regular.otf";
    public const string Humor = "Humor-Sans.ttf";

    /// <summary>Pixels darker than mid-grey: ink on a clean render.</summary>
    public static int DarkPixels(GrayImage img) => img.Pixels.Count(v => v < 0.5f);

    /// <summary>Number of columns holding at least one dark pixel.</summary>
    public static int InkColumns(GrayImage img)
    {
        var n = 0;
        for (var x = 0; x < img.Width; x++)
            for (var y = 0; y < img.Height; y++)
                if (img[x, y] < 0.5f)
                {
                    n++;
                    break;
                }
        return n;
    }

    public static string NewTempDir()
    {
        var dir = Path.Combine(Path.GetTempPath(), "handline-synth-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(dir);
        return dir;
    }
}
