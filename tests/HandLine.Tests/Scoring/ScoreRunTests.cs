using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

public sealed class ScoreRunTests
{
    [Fact]
    public void Run_is_scored_against_the_manifest()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        Manifest.Write(tsv, LedgerSample.Items.Select(i => ($"img/{i.Id}.png", i.Truth)));
        var run = Directory.CreateDirectory(Path.Combine(dir.Path, "run")).FullName;
        // p1-l1 split over two recognised lines (out of order); p1-l2 written with '\' and "./";
        // p1-l3 absent; an extra source not in the truth file is ignored.
        File.WriteAllText(Path.Combine(run, "lines.jsonl"),
            """
            {"source":"img/p1-l1.png","line":1,"text":"for thatchng"}
            {"source":"img/p1-l1.png","line":0,"text":"Paid to J. Marlow"}
            {"source":"./img\\p1-l2.png","line":0,"text":"Rent of Lcw Meadows 2 10 0"}
            {"source":"img/stray.png","line":0,"text":"not in the truth file"}
            """);

        var report = Scorer.ScoreRun(tsv, run);

        Assert.Equal(new[] { "img/p1-l1.png", "img/p1-l2.png", "img/p1-l3.png" }, report.PerLine.Select(l => l.Id));
        Assert.Equal(LedgerSample.Chars, report.Chars);
        Assert.Equal(20.0 / 73, report.Cer, 12);
        Assert.Equal(6.0 / 16, report.Wer, 12);
        Assert.Equal(1, report.MissingLines);
        Assert.True(report.PerLine[2].Missing);
    }

    [Fact]
    public void A_manifest_with_errors_stops_scoring_and_lists_them()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv, "a.png\tTithe\nno tab here\n../b.png\tRent\n");
        var run = Directory.CreateDirectory(Path.Combine(dir.Path, "run")).FullName;
        File.WriteAllText(Path.Combine(run, "lines.jsonl"), "{\"source\":\"a.png\",\"line\":0,\"text\":\"Tithe\"}\n");

        var error = Assert.Throws<InputException>(() => Scorer.ScoreRun(tsv, run));

        Assert.Equal("manifest", error.Stage);
        Assert.Contains("line 2: no tab", error.Reason);
        Assert.Contains("line 3: ", error.Reason);
    }

    [Fact]
    public void Two_run_sources_for_one_image_are_an_error()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        Manifest.Write(tsv, [("img/a.png", "Tithe")]);
        var run = Directory.CreateDirectory(Path.Combine(dir.Path, "run")).FullName;
        File.WriteAllText(Path.Combine(run, "lines.jsonl"),
            """
            {"source":"img/a.png","line":0,"text":"Tithe"}
            {"source":"img\\a.png","line":0,"text":"Tythe"}
            """);

        var error = Assert.Throws<InputException>(() => Scorer.ScoreRun(tsv, run));
        Assert.Equal("run", error.Stage);
    }
}
