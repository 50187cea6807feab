using System.Security.Cryptography;
using System.Text;
using System.Text.RegularExpressions;
using HandLine.Review;

namespace HandLine.Tests.Review;

public sealed class ReviewPageTests : IDisposable
{
    private readonly ReviewRunFixture _run = new();

    public void Dispose() => _run.Dispose();

    private ReviewPageContent Page(bool all = false) => ReviewPage.Build(_run.Run, new ReviewOptions { ImagesRoot = _run.Images, All = all });

    [Fact]
    public void Hostile_transcripts_and_file_names_never_reach_the_page_as_markup()
    {
        var html = Page().Html;

        Assert.DoesNotContain("window.hacked", Markup(html));
        // In the data block the hostile strings are there, but without a '<' that could end the block.
        var data = Regex.Match(html, "<script type=\"application/json\" id=\"review-data\">(.*?)</script>", RegexOptions.Singleline).Groups[1].Value;
        Assert.Contains("window.hacked", data);
        Assert.DoesNotContain("<", data);
        Assert.DoesNotContain("</textarea>", html);
        Assert.DoesNotContain("<img src=x", html);
        Assert.DoesNotContain("<script>window", html);
        // Exactly the two script blocks the page means to have: the data (not run) and its own code.
        Assert.Equal(2, Regex.Matches(html, "<script").Count);
        Assert.Single(Regex.Matches(html, "</script>\n<script>"));
    }

    /// <summary>The page without the data block: where a hostile string would be markup.</summary>
    private static string Markup(string html) =>
        Regex.Replace(html, "<script type=\"application/json\" id=\"review-data\">.*?</script>", "", RegexOptions.Singleline);

    [Fact]
    public void The_policy_allows_the_pages_own_script_by_its_hash_and_nothing_external()
    {
        var html = Page().Html;
        var script = Regex.Match(html, "<script>(.*?)</script>", RegexOptions.Singleline).Groups[1].Value;
        // CSP hash source: base64 of the SHA-256 of the script element's text (W3C Content Security Policy Level 3, "hash-source").
        var hash = Convert.ToBase64String(SHA256.HashData(Encoding.UTF8.GetBytes(script)));
        var policy = Regex.Match(html, "Content-Security-Policy\" content=\"([^\"]*)\"").Groups[1].Value;

        Assert.Equal($"default-src 'none'; img-src data:; style-src 'unsafe-inline'; script-src 'sha256-{hash}'", policy);
        Assert.DoesNotContain("src=\"http", html);
        Assert.DoesNotContain("href=\"http", html);
        Assert.DoesNotContain("@import", html);
    }

    [Fact]
    public void Flagged_lines_come_lowest_confidence_first_and_all_adds_the_rest()
    {
        var page = Page();
        Assert.Equal(3, page.Lines);
        Assert.Equal(4, page.RunLines);
        Assert.Equal(0, page.MissingImages);
        var data = page.Html[page.Html.IndexOf("review-data", StringComparison.Ordinal)..];
        var order = new[] { "onerror", "ledger/002.png", "register/014.png" }.Select(s => data.IndexOf(s, StringComparison.Ordinal)).ToArray();
        Assert.True(order[0] < order[1] && order[1] < order[2], string.Join(",", order));
        Assert.DoesNotContain("register/015.png", data);

        Assert.Equal(4, Page(all: true).Lines);
    }

    [Fact]
    public void A_missing_images_folder_is_refused_and_a_missing_image_is_counted()
    {
        Assert.Throws<InputException>(() => ReviewPage.Build(_run.Run, new ReviewOptions { ImagesRoot = _run.File_("nowhere") }));
        File.Delete(Path.Combine(_run.Images, "ledger/002.png"));
        Assert.Equal(1, Page().MissingImages);
    }

    [Fact]
    public void Pick_lists_the_lines_worth_correcting_first_flagged_or_not()
    {
        var page = ReviewPage.Build(_run.Run, new ReviewOptions { ImagesRoot = _run.Images, Pick = 2, Seed = 4 });
        Assert.Equal(2, page.Lines);
        Assert.Contains("(the lines worth correcting first)", page.Html);
        // The two least sure lines (0.12 and 0.31); the same seed gives the same page.
        Assert.Contains("ledger/002.png", page.Html);
        Assert.DoesNotContain("register/014.png", page.Html);
        Assert.Equal(page.Html, ReviewPage.Build(_run.Run, new ReviewOptions { ImagesRoot = _run.Images, Pick = 2, Seed = 4 }).Html);
        Assert.Throws<ArgumentException>(() => ReviewPage.Build(_run.Run, new ReviewOptions { ImagesRoot = _run.Images, Pick = 2, All = true }));
    }
}
