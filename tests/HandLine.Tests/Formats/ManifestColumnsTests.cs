using System.Text;
using HandLine.Formats;
using HandLine.Tests.Scoring;

namespace HandLine.Tests.Formats;

public sealed class ManifestColumnsTests
{
    [Fact]
    public void A_columns_header_names_extra_values_that_read_by_name()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv,
            "# parish register, second volume\n" +
            "#columns\tpath\ttext\tfamily\tgroup\n" +
            "img/r-01.png\tBaptised Ann Tillery\tcomic-neue\tscript\n" +
            "\n" +
            "img/r-02.png\tBuried Reuben Hask\u0065\u0301\tcaf\u0065\u0301-hand\t\n");

        var result = Manifest.Read(tsv);

        Assert.Empty(result.Errors);
        Assert.Equal(new[] { "family", "group" }, result.Columns);
        Assert.Equal(new[] { 3, 5 }, result.Entries.Select(e => e.LineNumber));
        Assert.Equal("Baptised Ann Tillery", result.Entries[0].Text);
        Assert.Equal("comic-neue", result.Entries[0].Column("family"));
        Assert.Equal("script", result.Entries[0].Column("group"));
        Assert.Equal("Buried Reuben Hask\u00E9", result.Entries[1].Text);
        Assert.Equal("caf\u00E9-hand", result.Entries[1].Column("family")); // values are NFC too
        Assert.Equal("", result.Entries[1].Column("group"));                // an empty value is a value
        Assert.Null(result.Entries[1].Column("hand"));
    }

    [Fact]
    public void An_old_two_column_manifest_reads_exactly_as_before()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        // "#columns:" and "# columns" are plain comments: only a first field of exactly "#columns" is a header.
        File.WriteAllText(tsv, "#columns: none here\n# columns\tpath\ttext\tfamily\na.png\tTithe\nb.png\t\nc.png\tRent of Low Meadow\n");

        var result = Manifest.Read(tsv);

        Assert.Empty(result.Errors);
        Assert.Empty(result.Columns);
        Assert.Equal(new[] { ("a.png", "Tithe", 3), ("b.png", "", 4), ("c.png", "Rent of Low Meadow", 5) },
            result.Entries.Select(e => (e.RelativePath, e.Text, e.LineNumber)));
        Assert.All(result.Entries, e => Assert.Empty(e.Columns));
        // And a tab inside the transcript is still the old error, worded as before.
        File.WriteAllText(tsv, "a.png\tRent\tcomic\n");
        Assert.Equal("line 1: more than one tab; a transcript cannot contain a tab", Assert.Single(Manifest.Read(tsv).Errors).Reason);
    }

    [Theory]
    [InlineData("img/r-02.png\tBuried\tcomic", "line 4: 3 tab-separated field(s), but the #columns header on line 2 names 4 (path, text, family, group)")]
    [InlineData("img/r-02.png\tBuried\tcomic\tscript\tx", "line 4: 5 tab-separated field(s), but the #columns header on line 2 names 4")]
    [InlineData("img/r-02.png Buried", "line 4: 1 tab-separated field(s)")]
    public void An_entry_with_the_wrong_number_of_fields_is_reported_by_line(string badLine, string expected)
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv, $"# register\n#columns\tpath\ttext\tfamily\tgroup\nimg/r-01.png\tBaptised\tcomic\tscript\n{badLine}\nimg/r-03.png\tMarried\thumor\tsketch\n");

        var result = Manifest.Read(tsv);

        var error = Assert.Single(result.Errors);
        Assert.Equal("manifest", error.Stage);
        Assert.StartsWith(expected, error.Reason);
        Assert.Equal(new[] { 3, 5 }, result.Entries.Select(e => e.LineNumber));
    }

    [Theory]
    [InlineData("#columns\tpath\ttext\tFamily", "column name 'Family' may only use lowercase letters, digits, '_' and '-'")]
    [InlineData("#columns\tpath\ttext\tstyle group", "column name 'style group' may only use")]
    [InlineData("#columns\tpath\ttext\ttext", "column name 'text' is reserved")]
    [InlineData("#columns\tpath\ttext\tpath", "column name 'path' is reserved")]
    [InlineData("#columns\tpath\ttext\tfamily\tfamily", "column name 'family' appears twice")]
    [InlineData("#columns\tpath\ttext\t", "empty column name")]
    [InlineData("#columns\ttext\tpath\tfamily", "must begin '#columns<TAB>path<TAB>text'")]
    [InlineData("#columns", "must begin '#columns<TAB>path<TAB>text'")]
    public void A_bad_header_is_reported_on_its_line(string header, string reason)
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv, $"# register\n{header}\n");

        var error = Assert.Single(Manifest.Read(tsv).Errors);
        Assert.Equal("manifest", error.Stage);
        Assert.StartsWith("line 2: bad #columns header: ", error.Reason);
        Assert.Contains(reason, error.Reason);
    }

    [Fact]
    public void A_header_after_an_entry_or_a_second_header_is_reported_by_line()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        File.WriteAllText(tsv, "#columns\tpath\ttext\tfamily\n#columns\tpath\ttext\tgroup\na.png\tTithe\tcomic\n#columns\tpath\ttext\tfamily\n");

        var result = Manifest.Read(tsv);

        Assert.Equal(
            new[]
            {
                "line 2: second #columns header (the first is on line 1)",
                "line 4: #columns header after the first entry (line 3); it must come before every entry",
            },
            result.Errors.Select(e => e.Reason));
        Assert.Equal("comic", Assert.Single(result.Entries).Column("family")); // the first header holds

        // Without a header first, a header below an entry is the same error and the entries keep two columns.
        File.WriteAllText(tsv, "a.png\tTithe\n#columns\tpath\ttext\tfamily\nb.png\tRent\n");
        result = Manifest.Read(tsv);
        Assert.Equal("line 2: #columns header after the first entry (line 1); it must come before every entry", Assert.Single(result.Errors).Reason);
        Assert.Equal(new[] { "a.png", "b.png" }, result.Entries.Select(e => e.RelativePath));
    }

    [Fact]
    public void Write_with_columns_round_trips_and_writes_the_header_once()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        (string, string, IReadOnlyList<string>)[] written =
        [
            ("img/r-01.png", "Baptised Ann Tillery", ["comic-neue", "script"]),
            ("img/r-02.png", "", ["humor-sans", ""]),
        ];

        Manifest.Write(tsv, ["family", "group"], written, comment: "parish register, second volume");

        Assert.Equal(
            "# parish register, second volume\n#columns\tpath\ttext\tfamily\tgroup\n" +
            "img/r-01.png\tBaptised Ann Tillery\tcomic-neue\tscript\nimg/r-02.png\t\thumor-sans\t\n",
            File.ReadAllText(tsv, Encoding.UTF8));
        var result = Manifest.Read(tsv);
        Assert.Empty(result.Errors);
        Assert.Equal(written.Select(w => (w.Item1, w.Item2, w.Item3[0], w.Item3[1])),
            result.Entries.Select(e => (e.RelativePath, e.Text, e.Column("family")!, e.Column("group")!)));
    }

    [Fact]
    public void Write_without_columns_is_the_plain_format()
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        Manifest.Write(tsv, [], [("a.png", "Tithe", [])]);
        Assert.Equal("a.png\tTithe\n", File.ReadAllText(tsv, Encoding.UTF8));
    }

    [Theory]
    [InlineData("Family", "comic")]
    [InlineData("text", "comic")]
    [InlineData("family", "com\tic")]
    [InlineData("family", "com\nic")]
    public void Write_rejects_a_bad_name_or_value(string column, string value)
    {
        using var dir = new TempFolder();
        var tsv = dir.File("truth.tsv");
        Assert.Throws<ArgumentException>(() => Manifest.Write(tsv, [column], [("a.png", "Tithe", [value])]));
        Assert.Throws<ArgumentException>(() => Manifest.Write(tsv, ["family"], [("a.png", "Tithe", ["comic", "script"])]));
        Assert.Throws<ArgumentException>(() => Manifest.Write(tsv, ["family", "family"], [("a.png", "Tithe", ["a", "b"])]));
        Assert.Empty(Directory.GetFiles(dir.Path));
    }
}
