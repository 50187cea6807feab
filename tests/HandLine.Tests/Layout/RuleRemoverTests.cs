using HandLine.Layout;

namespace HandLine.Tests.Layout;

public sealed class RuleRemoverTests
{
    [Fact]
    public void RulesAreTakenOffButTheInkOfLettersCrossingThemIsKept()
    {
        // A drawn case: a horizontal rule two pixels thick across a 400 x 200 page, a vertical rule down it, and
        // "letters": upright strokes 3 px wide and 30 px tall (shorter than a rule) crossing the horizontal rule, and one crossing the
        // vertical rule sideways.
        const int w = 400, h = 200;
        var dark = new bool[w * h];
        void Set(int x, int y) => dark[y * w + x] = true;
        for (var x = 10; x < 390; x++) { Set(x, 100); Set(x, 101); }
        for (var y = 10; y < 190; y++) { Set(300, y); Set(301, y); }
        var strokes = new[] { 40, 80, 120, 160, 200 };
        foreach (var sx in strokes)
            for (var y = 85; y < 115; y++)
                for (var x = sx; x < sx + 3; x++) Set(x, y);
        for (var x = 280; x < 320; x++)
            for (var y = 150; y < 153; y++) Set(x, y);
        var ink = dark.Select(d => d ? (byte)1 : (byte)0).ToArray();

        // Ink of the letters where they cross a rule, counted before and after.
        var crossing = strokes.SelectMany(sx => Enumerable.Range(sx, 3).SelectMany(x => new[] { 100 * w + x, 101 * w + x }))
            .Concat(Enumerable.Range(150, 3).SelectMany(y => new[] { y * w + 300, y * w + 301 })).ToArray();
        var before = crossing.Count(i => ink[i] != 0);

        var result = RuleRemover.Remove(dark, ink, w, h, new PageOptions { RuleMinLengthFraction = 0.2 });
        var after = crossing.Count(i => result.Ink[i] != 0);
        Assert.Equal(before, after);

        // Everything else on the rules went.
        var ruleOnly = Enumerable.Range(10, 380).SelectMany(x => new[] { 100 * w + x, 101 * w + x })
            .Concat(Enumerable.Range(10, 180).SelectMany(y => new[] { y * w + 300, y * w + 301 }))
            .Where(i => !crossing.Contains(i)).ToArray();
        Assert.All(ruleOnly, i => Assert.Equal(0, result.Ink[i]));
        // And the letters away from the rules are untouched.
        Assert.All(strokes, sx => Assert.Equal(1, result.Ink[88 * w + sx + 1]));
        Assert.Single(result.Horizontal);
        Assert.Equal(100.5, result.Horizontal[0].Position, 3);
        Assert.Single(result.Vertical);
    }
}
