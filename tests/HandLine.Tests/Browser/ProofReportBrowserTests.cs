using HandLine.Proof;
using HandLine.Tests.Proof;

namespace HandLine.Tests.Browser;

/// <summary>The proof report opened in headless Chromium (Debian's package, driven by Playwright).</summary>
public sealed class ProofReportBrowserTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-report-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public async Task TheReportLoadsCleanlyShowsTheVerdictAndDrawsItsPlots()
    {
        var (report, analysis) = ProofReportHtmlTests.HostileReport(maxCer: 0.05);
        // A real line image for the hostile line, so the page shows an embedded image too.
        var image = Path.Combine(_dir, "line.png");
        File.WriteAllBytes(image, Convert.FromBase64String(
            "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAAAAAA6fptVAAAACklEQVR4nGNgAAAAAgABSK+kcQAAAABJRU5ErkJggg=="));
        var lines = report.PerLine.ToDictionary(l => l.Id, l => new ReportLineSource(image, l.Cer > 0 ? 0.4 : 0.95));
        var file = Path.Combine(_dir, "report <x>.html");
        File.WriteAllText(file, ProofReportHtml.Write(report, analysis, "truth.tsv", "run", lines));

        await using var browser = await HeadlessChromium.StartAsync();
        await using var loaded = await browser.OpenAsync(file);
        var page = loaded.Page;

        Assert.Empty(loaded.Errors);
        Assert.Empty(loaded.Requests);
        var verdict = await page.Locator("#verdict .verdict-word").InnerTextAsync();
        Assert.Contains(analysis.Verdict!.Value.ToString().ToUpperInvariant(), verdict);
        Assert.Contains("95 % interval", await page.Locator("#verdict").InnerTextAsync());

        foreach (var id in new[] { "#histogram", "#confidence-plot" })
        {
            var box = await page.Locator(id).BoundingBoxAsync();
            Assert.NotNull(box);
            Assert.True(box.Width > 100 && box.Height > 100, $"{id} is {box.Width}×{box.Height}");
        }
        Assert.True(await page.Locator("#histogram rect.bar").CountAsync() > 0);
        Assert.Equal(report.Lines, await page.Locator("#confidence-plot .point").CountAsync());
        var image0 = await page.Locator("img.line-image").First.BoundingBoxAsync();
        Assert.NotNull(image0);
        Assert.True(image0.Width > 0 && image0.Height > 0);

        // Hostile text is shown as text and none of it ran.
        Assert.Contains(ProofReportHtmlTests.HostileId, await page.Locator("#worst .id").First.InnerTextAsync());
        Assert.Contains("<script>", await page.Locator("#worst").InnerTextAsync());
        Assert.Equal("undefined", await page.EvaluateAsync<string>("() => typeof window.hacked"));
        Assert.Equal(0, await page.Locator("#worst script, #worst svg, img[src='x']").CountAsync());
    }
}
