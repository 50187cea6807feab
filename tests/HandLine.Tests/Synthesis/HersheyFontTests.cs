using HandLine.Model;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class HersheyFontTests
{
    // A hand-written sample in the Hershey layout (5-character number, 3-character pair count including the
    // bounds pair, then pairs of characters offset from 'R', " R" = pen up). Record 1 is the space, record 2
    // a made-up "!"-slot glyph of two strokes, record 3 a one-stroke "\""-slot glyph wrapped onto two lines.
    private const string Sample =
        "    1  1JZ\n" +
        "    2  6MWRFRT RRYQZ\n" +
        "    3  5LXPFT\n" +
        "FVHPK\n";

    [Fact]
    public void Parser_reads_bounds_strokes_and_pen_lifts_of_a_hand_written_sample()
    {
        var font = HersheyFont.Parse(Sample);
        Assert.Equal(3, font.Glyphs.Count);

        // 'J' - 'R' = -8, 'Z' - 'R' = 8.
        var space = font.Glyph(' ')!;
        Assert.Equal((-8, 8), (space.Left, space.Right));
        Assert.Empty(space.Strokes);

        // "MW" bounds -5..5; "RF RT" = (0,-12) (0,2); " R" lifts the pen; "RY QZ" = (0,7) (-1,8).
        var bang = font.Glyph('!')!;
        Assert.Equal((-5, 5), (bang.Left, bang.Right));
        Assert.Equal(10, bang.Advance);
        Assert.Equal(2, bang.Strokes.Count);
        Assert.Equal([(0, -12), (0, 2)], bang.Strokes[0]);
        Assert.Equal([(0, 7), (-1, 8)], bang.Strokes[1]);

        // The wrapped record continues on the next line: "LX" bounds, then "PF TF VH PK".
        var quote = font.Glyph('"')!;
        Assert.Equal((-6, 6), (quote.Left, quote.Right));
        Assert.Equal([(-2, -12), (2, -12), (4, -10), (-2, -7)], Assert.Single(quote.Strokes));

        Assert.Null(font.Glyph('#'));   // beyond the records
        Assert.Null(font.Glyph('\u001F'));
    }

    [Fact]
    public void Malformed_records_are_refused()
    {
        Assert.Throws<FormatException>(() => HersheyFont.Parse(""));
        Assert.Throws<FormatException>(() => HersheyFont.Parse("    1  xJZ\n"));
        Assert.Throws<FormatException>(() => HersheyFont.Parse("    2  6MWRFRT\n"));   // ends before its 6 pairs
    }

    [Fact]
    public void A_jhf_file_in_a_font_folder_is_a_stroke_face_that_reports_what_it_cannot_draw()
    {
        var dir = SynthesisFixtures.NewTempDir();
        try
        {
            File.WriteAllText(Path.Combine(dir, "tiny.jhf"), Sample);
            File.WriteAllText(Path.Combine(dir, "greek.jhf"), Sample);   // a non-ASCII face of the package: skipped in folders
            using var catalog = FontCatalog.Load([dir]);
            var face = Assert.Single(catalog.Fonts);
            Assert.Equal("tiny.jhf", face.Name);
            Assert.True(face.IsStrokeFace);
            Assert.True(face.Covers("! !"));
            Assert.False(face.Covers("a"));
            Assert.Equal(CharacterSet.Default.Symbols.Count - 3, face.MissingDefaultSymbols.Count);   // has space, ! and "

            // Drawn as pen strokes: the "!" makes ink, and a line it cannot draw is left to other faces.
            var img = LineRenderer.Render("!", face, new Degradation());
            Assert.True(SynthesisFixtures.DarkPixels(img) > 20);
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }
}
