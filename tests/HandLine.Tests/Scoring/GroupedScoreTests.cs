using System.Text.Json;
using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

public sealed class GroupedScoreTests
{
    // Four lines in two families and three folders. Edits counted by hand from the Levenshtein (1966)
    // definition (fewest substitutions, deletions and insertions), over NFC code points and over words:
    //   book1/a.png comic  "Paid rent" -> "Paid rant": 9 chars, 1 substitution (e->a);       2 words, 1 substitution
    //   book2/b.png comic  "Tithe"     -> "Tithe"    : 5 chars, 0;                           1 word,  0
    //   book2/c.png humor  "Coal 3s"   -> "Cool"     : 7 chars, 4 (a->o, then delete " 3s"; 3 at least for the
    //                                                   length, and "Cool" is no subsequence);  2 words, 2 (Coal->Cool, delete 3s)
    //   d.png       humor  "Hay"       -> (missing)  : 3 chars, 3 deletions;                 1 word,  1 deletion
    // Totals: 24 chars, 8 errors (CER 1/3); 6 words, 4 errors (WER 2/3).
    // By family: comic 14 chars 1 error, 3 words 1 error; humor 10 chars 7 errors, 3 words 3 errors -> worst humor.
    // By folder: book1 9/1, 2/1; book2 12/4, 3/2; "." 3/3, 1/1 -> worst "." (CER 1).
    private static (string Tsv, string Run) Write(TempFolder dir)
    {
        var tsv = dir.File("truth.tsv");
        Manifest.Write(tsv, ["family"],
        [
            ("book1/a.png", "Paid rent", ["comic"]),
            ("book2/b.png", "Tithe", ["comic"]),
            ("book2/c.png", "Coal 3s", ["humor"]),
            ("d.png", "Hay", ["humor"]),
        ]);
        var run = Directory.CreateDirectory(Path.Combine(dir.Path, "run")).FullName;
        File.WriteAllText(Path.Combine(run, "lines.jsonl"),
            """
            {"source":"book1/a.png","line":0,"text":"Paid rant"}
            {"source":"book2/b.png","line":0,"text":"Tithe"}
            {"source":"book2/c.png","line":0,"text":"Cool"}
            """);
        return (tsv, run);
    }

    [Fact]
    public void Groups_match_hand_counts_and_add_up_to_the_totals()
    {
        using var dir = new TempFolder();
        var (tsv, run) = Write(dir);

        var report = Scorer.ScoreRun(tsv, run, ["family", "folder"]);

        Assert.Equal(24, report.Chars);
        Assert.Equal(8, report.CharCounts.Distance);
        Assert.Equal(6, report.Words);
        Assert.Equal(4, report.WordCounts.Distance);
        Assert.Equal(new[] { "family", "folder" }, report.Breakdowns.Select(b => b.Key));

        var family = report.Breakdowns[0];
        Assert.Equal(
            new[] { ("comic", 2, 14, 1, 3, 1), ("humor", 2, 10, 7, 3, 3) },
            family.Groups.Select(g => (g.Value, g.Lines, g.CharCounts.TruthLength, g.CharCounts.Distance, g.WordCounts.TruthLength, g.WordCounts.Distance)));
        Assert.Equal(1.0 / 14, family.Groups[0].Cer, 12);
        Assert.Equal(0.7, family.Groups[1].Cer, 12);
        Assert.Equal(1.0, family.Groups[1].Wer, 12);
        Assert.Equal(1, family.Groups[1].MissingLines);
        Assert.Equal("humor", family.Worst!.Value);
        Assert.Equal((1.0 / 14 + 0.7) / 2, family.MeanCer, 12);
        Assert.Equal((1.0 / 3 + 1.0) / 2, family.MeanWer, 12);
        Assert.Equal(1.0 / 3, family.Cer, 12); // pooled = ungrouped
        Assert.Equal(report.Cer, family.Cer, 12);

        var folder = report.Breakdowns[1];
        Assert.Equal(
            new[] { (".", 1, 3, 3, 1, 1), ("book1", 1, 9, 1, 2, 1), ("book2", 2, 12, 4, 3, 2) },
            folder.Groups.Select(g => (g.Value, g.Lines, g.CharCounts.TruthLength, g.CharCounts.Distance, g.WordCounts.TruthLength, g.WordCounts.Distance)));
        Assert.Equal(".", folder.Worst!.Value);

        foreach (var b in report.Breakdowns)
        {
            Assert.Equal(report.Lines, b.Groups.Sum(g => g.Lines));
            Assert.Equal(report.Chars, b.Groups.Sum(g => g.CharCounts.TruthLength));
            Assert.Equal(report.CharCounts.Distance, b.Groups.Sum(g => g.CharCounts.Distance));
            Assert.Equal(report.Words, b.Groups.Sum(g => g.WordCounts.TruthLength));
            Assert.Equal(report.WordCounts.Distance, b.Groups.Sum(g => g.WordCounts.Distance));
        }
    }

    [Fact]
    public void Text_and_json_show_each_group_the_pooled_row_the_mean_and_the_worst()
    {
        using var dir = new TempFolder();
        var (tsv, run) = Write(dir);
        var report = Scorer.ScoreRun(tsv, run, ["family"]);

        var text = new StringWriter();
        ScoreReportWriter.WriteText(text, report, maxRows: 0);
        var lines = text.ToString().Split('\n').Select(l => l.TrimEnd()).ToList();
        Assert.Contains("By family (2 group(s))", lines);
        Assert.Contains(lines, l => l.StartsWith("comic ") && l.EndsWith("2        14         1     7.14        3         1    33.33"));
        Assert.Contains(lines, l => l.StartsWith("humor ") && l.EndsWith("2        10         7    70.00        3         3   100.00"));
        Assert.Contains(lines, l => l.StartsWith("Pooled ") && l.EndsWith("4        24         8    33.33        6         4    66.67"));
        Assert.Contains(lines, l => l.StartsWith("Mean of groups") && l.Contains("38.57"));
        Assert.Contains("Worst family: humor (CER 70.00 %, WER 100.00 %)", lines);

        using var json = JsonDocument.Parse(ScoreReportWriter.ToJson(report));
        var by = Assert.Single(json.RootElement.GetProperty("by").EnumerateArray().ToList());
        Assert.Equal("family", by.GetProperty("key").GetString());
        Assert.Equal("humor", by.GetProperty("worst").GetProperty("value").GetString());
        Assert.Equal(0.7, by.GetProperty("worst").GetProperty("cer").GetDouble(), 12);
        Assert.Equal(24, by.GetProperty("pooled").GetProperty("chars").GetInt32());
        Assert.Equal(new[] { 14, 10 }, by.GetProperty("groups").EnumerateArray().Select(g => g.GetProperty("chars").GetInt32()));
        Assert.Equal(new[] { 1, 7 }, by.GetProperty("groups").EnumerateArray().Select(g => g.GetProperty("char_errors").GetInt32()));
        Assert.Equal(new[] { 1, 3 }, by.GetProperty("groups").EnumerateArray().Select(g => g.GetProperty("word_errors").GetInt32()));

        // Without --by the JSON has no "by" key, as before.
        using var plain = JsonDocument.Parse(ScoreReportWriter.ToJson(Scorer.ScoreRun(tsv, run)));
        Assert.False(plain.RootElement.TryGetProperty("by", out _));
    }

    [Fact]
    public void Grouping_by_a_column_the_manifest_lacks_names_the_columns_it_has()
    {
        using var dir = new TempFolder();
        var (tsv, run) = Write(dir);

        var error = Assert.Throws<InputException>(() => Scorer.ScoreRun(tsv, run, ["group"]));
        Assert.Equal("manifest", error.Stage);
        Assert.Contains("no column 'group' to group by: its columns are family", error.Reason);

        Manifest.Write(tsv, [("book1/a.png", "Paid rent")]);
        error = Assert.Throws<InputException>(() => Scorer.ScoreRun(tsv, run, ["family"]));
        Assert.Contains("has no #columns header", error.Reason);
        // Folders need no column.
        Assert.Equal("book1", Assert.Single(Assert.Single(Scorer.ScoreRun(tsv, run, ["folder"]).Breakdowns).Groups).Value);
    }

    [Fact]
    public void A_breakdown_that_does_not_cover_the_report_is_refused()
    {
        var report = Scorer.Score([new ScoreItem("a", "Tithe", "Tithe"), new ScoreItem("b", "Rent", "Rant")]);
        var partial = ScoreBreakdown.Of("family", [(report.PerLine[0], "comic")]);
        Assert.Throws<ArgumentException>(() => new ScoreReport(report.PerLine) { Breakdowns = [partial] });
    }
}
