using HandLine.Layout;

namespace HandLine.Tests.Layout;

public sealed class LineSegmenterTests
{
    // Drawn "writing" on a binary page: each letter a body 8 px wide and 12 px tall standing on the baseline, every
    // third with an ascender 2 px wide rising 12 px above the body, every fourth with a descender 10 px below.
    private sealed class Sheet(int w, int h)
    {
        public int W { get; } = w;
        public int H { get; } = h;
        public byte[] Ink { get; } = new byte[w * h];

        public void Fill(int x0, int y0, int x1, int y1)
        {
            for (var y = Math.Max(0, y0); y <= Math.Min(H - 1, y1); y++)
                for (var x = Math.Max(0, x0); x <= Math.Min(W - 1, x1); x++) Ink[y * W + x] = 1;
        }

        /// <summary>
        /// A run of letters from x0 to x1 on the baseline: bodies 8 px wide and 12 px tall, every other letter with an
        /// ascender <paramref name="rise"/> px above the body or a descender <paramref name="drop"/> px below the
        /// baseline, strokes <paramref name="stroke"/> px wide. Returns the run's ink box (inclusive).
        /// </summary>
        public (int X0, int Y0, int X1, int Y1) Word(int x0, int x1, int baseline, int rise = 12, int drop = 10, int stroke = 2)
        {
            int top = baseline - 12, bottom = baseline - 1;
            var n = 0;
            for (var x = x0; x + 8 <= x1; x += 12, n++)
            {
                Fill(x, baseline - 12, x + 7, baseline - 1);
                if (rise > 0 && n % 2 == 0) { Fill(x, baseline - 12 - rise, x + stroke - 1, baseline - 13); top = baseline - 12 - rise; }
                if (drop > 0 && n % 2 == 1) { Fill(x + 8 - stroke, baseline, x + 7, baseline + drop - 1); bottom = Math.Max(bottom, baseline + drop - 1); }
            }
            return (x0, top, x1, bottom);
        }

        public List<Segment> Segment(double textHeight) =>
            LineSegmenter.Segment(Components.Label(Ink, W, H), W, H, [], textHeight, new PageOptions()).Lines;
    }

    private static double IoU((int X0, int Y0, int X1, int Y1) a, Segment s)
    {
        var ix = Math.Max(0, Math.Min(a.X1, s.MaxX) - Math.Max(a.X0, s.MinX) + 1);
        var iy = Math.Max(0, Math.Min(a.Y1, s.MaxY) - Math.Max(a.Y0, s.MinY) + 1);
        double i = ix * iy;
        return i / ((a.X1 - a.X0 + 1) * (a.Y1 - a.Y0 + 1) + (s.MaxX - s.MinX + 1) * (s.MaxY - s.MinY + 1) - i);
    }

    private static void AssertOneLineEach(IReadOnlyList<(int X0, int Y0, int X1, int Y1)> rows, List<Segment> lines)
    {
        Assert.True(rows.Count == lines.Count, $"{lines.Count} lines found for {rows.Count} rows: "
            + string.Join("; ", lines.Select(s => $"{s.MinX},{s.MinY}-{s.MaxX},{s.MaxY}")));
        foreach (var row in rows)
            Assert.True(lines.Any(s => IoU(row, s) >= 0.5), $"no line matches the row at y {row.Y0}..{row.Y1}");
    }

    [Fact]
    public void RowsAPitchApartWhoseDescendersMeetTheNextRowsAscendersAreOneLineEach()
    {
        // Rows 26 px apart, letters 30 px from ascender to descender: no clear row between neighbouring rows, and
        // here and there a descender joined to the ascender below (one component across two rows). One short row of
        // a few letters stands between long ones: its profile peak is low and the neighbours' strokes fill its
        // valleys, so only the pitch tells that it is a line of its own.
        var sheet = new Sheet(640, 300);
        var rows = new List<(int, int, int, int)>();
        for (var k = 0; k < 9; k++)
            rows.Add(sheet.Word(20, k == 4 ? 90 : 620, 40 + 26 * k, rise: 10, drop: 8, stroke: 3));
        // Bridges from a descender to the next letter's ascender in the row below.
        for (var k = 0; k + 1 < 9; k++)
            if (k != 3 && k != 4)
                for (var x = 20 + 12 * 9; x < 560; x += 12 * 8) sheet.Fill(x + 5, 40 + 26 * k + 5, x + 14, 40 + 26 * k + 6);
        var th = LineSegmenter.TextHeight(Components.Label(sheet.Ink, sheet.W, sheet.H));
        var lines = sheet.Segment(th);
        AssertOneLineEach(rows, lines);
    }

    [Fact]
    public void AShortAmountAboveALongOneInTheMoneyColumnIsALineOfItsOwn()
    {
        // A ledger: descriptions left of a rule at x 500, amounts right of it, rows 26 px apart. In the money column
        // every third row holds a short amount ("9/-": three letters at the right) above a long one; the short
        // amount's profile peak is only a shoulder of its neighbours', and one of its descenders touches the
        // ascender below it, so the profile gives the two rows one band and the component crosses the cut.
        var sheet = new Sheet(700, 400);
        var rows = new List<(int, int, int, int)>();
        for (var k = 0; k < 13; k++)
        {
            var baseline = 40 + 26 * k;
            rows.Add(sheet.Word(20, k % 2 == 0 ? 470 : 380, baseline, rise: 10, drop: 8, stroke: 3));
            rows.Add(sheet.Word(k % 3 == 1 ? 650 : 520, 690, baseline, rise: 10, drop: 8, stroke: 3));
        }
        var c = Components.Label(sheet.Ink, sheet.W, sheet.H);
        var (_, lines) = LineSegmenter.Segment(c, sheet.W, sheet.H, [500.0], LineSegmenter.TextHeight(c), new PageOptions());
        AssertOneLineEach(rows, lines);
    }

    [Fact]
    public void AWellSpacedPageKeepsEachLineWholeWithItsAscendersAndDescenders()
    {
        // The pitch rules must not split a line: rows 45 px apart (well spaced), each with tall ascenders and deep
        // descenders, lines of different lengths.
        var sheet = new Sheet(640, 420);
        var rows = new List<(int, int, int, int)>();
        for (var k = 0; k < 8; k++)
            rows.Add(sheet.Word(20, k % 2 == 0 ? 620 : 200 + 40 * k, 60 + 45 * k));
        var lines = sheet.Segment(24);
        AssertOneLineEach(rows, lines);
    }
}
