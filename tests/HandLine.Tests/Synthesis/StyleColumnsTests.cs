using System.Text.Json;
using HandLine.Formats;
using HandLine.Synthesis;
using static HandLine.Tests.Synthesis.SynthesisFixtures;

namespace HandLine.Tests.Synthesis;

public sealed class StyleColumnsTests : IDisposable
{
    private readonly string _dir = NewTempDir();

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    /// <summary>The two fixture fonts laid out as ROOT/SPLIT/GROUP/FAMILY/file; returns ROOT.</summary>
    private string LayOut()
    {
        var root = Path.Combine(_dir, "fonts");
        foreach (var (group, family, file) in new[] { ("script", "comic-neue", Comic), ("sketch", "humor-sans", Humor) })
        {
            var folder = Directory.CreateDirectory(Path.Combine(root, "valid", group, family)).FullName;
            File.Copy(Path.Combine(FontsDir, file), Path.Combine(folder, file));
        }
        return root;
    }

    [Fact]
    public void Family_and_group_come_from_the_parent_and_grandparent_folders()
    {
        var root = LayOut();
        foreach (var given in new[] { Path.Combine(root, "valid"), root })
        {
            using var catalog = FontCatalog.Load([given]);
            Assert.Equal(
                new[] { (Comic, "comic-neue", "script"), (Humor, "humor-sans", "sketch") },
                catalog.Fonts.Select(f => (f.Name, f.Family, f.Group)));
        }
        // Directly in the given folder, or named as a file, there is no layout to read. (The catalogue lists fonts
        // in path order, and the temporary folder and the checkout sort either way round, so compare by name.)
        using var flat = FontCatalog.Load([Path.Combine(root, "valid", "script"), Path.Combine(FontsDir, Humor)]);
        Assert.Equal(
            new[] { (Comic, "ComicNeue-Regular", "ungrouped"), (Humor, "Humor-Sans", "ungrouped") },
            flat.Fonts.Select(f => (f.Name, f.Family, f.Group)).OrderBy(f => f.Name, StringComparer.Ordinal));
        Assert.Equal(new[] { "ComicNeue-Regular", "Humor-Sans" }, Catalog.Fonts.Select(f => f.Family));
    }

    [Fact]
    public void Lines_drawn_in_an_all_capitals_hand_are_labelled_in_capitals()
    {
        // Humor Sans draws lowercase code points with capital letterforms; in the "capitals" group its labels
        // must say what is drawn, while a face of another group keeps the text's own case.
        var root = Path.Combine(_dir, "caps");
        foreach (var (group, family, file) in new[] { ("upright-print", "comic-neue", Comic), ("capitals", "humor-sans", Humor) })
            File.Copy(Path.Combine(FontsDir, file), Path.Combine(Directory.CreateDirectory(Path.Combine(root, "train", group, family)).FullName, file));
        using var catalog = FontCatalog.Load([root]);
        string[] texts = ["Half a year's rent", "Recd of Mr Tolley 4s 6d"];
        var summary = LineSynthesiser.Generate(new SynthesisRequest(catalog, 40, Path.Combine(_dir, "caps-set"), 5, texts), null);
        var entries = Manifest.Read(summary.ManifestPath).Entries;
        var capitals = entries.Where(e => e.Column("group") == "capitals").ToList();
        var mixed = entries.Where(e => e.Column("group") == "upright-print").ToList();
        Assert.NotEmpty(capitals);
        Assert.NotEmpty(mixed);
        Assert.All(capitals, e => Assert.Contains(e.Text, new[] { "HALF A YEAR'S RENT", "RECD OF MR TOLLEY 4S 6D" }));
        Assert.All(mixed, e => Assert.Contains(e.Text, texts));
    }

    [Fact]
    public void A_large_group_gets_a_share_growing_as_the_root_of_its_size()
    {
        // Group "many" holds four families (each a copy of Comic Neue), group "few" one (Humor Sans): by family
        // count "many" would draw 80 % of lines; weighted 1/√4 per family it draws √4 / (√4 + 1) = 2/3.
        var root = Path.Combine(_dir, "weights");
        foreach (var family in new[] { "a", "b", "c", "d" })
            File.Copy(Path.Combine(FontsDir, Comic), Path.Combine(Directory.CreateDirectory(Path.Combine(root, "train", "many", family)).FullName, Comic));
        File.Copy(Path.Combine(FontsDir, Humor), Path.Combine(Directory.CreateDirectory(Path.Combine(root, "train", "few", "e")).FullName, Humor));
        using var catalog = FontCatalog.Load([root]);
        Assert.Equal(0.5, catalog.Weight(catalog.Fonts.First(f => f.Group == "many")), 9);
        Assert.Equal(1.0, catalog.Weight(catalog.Fonts.Single(f => f.Group == "few")), 9);
        var summary = LineSynthesiser.Generate(new SynthesisRequest(catalog, 600, Path.Combine(_dir, "weights-set"), 8, ["Paid 4s 6d"]), null);
        var share = Manifest.Read(summary.ManifestPath).Entries.Count(e => e.Column("group") == "many") / 600.0;
        Assert.InRange(share, 2.0 / 3 - 0.06, 2.0 / 3 + 0.06); // binomial sd at n = 600 is 0.019; 3 sd
    }

    [Fact]
    public void Synthesis_writes_each_line_s_family_and_group()
    {
        using var catalog = FontCatalog.Load([Path.Combine(LayOut(), "valid")]);
        var summary = LineSynthesiser.Generate(new SynthesisRequest(catalog, 10, Path.Combine(_dir, "set"), 3), null);

        var manifest = Manifest.Read(summary.ManifestPath);
        Assert.Empty(manifest.Errors);
        Assert.Equal(new[] { "family", "group" }, manifest.Columns);
        Assert.Equal(10, manifest.Entries.Count);
        var fontOf = File.ReadAllLines(summary.DegradationsPath)
            .Select(l => JsonDocument.Parse(l).RootElement)
            .ToDictionary(r => r.GetProperty("path").GetString()!, r => r.GetProperty("font").GetString()!);
        foreach (var e in manifest.Entries)
        {
            var (family, group) = fontOf[e.RelativePath] == Comic ? ("comic-neue", "script") : ("humor-sans", "sketch");
            Assert.Equal(family, e.Column("family"));
            Assert.Equal(group, e.Column("group"));
        }
        Assert.Equal(2, manifest.Entries.Select(e => e.Column("family")).Distinct().Count()); // seed 3 uses both fonts
    }

    [Fact]
    public void Digit_lines_are_the_mnist_family_in_the_digits_group()
    {
        var digits = MnistDigits.Load(MnistDigitsTests.FixtureDir);
        var summary = LineSynthesiser.Generate(new SynthesisRequest(Catalog, 4, _dir, 2,
            Digits: new DigitSource(digits, MnistSplit.Validation)), null);

        var manifest = Manifest.Read(summary.ManifestPath);
        Assert.Empty(manifest.Errors);
        Assert.All(manifest.Entries, e => Assert.Equal(("mnist", "digits"), (e.Column("family"), e.Column("group"))));
    }
}
