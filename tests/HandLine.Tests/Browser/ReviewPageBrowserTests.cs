using HandLine.Review;
using HandLine.Tests.Review;
using Microsoft.Playwright;

namespace HandLine.Tests.Browser;

/// <summary>The review page opened in headless Chromium (Debian's package, driven by Playwright): an editor's round.</summary>
public sealed class ReviewPageBrowserTests : IDisposable
{
    private readonly ReviewRunFixture _run = new();

    public void Dispose() => _run.Dispose();

    [Fact]
    public async Task An_editor_steps_through_corrects_picks_reloads_and_exports_what_correct_applies()
    {
        var file = _run.File_("review <x>.html");
        File.WriteAllText(file, ReviewPage.Build(_run.Run, new ReviewOptions { ImagesRoot = _run.Images }).Html);

        await using var browser = await HeadlessChromium.StartAsync();
        await using var loaded = await browser.OpenAsync(file);
        var page = loaded.Page;
        Assert.Empty(loaded.Errors);
        Assert.Empty(loaded.Requests);

        // Lowest confidence first: the hostile line, shown as text; nothing of it ran.
        Assert.Equal(3, await page.Locator("article.line").CountAsync());
        Assert.Equal("line-0", await page.Locator("article.current").GetAttributeAsync("id"));
        Assert.Equal(ReviewRunFixture.HostileText, await page.Locator("#line-0 textarea.edit").InputValueAsync());
        Assert.Contains("</textarea><script>", await page.Locator("#line-0 .machine").InnerTextAsync());
        Assert.Contains("onerror", await page.Locator("#line-0 .source").InnerTextAsync());
        Assert.Equal("undefined", await page.EvaluateAsync<string>("() => typeof window.hacked"));
        Assert.Equal(0, await page.Locator("#lines script, #lines img[src='x']").CountAsync());
        // Doubtful characters are marked by more than colour: underlined and outlined.
        Assert.True(await page.Locator("#line-0 mark.doubt").CountAsync() > 0);
        var decoration = await page.Locator("#line-0 mark.doubt").First.EvaluateAsync<string>("m => getComputedStyle(m).textDecorationLine + ' ' + getComputedStyle(m).outlineStyle");
        Assert.Equal("underline solid", decoration);
        Assert.Contains("0 of 3 lines checked", await page.Locator("#progress").InnerTextAsync());
        Assert.True(await page.Locator("#keys kbd").CountAsync() >= 8);
        // The images are set as their cards come near the screen, and show.
        await page.WaitForFunctionAsync("() => { const i = document.querySelector('#line-0 img.line-image'); return i && i.complete && i.naturalWidth > 0; }",
            null, new PageWaitForFunctionOptions { Timeout = 10_000 });

        // Next and previous.
        await page.Keyboard.PressAsync("j");
        Assert.Equal("line-1", await page.Locator("article.current").GetAttributeAsync("id"));
        await page.Keyboard.PressAsync("k");
        Assert.Equal("line-0", await page.Locator("article.current").GetAttributeAsync("id"));

        // Correct the first line in its box; Enter keeps it and goes on.
        await page.Keyboard.PressAsync("e");
        await page.Keyboard.PressAsync("Control+A");
        await page.Keyboard.TypeAsync("Rent & tithe <paid>");
        await page.Keyboard.PressAsync("Enter");
        Assert.Equal("line-1", await page.Locator("article.current").GetAttributeAsync("id"));
        // Alternative 1 of the second line (the beam's best other reading), then the third line is illegible.
        Assert.Equal(2, await page.Locator("#line-1 .alts button").CountAsync());
        await page.Keyboard.PressAsync("1");
        Assert.Equal("line-2", await page.Locator("article.current").GetAttributeAsync("id"));
        Assert.Equal("Paid to Wm Oakes for barley", await page.Locator("#line-1 textarea.edit").InputValueAsync());
        await page.Keyboard.PressAsync("x");
        Assert.Contains("3 of 3 lines checked (2 changed, 1 illegible)", await page.Locator("#progress").InnerTextAsync());

        // A reload (a closed tab) loses nothing.
        await page.ReloadAsync();
        Assert.Contains("3 of 3 lines checked (2 changed, 1 illegible)", await page.Locator("#progress").InnerTextAsync());
        Assert.Equal("Rent & tithe <paid>", await page.Locator("#line-0 textarea.edit").InputValueAsync());
        Assert.Equal("line-2", await page.Locator("article.current").GetAttributeAsync("id"));
        Assert.Contains("illegible", await page.Locator("#line-2 .status").InnerTextAsync());

        // Export: the corrections TSV holds the three decisions with the machine text beside them.
        var download = await page.RunAndWaitForDownloadAsync(() => page.Keyboard.PressAsync("d"));
        var tsv = _run.File_("corrections.tsv");
        await download.SaveAsAsync(tsv);
        Assert.Equal("corrections.tsv", download.SuggestedFilename);
        Assert.Equal(
            [
                "source\tline\ttext\tmachine\tillegible",
                $"{ReviewRunFixture.HostileSource}\t0\tRent & tithe <paid>\t{ReviewRunFixture.HostileText}\tfalse",
                "ledger/002.png\t0\tPaid to Wm Oakes for barley\tPaid to Wm Okes for barley\tfalse",
                "register/014.png\t0\tBaptised Ann daughter of\tBaptised Ann daughter of\ttrue",
            ],
            File.ReadAllLines(tsv));
        Assert.Empty(loaded.Errors);

        // And correct applies it.
        var result = RunCorrector.Apply(_run.Run, tsv, _run.Images);
        Assert.Equal(3, result.LinesChanged);
        Assert.Equal(2, result.ManifestLines);
    }
}
