using HandLine.Proof;

namespace HandLine.Tests.Proof;

public sealed class LinePickerTests
{
    /// <summary>A run of <paramref name="sources"/> pages with <paramref name="lines"/> lines each, confidences drawn from the seed.</summary>
    private static List<PickCandidate> Run(int sources, int lines, int seed)
    {
        var rng = new Random(seed);
        var result = new List<PickCandidate>();
        for (var s = 0; s < sources; s++)
            for (var l = 0; l < lines; l++)
            {
                var text = $"line {s} {l} {(char)('a' + rng.Next(26))}";
                var chars = text.Select(c => (c.ToString(), 0.5 + 0.5 * rng.NextDouble())).ToArray();
                result.Add(new PickCandidate($"page{s:D2}.png", l, text, rng.NextDouble(), chars));
            }
        return result;
    }

    [Fact]
    public void The_same_run_and_seed_give_the_same_pick_of_at_most_N_lines()
    {
        var run = Run(5, 20, 1);
        var first = LinePicker.Pick(run, 17, seed: 3);
        var again = LinePicker.Pick(run, 17, seed: 3);
        Assert.Equal(17, first.Count);
        Assert.Equal(first, again);
        Assert.Equal(17, first.Distinct().Count());
        // More than the run holds: every line once.
        Assert.Equal(run.Count, LinePicker.Pick(run, 1000, seed: 3).Distinct().Count());
    }

    [Fact]
    public void No_source_goes_over_its_share_while_others_have_lines()
    {
        // Page 0 holds by far the least sure lines; it still gets only its share of 12 over 4 pages.
        var run = Run(4, 10, 2).Select(c => c.Source == "page00.png" ? c with { Confidence = 0.01 } : c with { Confidence = 0.9 + c.Confidence / 20 }).ToList();
        var pick = LinePicker.Pick(run, 12, seed: 1);
        Assert.All(pick.GroupBy(c => c.Source), g => Assert.Equal(3, g.Count()));

        // A page with a single line gives what it has, and the others share the rest.
        var uneven = Run(3, 10, 4).Where(c => c.Source != "page02.png" || c.Line == 0).ToList();
        var counts = LinePicker.Pick(uneven, 9, seed: 1).GroupBy(c => c.Source).ToDictionary(g => g.Key, g => g.Count());
        Assert.Equal(1, counts["page02.png"]);
        Assert.Equal(4, counts["page00.png"]);
        Assert.Equal(4, counts["page01.png"]);
    }

    [Fact]
    public void Least_sure_lines_come_first_and_repeats_of_one_problem_give_way()
    {
        PickCandidate Line(int n, string text, double confidence) =>
            new($"p{n}.png", 0, text, confidence, text.Select(c => (c.ToString(), c == 'q' ? 0.2 : 0.99)).ToArray());
        var run = new List<PickCandidate>
        {
            Line(0, "sure line", 0.95),
            Line(1, "aqa", 0.30),
            Line(2, "aqa", 0.29),
            Line(3, "unsure line", 0.35),
        };
        var pick = LinePicker.Pick(run, 2, seed: 1).Select(c => c.Source).ToArray();
        // p2 is the least sure; p1 repeats its text and its doubtful 'q', so the next least sure line beats it.
        Assert.Equal(["p2.png", "p3.png"], pick);
    }

    [Fact]
    public void Lines_an_editor_has_checked_are_not_picked()
    {
        using var run = new HandLine.Tests.Review.ReviewRunFixture();
        var corrections = Path.Combine(run.Root, "c.tsv");
        var first = HandLine.Tests.Review.ReviewRunFixture.Lines[1];
        File.WriteAllText(corrections, HandLine.Review.CorrectionsFile.Write([new(first.Source, 0, "Rent", first.Text, false)]));
        HandLine.Review.RunCorrector.Apply(run.Run, corrections, run.Images);

        var pick = LinePicker.Pick(run.Run, 10, seed: 1);
        Assert.Equal(3, pick.Count);
        Assert.DoesNotContain(pick, c => c.Source == first.Source);
        // The least sure unchecked line first.
        Assert.Equal("ledger/002.png", pick[0].Source);
    }
}
