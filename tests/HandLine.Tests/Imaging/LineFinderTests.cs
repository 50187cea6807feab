using HandLine.Features;
using HandLine.Imaging;
using static HandLine.Tests.Imaging.ImagingTestSupport;

namespace HandLine.Tests.Imaging;

public sealed class LineFinderTests
{
    private static readonly ImagingOptions Defaults = new();

    // Invented entries from a fictional estate's account book.
    private static readonly string[] Entries =
    [
        EstateLine,
        "Paid Jas. Orrinwell for thatching 0 12 0",
        "Sold 2 ewes at Lammas fair 1 1 0",
    ];

    [Fact]
    public void Page_of_three_lines_splits_into_three_regions_in_order()
    {
        var lines = Entries.Select(t => Render(t, padding: 6)).ToArray();
        const int gap = 14;
        var page = Stack(lines, gap);

        var regions = new LineFinder(Defaults).Split(page);

        Assert.Equal(3, regions.Count);
        int top = 0;
        for (int i = 0; i < 3; i++)
        {
            // The region must hold all of line i's ink and none of its neighbours'.
            var (_, inkTop, _, inkBottom) = Bounds(Invert(lines[i]), 0.5f)!.Value;
            Assert.InRange(regions[i].Top, i == 0 ? 0 : top - gap, top + inkTop);
            Assert.InRange(regions[i].Bottom, top + inkBottom, top + lines[i].Height + gap - 1);
            Assert.Equal(regions[i].Bottom - regions[i].Top + 1, regions[i].Image.Height);
            Assert.InRange(regions[i].Image.Width, page.Width, page.Width + 4); // a little wider if the page was turned
            top += lines[i].Height + gap;
        }
    }

    [Fact]
    public void Regions_normalise_to_the_same_lines()
    {
        var lines = Entries.Select(t => Render(t, padding: 6)).ToArray();
        var regions = new LineFinder(Defaults).Split(Stack(lines, 14));
        for (int i = 0; i < lines.Length; i++)
        {
            int expected = NormaliserFor(new FeatureConfig(), Defaults).Normalise(lines[i]).Ink.Width;
            int actual = NormaliserFor(new FeatureConfig(), Defaults).Normalise(regions[i].Image).Ink.Width;
            // One row more or less of ink height (a tiny page turn, resampling) changes the scale by ~4 %.
            Assert.InRange(actual, expected * 0.95, expected * 1.05);
        }
    }

    [Fact]
    public void Turned_page_is_deskewed_before_splitting()
    {
        var lines = Entries.Select(t => Render(t, padding: 6)).ToArray();
        var page = Stack(lines, 20);
        // Turn the whole page 3° counter-clockwise (undoing −3° turns it that way), paper-white corners.
        var turn = UprightTransform.Rotation(page, -3);
        var (x0, y0, x1, y1) = turn.Bounds(0, 0, page.Width - 1, page.Height - 1);
        var turned = turn.Render(page, Math.Floor(x0), Math.Floor(y0), (int)Math.Ceiling(x1 - x0) + 1, (int)Math.Ceiling(y1 - y0) + 1, 1f);

        var regions = new LineFinder(Defaults).Split(turned);

        Assert.Equal(3, regions.Count);
        Assert.True(regions[0].Bottom < regions[1].Top && regions[1].Bottom < regions[2].Top);
        for (int i = 0; i < 3; i++)
        {
            int expected = NormaliserFor(new FeatureConfig(), Defaults).Normalise(lines[i]).Ink.Width;
            int actual = NormaliserFor(new FeatureConfig(), Defaults).Normalise(regions[i].Image).Ink.Width;
            Assert.InRange(actual, expected * 0.95, expected * 1.05);
        }
    }

    [Fact]
    public void Single_line_gives_exactly_one_region()
    {
        // "ij" dots and a lone line with descenders must not split into fragments.
        var line = Render("jiggling quill pen, Jas. Orrinwell", padding: 10);
        var regions = new LineFinder(Defaults).Split(line);
        Assert.Single(regions);
    }

    [Theory]
    [InlineData("noisy-register-line.png")]
    [InlineData("noisy-ledger-line.png")]
    [InlineData("noisy-digit-line.png")]
    public void Noisy_line_gives_exactly_one_region(string file)
    {
        // Blurred, JPEG-compressed paper noise, show-through, uneven light or ruling (fixtures/imaging/README.md):
        // rows of noise alone used to cross the threshold and come out as extra "lines" of junk text.
        var image = ImageLoader.Load(Path.Combine(RepoRoot(), "fixtures", "imaging", file), InputLimits.Default);
        Assert.Single(new LineFinder(Defaults).Split(image));
    }

    [Theory]
    [InlineData("Amen.")]
    [InlineData("fol. 7")]
    [InlineData("Do.")]
    [InlineData("17")]
    public void Short_line_under_long_ones_is_kept(string shortLine)
    {
        // A closing word or a folio number is a line however little ink it has beside full lines: on clean paper
        // the seed threshold drops to the row threshold (a fixed 15 % of the fullest row would lose all three).
        // A lone narrow mark, "1", is still lost: its rows fall under LineRowFraction of a full line's.
        var lines = new[] { Render(Entries[1], padding: 6), Render(Entries[2], padding: 6), Render(shortLine, padding: 6) };
        var regions = new LineFinder(Defaults).Split(Stack(lines, 14));
        Assert.Equal(3, regions.Count);
    }

    [Fact]
    public void Blank_page_gives_no_regions()
    {
        Assert.Empty(new LineFinder(Defaults).Split(GrayImage.Filled(400, 300, 1f)));
    }
}
