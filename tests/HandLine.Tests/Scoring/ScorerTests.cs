using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

public sealed class ScorerTests
{
    [Fact]
    public void Totals_match_hand_counts()
    {
        var report = Scorer.Score(LedgerSample.Items);

        Assert.Equal(3, report.Lines);
        Assert.Equal(LedgerSample.Chars, report.Chars);
        Assert.Equal(LedgerSample.Words, report.Words);
        Assert.Equal((1, 18, 1), (report.Substitutions, report.Deletions, report.Insertions));
        Assert.Equal((3, 3, 0), (report.WordSubstitutions, report.WordDeletions, report.WordInsertions));
        Assert.Equal(1, report.MissingLines);
        Assert.Equal(20.0 / 73, report.Cer, 12);
        Assert.Equal(6.0 / 16, report.Wer, 12);
    }

    [Fact]
    public void Per_line_scores_match_hand_counts()
    {
        var lines = Scorer.Score(LedgerSample.Items).PerLine;

        Assert.Equal(new[] { "p1-l1", "p1-l2", "p1-l3" }, lines.Select(l => l.Id));
        Assert.Equal(1.0 / 31, lines[0].Cer, 12);
        Assert.Equal(1.0 / 6, lines[0].Wer, 12);
        Assert.Equal(2.0 / 25, lines[1].Cer, 12);
        Assert.False(lines[1].Missing);
    }

    [Fact]
    public void A_missing_line_is_all_deletions()
    {
        var missing = Scorer.Score(LedgerSample.Items).PerLine[2];

        Assert.True(missing.Missing);
        Assert.Null(missing.Hypothesis);
        Assert.Equal(new EditCounts(0, 17, 0, 0), missing.CharCounts);
        Assert.Equal(new EditCounts(0, 3, 0, 0), missing.WordCounts);
        Assert.Equal(1.0, missing.Cer);
    }

    [Fact]
    public void An_empty_hypothesis_is_not_missing()
    {
        var line = Scorer.Score([new ScoreItem("x", "Tithe", "")]).PerLine[0];
        Assert.False(line.Missing);
        Assert.Equal(5, line.CharCounts.Deletions);
    }

    [Fact]
    public void Empty_truth_counts_insertions_over_a_floor_of_one()
    {
        // Documented rule: errors / max(1, truth units). Common practice, no source.
        var report = Scorer.Score(
        [
            new ScoreItem("blank", "", ""),
            new ScoreItem("smudge", "", "xyz"),
        ]);

        Assert.Equal(0.0, report.PerLine[0].Cer);
        Assert.Equal(3, report.PerLine[1].CharCounts.Insertions);
        Assert.Equal(3.0, report.PerLine[1].Cer);
        Assert.Equal(1.0, report.PerLine[1].Wer);
        Assert.Equal(0, report.Chars);
        Assert.Equal(3.0, report.Cer);
        Assert.True(double.IsFinite(report.Wer));
    }

    [Fact]
    public void No_items_give_zero_rates()
    {
        var report = Scorer.Score([]);
        Assert.Equal((0, 0.0, 0.0), (report.Lines, report.Cer, report.Wer));
    }

    [Fact]
    public void Repeated_ids_are_rejected()
    {
        Assert.Throws<ArgumentException>(() => Scorer.Score(
        [
            new ScoreItem("p1-l1", "a", "a"),
            new ScoreItem("p1-l1", "b", "b"),
        ]));
    }

    [Fact]
    public void Text_is_compared_after_NFC()
    {
        var line = Scorer.Score([new ScoreItem("n", "Ren\u00E9 Fairbrook", "Rene\u0301 Fairbrook")]).PerLine[0];
        Assert.Equal(0, line.CharCounts.Distance);
        Assert.Equal(0, line.WordCounts.Distance);
    }
}
