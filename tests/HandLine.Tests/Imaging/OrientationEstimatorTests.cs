using HandLine.Formats;
using HandLine.Imaging;

namespace HandLine.Tests.Imaging;

/// <summary>Quarter turns are exact (boxes too), and the ink cue tells lines running across from lines running down.</summary>
public sealed class OrientationEstimatorTests
{
    [Fact]
    public void AQuarterTurnMovesEveryPixelWhereATurnOfTheWholeImageTakesIt()
    {
        // 1 2 3      turned 90° clockwise:  4 1     180°: 6 5 4     270°: 3 6
        // 4 5 6                             5 2           3 2 1           2 5
        //                                   6 3                           1 4
        var image = new GrayImage(3, 2, [1, 2, 3, 4, 5, 6]);
        Assert.Equal("2x3: 4 1 5 2 6 3", Shape(QuarterTurn.Clockwise(image, 90)));
        Assert.Equal("3x2: 6 5 4 3 2 1", Shape(QuarterTurn.Clockwise(image, 180)));
        Assert.Equal("2x3: 3 6 2 5 1 4", Shape(QuarterTurn.Clockwise(image, 270)));
        foreach (var r in QuarterTurn.Rotations)
            Assert.Equal(image.Pixels, QuarterTurn.Upright(QuarterTurn.Clockwise(image, r), r).Pixels);
        Assert.Throws<ArgumentOutOfRangeException>(() => QuarterTurn.Upright(image, 45));
    }

    [Fact]
    public void ABoxIsMappedWhereATurnOfTheWholeImageTakesIt()
    {
        const int w = 7, h = 5;
        var box = new LineBox(1, 2, 4, 2);
        var mask = GrayImage.Filled(w, h, 0f);
        for (var y = box.Y; y < box.Bottom; y++)
            for (var x = box.X; x < box.Right; x++) mask.Pixels[y * w + x] = 1f;
        foreach (var r in QuarterTurn.Rotations)
        {
            var (x0, y0, x1, y1) = ImagingTestSupport.Bounds(QuarterTurn.Clockwise(mask, r), 0.5f)!.Value;
            Assert.Equal(new LineBox(x0, y0, x1 - x0 + 1, y1 - y0 + 1), QuarterTurn.TurnBox(box, w, h, r));
        }
    }

    [Theory]
    [InlineData(0)]
    [InlineData(90)]
    [InlineData(180)]
    [InlineData(270)]
    public void ALineAndAPageAreSeenToRunAcrossOrDownAsTheyWereTurned(int clockwise)
    {
        var line = ImagingTestSupport.Render(ImagingTestSupport.EstateLine, rotateDegrees: -clockwise);
        var page = ImagingTestSupport.Stack(
            [.. new[] { "Paid the carrier for coals 4s 6d", "Sold to Mr Orrin two cwt hay", "Wages to Lady Day" }
                .Select(t => ImagingTestSupport.Render(t))], gap: 20);
        foreach (var image in new[] { line, QuarterTurn.Clockwise(page, clockwise) })
        {
            var guess = OrientationEstimator.Guess(image)!;
            // The recogniser leaves the other axis out from a margin of 0.2 on (OrientationOptions.SureAxisMargin).
            if (clockwise % 180 == 0) Assert.True(guess.AxisMargin > 0.5, guess.ToString());
            else Assert.True(guess.AxisMargin < -0.5, guess.ToString());
        }
    }

    [Fact]
    public void ABlankImageGivesNoGuess()
    {
        Assert.Null(OrientationEstimator.Guess(GrayImage.Filled(300, 60, 0.95f)));
    }

    private static string Shape(GrayImage image) => $"{image.Width}x{image.Height}: {string.Join(' ', image.Pixels)}";
}
