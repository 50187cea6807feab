using HandLine.Imaging;
using HandLine.Proof;
using HandLine.Tests.Imaging;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace HandLine.Tests.Proof;

/// <summary>A page's lines are cut again as the run read them, turned upright when the run found it turned.</summary>
public sealed class LineCropsTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-crops-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void APageReadTurnedIsCutUprightIntoTheLinesTheRunRead()
    {
        var page = ImagingTestSupport.Stack(
            [.. new[] { "Paid the carrier for coals 4s 6d", "Wages to Lady Day, 4 men" }.Select(t => ImagingTestSupport.Render(t))], gap: 24);
        var path = Path.Combine(_dir, "page.png");
        Save(QuarterTurn.Clockwise(page, 90), path);

        var crops = LineCrops.TryCutAll(path, 2, rotation: 90);

        Assert.NotNull(crops);
        Assert.All(crops, c =>
        {
            var info = Image.Identify(c);
            Assert.True(info.Width > 4 * info.Height, $"{info.Width}x{info.Height}: not an upright line");
        });
        Assert.Null(LineCrops.TryCutAll(path, 2, rotation: 45));
    }

    private static void Save(GrayImage image, string path)
    {
        using var png = new Image<L8>(image.Width, image.Height);
        for (var y = 0; y < image.Height; y++)
            for (var x = 0; x < image.Width; x++)
                png[x, y] = new L8((byte)Math.Clamp(Math.Round(image[x, y] * 255), 0, 255));
        png.SaveAsPng(path);
    }
}
