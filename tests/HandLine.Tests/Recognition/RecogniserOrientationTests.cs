using HandLine.Imaging;
using HandLine.Model;
using HandLine.Recognition;
using HandLine.Tests.Imaging;
using HandLine.Tests.Layout;

namespace HandLine.Tests.Recognition;

/// <summary>
/// Lines and pages turned by quarter turns read as the upright ones do, with their rotation reported (and a page's
/// boxes on the image as it was given), through the bundled model; a blank image still gives only the error it gives
/// read upright.
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
    public void ARuledPageTurnedAnyQuarterReadsAsTheUprightPageWithItsBoxesOnTheImageAsGiven()
    {
        var sheet = TurnedPages.RuledSheet(["Paid the carrier 4s 6d", "Wages to Lady Day", "Sold 2 cwt. hay to Mr Orrin"]);
        var upright = Read(sheet, new OrientationOptions { Fixed = 0 });
        Assert.Equal(3, upright.Count);
        Assert.All(upright, r => Assert.Equal("page", r.Layout));
        // The two sideways turns: upside down pages were read before the page cue (QuarterTurnTests map boxes all four
        // ways); each page reading takes a while.
        foreach (var clockwise in new[] { 90, 270 })
        {
            var read = new Recogniser(_model.Model).Read(TurnedPages.TurnedPng(sheet, clockwise), "page.png", "page.png");
            Assert.Equal(upright.Select(r => (r.Text, clockwise)), read.Select(r => (r.Text, r.RotationDegrees)));
            // Each box lies where the upright line's box lies once ImageSharp has turned the sheet: turn a mask of
            // the upright box the same way and take its bounds.
            for (var i = 0; i < read.Count; i++)
            {
                var mask = GrayImage.Filled(sheet.Width, sheet.Height, 0f);
                var b = upright[i].Box!;
                for (var y = b[1]; y < b[1] + b[3]; y++)
                    for (var x = b[0]; x < b[0] + b[2]; x++) mask.Pixels[y * sheet.Width + x] = 1f;
                var (x0, y0, x1, y1) = ImagingTestSupport.Bounds(TurnedPages.TurnedImage(mask, clockwise), 0.5f)!.Value;
                Assert.Equal([x0, y0, x1 - x0 + 1, y1 - y0 + 1], read[i].Box!);
            }
        }
    }

    [Fact]
    public void ABlankPageGivesTheErrorItGivesReadUpright()
    {
        var blank = GrayImage.Filled(700, 900, 0.96f);
        var expected = Assert.Throws<InputException>(() => Read(blank, new OrientationOptions { Fixed = 0 }));
        var e = Assert.Throws<InputException>(() => Read(blank, OrientationOptions.Auto));
        Assert.Equal((expected.Stage, expected.Reason), (e.Stage, e.Reason));
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
