using HandLine.Proof;
using HandLine.Scoring;

namespace HandLine.Tests.Proof;

public sealed class ProofReportHtmlTests
{
    internal const string HostileTruth = "<script>window.hacked=1</script> & \"quoted\" £3";
    internal const string HostileMachine = "<img src=x onerror=\"window.hacked=2\"> & quoted £8";
    internal const string HostileId = "vol\"><svg onload=alert(1)>/001.png";

    internal static (ScoreReport Report, ProofAnalysis Analysis) HostileReport(double? maxCer = 0.05)
    {
        var items = new List<ScoreItem> { new(HostileId, HostileTruth, HostileMachine) };
        for (var i = 0; i < 30; i++)
            items.Add(new ScoreItem($"vol-a/{i:000}.png", "Pd Thos. Marrable for thatching 7/6", i % 3 == 0 ? "Pd Thos. Marable for thatching 7/8" : "Pd Thos. Marrable for thatching 7/6"));
        var scored = Scorer.Score(items);
        var folders = scored.PerLine.Select(l => ScoreBreakdown.FolderOf(l.Id)).ToArray();
        var report = new ScoreReport(scored.PerLine)
        {
            Breakdowns = [ScoreBreakdown.Of("folder", scored.PerLine.Select((l, i) => (l, folders[i])))],
            GroupValues = new Dictionary<string, IReadOnlyList<string>> { ["folder"] = folders },
        };
        return (report, ProofAnalysis.Of(report, new ProofOptions { MaxCer = maxCer, Resamples = 500 }, report.GroupValues));
    }

    [Fact]
    public void HostileTextAndFileNamesAreEscapedNeverMarkup()
    {
        var (report, analysis) = HostileReport();
        var html = ProofReportHtml.Write(report, analysis, "truth<b>.tsv", "run&<i>", new Dictionary<string, ReportLineSource>());
        Assert.DoesNotContain("<script>", html);
        Assert.DoesNotContain("<img src=x", html);
        Assert.DoesNotContain("<svg onload", html);
        Assert.DoesNotContain("truth<b>", html);
        Assert.Contains("vol&quot;&gt;&lt;svg onload=alert(1)&gt;/001.png", html);
        Assert.Contains("&lt;", html);
        Assert.Contains("truth&lt;b&gt;.tsv", html);
        Assert.Contains("run&amp;&lt;i&gt;", html);
        // Only the page's own SVG elements open an <svg tag.
        Assert.Equal(2, html.Split("<svg").Length - 1);
    }

    [Fact]
    public void ThePageIsSelfContained()
    {
        var (report, analysis) = HostileReport();
        var html = ProofReportHtml.Write(report, analysis, "t.tsv", "r", new Dictionary<string, ReportLineSource>());
        Assert.DoesNotContain("http://", html.Replace("http://www.w3.org/2000/svg", ""));
        Assert.DoesNotContain("https://", html);
        Assert.DoesNotContain("<script", html);
        Assert.DoesNotContain("<link", html);
        Assert.Contains("default-src 'none'", html);
    }

    [Fact]
    public void DifferencesAreMarkedByElementsNotOnlyColour()
    {
        var (truth, machine) = DifferenceMarkup.Mark("7/6", "7/8");
        Assert.Equal("7/<span class=\"sub\" title=\"read as 8\">6</span>", truth);
        Assert.Equal("7/<span class=\"sub\" title=\"should be 6\">8</span>", machine);
        (truth, machine) = DifferenceMarkup.Mark("barley", "barly");
        Assert.Equal("barl<del title=\"missed by the machine\">e</del>y", truth);
        Assert.Equal("barl<span class=\"gap\" title=\"1 character(s) missing here\">‸</span>y", machine);
        (truth, machine) = DifferenceMarkup.Mark("hay <5>", "hay  <5>");
        Assert.Equal("hay &lt;5&gt;", truth);
        // Either space could be the extra one; the tie-break (hit before insertion, traced from the end) picks the first.
        Assert.Equal("hay<ins title=\"extra character\">␣</ins> &lt;5&gt;", machine);
    }

    [Fact]
    public void ConfusionsAreCountedFromTheAlignment()
    {
        var report = Scorer.Score([new ScoreItem("a", "7/6 7/6", "7/8 7/8"), new ScoreItem("b", "barley", "barly"), new ScoreItem("c", "hay", "hay!")]);
        var table = ConfusionTable.Of(report.PerLine);
        Assert.Equal(new Confusion(ConfusionKind.Substitution, "6", "8", 2), table[0]);
        Assert.Contains(new Confusion(ConfusionKind.Deletion, "e", "", 1), table);
        Assert.Contains(new Confusion(ConfusionKind.Insertion, "", "!", 1), table);
        Assert.Equal(report.CharCounts.Distance, table.Sum(c => c.Count));
    }
}
