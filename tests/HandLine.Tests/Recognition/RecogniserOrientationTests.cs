using HandLine.Imaging;
using HandLine.Model;
using HandLine.Recognition;
using HandLine.Tests.Imaging;

namespace HandLine.Tests.Recognition;

/// <summary>
/// Lines and pages turned by quarter turns read as the upright ones do, with their rotation reported, through the
/// bundled model; a blank image still gives only the "no ink" error.
/// </summary>
public sealed class RecogniserOrientationTests : IClassFixture<RecogniserOrientationTests.BundledModel>
{
    private readonly BundledModel _model;

    public RecogniserOrientationTests(BundledModel model) => _model = model;

    /// <summary>The bundled default model, loaded once for the class.</summary>
    public sealed class BundledModel : IDisposable
    {
        public LineModel Model { get; } = ModelFile.Load(Path.Combine(TestPaths.RepoRoot, "models", "default.hlm"));

        public void Dispose() => Model.Dispose();
    }

    // Invented estate lines, rendered clean in the committed test font (fixtures/fonts, OFL).
    public static TheoryData<string> Lines => new()
    {
        ImagingTestSupport.EstateLine,
        "Sold 2 cwt. hay to Mr Orrin",
    };

    [Theory]
    [MemberData(nameof(Lines))]
    public void ALineTurnedAnyQuarterReadsAsTheUprightOneWithItsRotation(string text)
    {
        var upright = Read(ImagingTestSupport.Render(text), new OrientationOptions { Fixed = 0 }).Single();
        foreach (var clockwise in QuarterTurn.Rotations)
        {
            // Turned by the renderer, not by QuarterTurn, so the test does not just undo the code's own turn.
            var read = Read(ImagingTestSupport.Render(text, rotateDegrees: -clockwise), OrientationOptions.Auto).Single();
            Assert.Equal((upright.Text, clockwise), (read.Text, read.RotationDegrees));
        }
    }

    [Fact]
    public void APageTurnedSidewaysReadsLineByLineAsTheUprightPage()
    {
        var page = ImagingTestSupport.Stack(
            [.. new[] { "Paid the carrier 4s 6d", "Wages to Lady Day" }.Select(t => ImagingTestSupport.Render(t, fontSize: 28))], gap: 18);
        var upright = Read(page, new OrientationOptions { Fixed = 0 });
        Assert.Equal(2, upright.Count);
        // One quarter turn is enough here (the line tests cover all four); each page reading takes a while.
        var read = Read(QuarterTurn.Clockwise(page, 270), OrientationOptions.Auto);
        Assert.Equal(upright.Select(r => r.Text), read.Select(r => r.Text));
        Assert.All(read, r => Assert.Equal(270, r.RotationDegrees));
    }

    [Fact]
    public void AForcedRotationIsUsedAsGiven()
    {
        var turned = ImagingTestSupport.Render(ImagingTestSupport.EstateLine, rotateDegrees: -180);
        var forced = Read(turned, new OrientationOptions { Fixed = 180 }).Single();
        var upright = Read(ImagingTestSupport.Render(ImagingTestSupport.EstateLine), new OrientationOptions { Fixed = 0 }).Single();
        Assert.Equal((upright.Text, 180), (forced.Text, forced.RotationDegrees));
        Assert.NotEqual(upright.Text, Read(turned, new OrientationOptions { Fixed = 0 }).Single().Text);
    }

    [Fact]
    public void ABlankOrNearlyBlankImageGivesOnlyTheNoInkError()
    {
        var nearlyBlank = GrayImage.Filled(400, 60, 0.96f).Pixels;
        for (var x = 40; x < 360; x++) nearlyBlank[30 * 400 + x] = 0.9f; // a faint crease, below the ink contrast
        nearlyBlank[10 * 400 + 50] = nearlyBlank[45 * 400 + 300] = 0.1f; // two specks of dust
        foreach (var image in new[] { GrayImage.Filled(400, 60, 0.96f), new GrayImage(400, 60, nearlyBlank) })
        {
            var e = Assert.Throws<InputException>(() => Read(image, OrientationOptions.Auto));
            Assert.Equal(("normalise", "no ink found: the image looks blank"), (e.Stage, e.Reason));
        }
    }

    private IReadOnlyList<LineResult> Read(GrayImage image, OrientationOptions orientation) =>
        new Recogniser(_model.Model, orientation: orientation).Read(Png(image), "line.png", "line.png");

    private static byte[] Png(GrayImage image) => PngEncoder.Encode(image);
}
