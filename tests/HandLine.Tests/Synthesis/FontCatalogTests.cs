using HandLine.Model;
using HandLine.Synthesis;
using static HandLine.Tests.Synthesis.SynthesisFixtures;

namespace HandLine.Tests.Synthesis;

public sealed class FontCatalogTests
{
    [Fact]
    public void Folder_loads_both_fixture_fonts_in_path_order_and_ignores_other_files()
    {
        // fixtures/fonts also holds *.copyright files, which are not fonts.
        Assert.Equal([Comic, Humor], Catalog.Fonts.Select(f => f.Name));
        Assert.Empty(Catalog.Errors);
        Assert.All(Catalog.Fonts, f => Assert.True(Path.IsPathFullyQualified(f.Path)));
    }

    [Fact]
    public void Unloadable_file_is_a_font_error_and_the_other_fonts_still_load()
    {
        var dir = NewTempDir();
        try
        {
            File.WriteAllText(Path.Combine(dir, "broken.ttf"), "this is not a font");
            var sub = Directory.CreateDirectory(Path.Combine(dir, "nested", "deeper")).FullName;
            File.Copy(Path.Combine(FontsDir, Humor), Path.Combine(sub, Humor));
            var missing = Path.Combine(dir, "absent.otf");

            using var catalog = FontCatalog.Load([dir, missing]);

            Assert.Equal([Humor], catalog.Fonts.Select(f => f.Name));
            Assert.Equal(2, catalog.Errors.Count);
            Assert.All(catalog.Errors, e => Assert.Equal("font", e.Stage));
            Assert.Contains(catalog.Errors, e => e.Path.EndsWith("broken.ttf", StringComparison.Ordinal));
            Assert.Contains(catalog.Errors, e => e.Path == missing);
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }

    [Theory]
    [InlineData(Comic)]
    [InlineData(Humor)]
    public void Covers_latin_ledger_text_but_not_cjk_or_private_use(string name)
    {
        var font = Font(name);
        Assert.True(font.Covers("Recd of Wm. Stonebridge 3 4 6"));
        Assert.True(font.Covers("   "));
        Assert.False(font.Covers("Pd 漢 Jas."));         // U+6F22, a CJK ideograph
        Assert.False(font.Covers("Pd \uE000 Jas."));     // private use area: no font standard assigns it
        Assert.Equal(["U+6F22"], font.MissingCodePoints("a漢b"));
    }

    [Fact]
    public void Coverage_matches_fontconfig_charset_of_the_fixture_fonts()
    {
        // Outside reference: `fc-query --format '%{charset}'` (fontconfig) on the committed files gives
        //   Humor-Sans.ttf:        20-7e a2-a3 ac b1 2013 2018-2019 201c-201d 20ac
        //   ComicNeue-Regular.otf: 20-7e a0-ff ... (every Latin-1 code point)
        static bool InHumor(int cp) => cp is >= 0x20 and <= 0x7E or 0xA2 or 0xA3 or 0xAC or 0xB1;
        static bool InComic(int cp) => cp is >= 0x20 and <= 0x7E or >= 0xA0 and <= 0xFF;
        foreach (var s in CharacterSet.Default.Symbols)
        {
            var cp = char.ConvertToUtf32(s, 0);
            Assert.True(InHumor(cp) == Font(Humor).Covers(s), $"Humor Sans, {s}");
            Assert.True(InComic(cp) == Font(Comic).Covers(s), $"Comic Neue, {s}");
            foreach (var font in Catalog.Fonts)
                Assert.Equal(font.Covers(s), font.CoveredDefaultCodePoints.Contains(cp));
        }
    }
}
