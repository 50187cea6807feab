using System.Text;
using HandLine.Formats;
using HandLine.Tests.Scoring;

namespace HandLine.Tests.Formats;

public sealed class ManifestTests
{
    [Fact]
    public void Good_file_parses_with_comments_blank_lines_and_CRLF()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv,
            "# Harrowdene estate, account book 3\r\n" +
            "img/p001-01.png\tPaid to J. Marlow for thatching\r\n" +
            "\r\n" +
            "img/p001-02.png\tRen\u0065\u0301 Fairbrook, rent\r\n" +
            "img/p001-03.png\t\n" +
            "img\\p001-04.png\t£3 10s 6d");

        var result = Manifest.Read(tsv);

        Assert.Empty(result.Errors);
        Assert.Equal(
            new[] { "img/p001-01.png", "img/p001-02.png", "img/p001-03.png", "img/p001-04.png" },
            result.Entries.Select(e => e.RelativePath));
        Assert.Equal(new[] { 2, 4, 5, 6 }, result.Entries.Select(e => e.LineNumber));
        Assert.Equal("Paid to J. Marlow for thatching", result.Entries[0].Text); // no trailing CR
        Assert.Equal("Ren\u00E9 Fairbrook, rent", result.Entries[1].Text);   // NFC
        Assert.Equal("", result.Entries[2].Text);                            // empty transcript allowed
        Assert.Equal("£3 10s 6d", result.Entries[3].Text);                   // last line without LF
        Assert.Equal(Path.Combine(dir.Path, "img", "p001-01.png"), result.Entries[0].FullPath);
        Assert.Equal(Path.Combine(dir.Path, "img", "p001-04.png"), result.Entries[3].FullPath);
    }

    [Fact]
    public void A_byte_order_mark_is_ignored()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllBytes(tsv, [.. "\uFEFF"u8, .. "a.png\tTithe\n"u8]);

        var entry = Assert.Single(Manifest.Read(tsv).Entries);
        Assert.Equal("a.png", entry.RelativePath);
    }

    [Theory]
    [InlineData("img/p001-02.png Rent of Low Meadow", "no tab between path and transcript")]
    [InlineData("\tRent of Low Meadow", "empty path")]
    [InlineData("   \tRent of Low Meadow", "empty path")]
    [InlineData("/srv/scans/p001-02.png\tRent", "absolute path")]
    [InlineData("C:\\scans\\p001-02.png\tRent", "absolute path")]
    [InlineData("../p001-02.png\tRent", "outside the manifest's folder")]
    [InlineData("img/../../p001-02.png\tRent", "outside the manifest's folder")]
    [InlineData("img/p001-01.png\tRent", "duplicate path 'img/p001-01.png' (first on line 2)")]
    [InlineData("./img//p001-01.png\tRent", "duplicate path")]
    [InlineData("img/p001-02.png\tRent\t2 10 0", "more than one tab")]
    [InlineData("img/\tRent", "names a folder")]
    public void A_bad_line_is_reported_by_number_and_good_lines_still_load(string badLine, string reason)
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv, $"# account book 3\nimg/p001-01.png\tPaid\n{badLine}\nimg/p001-03.png\tCarriage of coals\n");

        var result = Manifest.Read(tsv);

        var error = Assert.Single(result.Errors);
        Assert.Equal("manifest", error.Stage);
        Assert.Equal(tsv, error.Path);
        Assert.StartsWith("line 3: ", error.Reason);
        Assert.Contains(reason, error.Reason);
        Assert.Contains(tsv, error.Message);
        Assert.Equal(new[] { 2, 4 }, result.Entries.Select(e => e.LineNumber));
    }

    [Fact]
    public void Invalid_UTF8_is_reported_for_its_line_only()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllBytes(tsv,
        [
            .. "a.png\tTithe\n"u8,
            .. "b.png\tCarri"u8, 0xFF, .. "age\n"u8, // 0xFF never occurs in UTF-8
            .. "c.png\t\u00C9tienne's rent\n"u8,
        ]);

        var result = Manifest.Read(tsv);

        var error = Assert.Single(result.Errors);
        Assert.Equal("line 2: not valid UTF-8", error.Reason);
        Assert.Equal(new[] { "a.png", "c.png" }, result.Entries.Select(e => e.RelativePath));
        Assert.Equal("\u00C9tienne's rent", result.Entries[1].Text);
    }

    [Fact]
    public void Every_bad_line_in_one_file_is_reported()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv, "a.png\tx\nno tab\n/abs.png\tx\n\n../up.png\tx\na.png\ty\nb.png\tz\n");

        var result = Manifest.Read(tsv);

        Assert.Equal(
            new[] { "line 2: ", "line 3: ", "line 5: ", "line 6: " },
            result.Errors.Select(e => e.Reason[..8]));
        Assert.Equal(new[] { "a.png", "b.png" }, result.Entries.Select(e => e.RelativePath));
    }

    [Fact]
    public void A_missing_manifest_is_a_read_error()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("absent.tsv");

        var error = Assert.Throws<InputException>(() => Manifest.Read(tsv));
        Assert.Equal("read", error.Stage);
        Assert.Equal(tsv, error.Path);
    }

    [Fact]
    public void Write_then_read_round_trips()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        (string, string)[] written =
        [
            ("img/p001-01.png", "Paid to J. Marlow for thatching"),
            ("img/p001-02.png", ""),
            ("other/p002-01.png", "Ren\u00E9 Fairbrook £3 ½d \U0001D504"),
            ("p003.png", "  spaced  "),
        ];

        Manifest.Write(tsv, written);
        var result = Manifest.Read(tsv);

        Assert.Empty(result.Errors);
        Assert.Equal(written, result.Entries.Select(e => (e.RelativePath, e.Text)));
        Assert.Equal(new[] { "truth.tsv" }, Directory.GetFiles(dir.Path).Select(Path.GetFileName)); // no temp file left
    }

    [Fact]
    public void Write_replaces_an_existing_file()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv, "old.png\tstale\nolder.png\tstaler\n");

        Manifest.Write(tsv, [("new.png", "Tithe")]);

        Assert.Equal("new.png\tTithe\n", File.ReadAllText(tsv, Encoding.UTF8));
    }

    [Theory]
    [InlineData("a.png", "Rent\t2 10 0")]
    [InlineData("a.png", "Rent\n2 10 0")]
    [InlineData("a.png", "Rent\r")]
    [InlineData("../a.png", "Rent")]
    [InlineData("/a.png", "Rent")]
    [InlineData("", "Rent")]
    [InlineData("a\t.png", "Rent")]
    [InlineData("#a.png", "Rent")]
    public void Write_rejects_what_cannot_be_read_back(string path, string text)
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");

        Assert.Throws<ArgumentException>(() => Manifest.Write(tsv, [("ok.png", "Tithe"), (path, text)]));
        Assert.Empty(Directory.GetFiles(dir.Path)); // nothing written, not even a temp file
    }

    [Fact]
    public void Write_rejects_duplicate_paths()
    {
        using var dir = new TempFolder();
        Assert.Throws<ArgumentException>(() =>
            Manifest.Write(dir.File("truth.tsv"), [("img/a.png", "x"), ("img\\a.png", "y")]));
    }
}
