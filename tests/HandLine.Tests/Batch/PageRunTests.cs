using System.Text.Json;
using System.Xml.Linq;
using HandLine.Batch;
using HandLine.Layout;
using HandLine.Recognition;

namespace HandLine.Tests.Batch;

public sealed class PageRunTests
{
    [Fact]
    public void APageIsTakenAsAPageWithBoxesColumnsEntriesAndAnAltoFileAndALineImageAsALine()
    {
        var dir = Path.Combine(Path.GetTempPath(), "handline-pages-" + Guid.NewGuid().ToString("N")[..8]);
        try
        {
            var scans = Path.Combine(dir, "scans");
            Directory.CreateDirectory(scans);
            File.Copy(Path.Combine(TestPaths.Fixtures, "pages", "pages", "page-0001.png"), Path.Combine(scans, "page.png"));
            File.Copy(Path.Combine(BatchTestSupport.Demo, "ledger-01.png"), Path.Combine(scans, "line.png"));
            var outDir = Path.Combine(dir, "out");
            // The batch mechanics do not depend on accuracy: a small untrained model reads fast.
            // Untrained, it cannot tell upright from turned either: the rotation is fixed.
            TranscribeRun.Run([scans], new TranscribeOptions(outDir, BatchTestSupport.SmallModel(dir), Alto: true,
                Orientation: new OrientationOptions { Fixed = 0 }));

            var records = File.ReadAllLines(Path.Combine(outDir, "lines.jsonl")).Select(l => JsonDocument.Parse(l).RootElement).ToArray();
            var page = records.Where(r => r.GetProperty("source").GetString() == "page.png").ToArray();
            var line = records.Where(r => r.GetProperty("source").GetString() == "line.png").ToArray();
            Assert.All(line, r => Assert.Equal("line", r.GetProperty("layout").GetString()));
            Assert.All(line, r => Assert.False(r.TryGetProperty("box", out _)));
            // The fixture's ledger page has 66 lines; segmentation finds 62 to 66 of them (PageAnalyserTests).
            Assert.InRange(page.Length, 60, 70);
            foreach (var r in page)
            {
                Assert.Equal("page", r.GetProperty("layout").GetString());
                var box = r.GetProperty("box").EnumerateArray().Select(e => e.GetInt32()).ToArray();
                Assert.True(box[0] >= 0 && box[1] >= 0 && box[0] + box[2] <= 900 && box[1] + box[3] <= 1100, "box outside the page");
                Assert.InRange(r.GetProperty("column").GetInt32(), 0, 3);
            }
            var entries = page.Select(r => r.GetProperty("entry").GetInt32()).ToArray();
            Assert.Equal(entries.Order(), entries);

            // The page's text: one text line per entry, its parts separated by tabs.
            var text = File.ReadAllText(Path.Combine(outDir, "page.txt"));
            Assert.Equal(entries.Distinct().Count(), text.TrimEnd('\n').Split('\n').Length);
            // ALTO for the page only.
            var alto = XDocument.Load(Path.Combine(outDir, "page.alto.xml"));
            Assert.Equal(page.Length, alto.Descendants(XName.Get("TextLine", AltoWriter.Namespace)).Count());
            Assert.False(File.Exists(Path.Combine(outDir, "line.alto.xml")));

            // Forced to lines, the page goes through the line finder instead.
            var asLines = Path.Combine(dir, "as-lines");
            TranscribeRun.Run([Path.Combine(scans, "page.png")],
                new TranscribeOptions(asLines, BatchTestSupport.SmallModel(dir), Layout: LayoutMode.Line));
            Assert.All(File.ReadAllLines(Path.Combine(asLines, "lines.jsonl")), l => Assert.Contains("\"layout\":\"line\"", l, StringComparison.Ordinal));
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }
}
