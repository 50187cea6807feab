using HandLine.Features;
using HandLine.Imaging;
using HandLine.Layout;
using HandLine.Recognition;
using HandLine.Synthesis;
using HandLine.Tests.Imaging;

namespace HandLine.Tests.Layout;

/// <summary>The page cue tells a page whose lines run across from one whose lines run down, ruled or not, full or nearly empty.</summary>
public sealed class PageAxisEstimatorTests
{
    private static readonly Lazy<FontCatalog> Font = new(() =>
        FontCatalog.Load([Path.Combine(TestPaths.Fixtures, "fonts", "ComicNeue-Regular.otf")]));

    private static readonly PageSynthesisOptions Small = new()
    {
        Width = 700, Height = 900, FontSizePx = new Interval(20, 24), Wear = 0.5, Grain = 0.5,
    };

    private static readonly OrientationOptions Settings = OrientationOptions.Auto;

    private static int Axis(GrayImage page) =>
        new PageAnalyser().GuessAxis(page)?.Axis(Settings.SurePageSpread, Settings.SurePageRhythm) ?? 0;

    [Theory]
    [InlineData(PageKind.Ledger, 3)]
    [InlineData(PageKind.Register, 11)]
    public void AFullRuledPageIsSeenToRunAcrossOrDownAsItWasTurned(PageKind kind, int seed)
    {
        var page = PageRenderer.Render(kind, Font.Value.Fonts[0], new PhraseGenerator(seed), seed, Small).Image;
        foreach (var clockwise in QuarterTurn.Rotations)
            Assert.Equal(clockwise % 180 == 0 ? 1 : -1, Axis(TurnedPages.TurnedImage(page, clockwise)));
    }

    [Fact]
    public void ARuledSheetWithAFewLinesIsSeenToRunAcrossOrDownAsItWasTurned()
    {
        // The rules alone run across and would say so; the cue must see the writing through them, both ways.
        var sheet = TurnedPages.RuledSheet(["Paid the carrier 4s 6d", "Wages to Lady Day", "Sold 2 cwt. hay to Mr Orrin"]);
        foreach (var clockwise in QuarterTurn.Rotations)
            Assert.Equal(clockwise % 180 == 0 ? 1 : -1, Axis(TurnedPages.TurnedImage(sheet, clockwise)));
    }

    [Fact]
    public void ABlankPageOrRulesAloneGiveNoCue()
    {
        var analyser = new PageAnalyser();
        Assert.Null(analyser.GuessAxis(GrayImage.Filled(700, 900, 0.95f)));
        Assert.Null(analyser.GuessAxis(TurnedPages.RuledSheet([])));
    }

    [Fact]
    public void OnlyAnImageOfAPagesSizeEitherWayIsJudgedAsAPage()
    {
        // A line image taken as a page (--layout page) keeps the two readings of its own axis: the cue's squares
        // would be smaller than its letters.
        var preparer = new LinePreparer(new FeatureConfig());
        var sheet = TurnedPages.RuledSheet(["Paid the carrier 4s 6d", "Wages to Lady Day"]);
        Assert.NotNull(preparer.GuessPageAxis(sheet));
        Assert.Null(preparer.GuessPageAxis(ImagingTestSupport.Render("Paid the carrier 4s 6d")));
    }

    [Fact]
    public void RhythmFindsARepeatingProfileAndNotASingleBump()
    {
        var stripes = Enumerable.Range(0, 96).Select(i => i % 12 < 5 ? 10.0 : 0.0).ToArray();
        var bump = Enumerable.Range(0, 96).Select(i => i is >= 40 and < 52 ? 10.0 : 0.0).ToArray();
        // A profile repeating exactly every 12 correlates with itself shifted by 12 perfectly (1 up to rounding).
        Assert.InRange(PageAxisEstimator.Rhythm(stripes), 0.99, 1.0001);
        Assert.Equal(0, PageAxisEstimator.Rhythm(bump));
        Assert.Equal(0, PageAxisEstimator.Rhythm(new double[96]));
        // Squared coefficient of variation of a 5-in-12 on/off profile: (1 − p) / p with p = 40/96 on (5 of every 12,
        // 8 periods), 1.4; a flat profile has none.
        Assert.Equal(56.0 / 40.0, PageAxisEstimator.Unevenness(stripes), 9);
        Assert.Equal(0, PageAxisEstimator.Unevenness(Enumerable.Repeat(3.0, 96).ToArray()));
    }
}
