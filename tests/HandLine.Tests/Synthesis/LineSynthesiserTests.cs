using System.Text;
using System.Text.Json;
using HandLine.Model;
using HandLine.Synthesis;
using SkiaSharp;
using static HandLine.Tests.Synthesis.SynthesisFixtures;

namespace HandLine.Tests.Synthesis;

public sealed class LineSynthesiserTests : IDisposable
{
    private readonly string _dir = NewTempDir();

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static List<(string Path, string Text)> ReadManifest(string outDir) =>
        File.ReadAllLines(Path.Combine(outDir, LineSynthesiser.ManifestName), Encoding.UTF8)
            .Where(l => !l.StartsWith('#'))
            .Select(l => l.Split('\t'))
            .Select(f => (f[0], f[1]))
            .ToList();

    [Fact]
    public void Writes_pngs_a_matching_manifest_and_degradation_log_with_no_temp_files_left()
    {
        var summary = LineSynthesiser.Generate(new SynthesisRequest(Catalog, 12, _dir, 5), log: null);

        Assert.Equal(12, summary.LinesWritten);
        Assert.Equal(0, summary.LinesSkipped);
        var rows = ReadManifest(_dir);
        Assert.Equal(12, rows.Count);
        Assert.Equal(12, Directory.GetFiles(Path.Combine(_dir, "lines"), "*.png").Length);
        Assert.Empty(Directory.GetFiles(_dir, "*.tmp", SearchOption.AllDirectories));

        var jsonl = File.ReadAllLines(Path.Combine(_dir, LineSynthesiser.DegradationsName), Encoding.UTF8);
        Assert.Equal(12, jsonl.Length);
        for (var i = 0; i < rows.Count; i++)
        {
            var (path, text) = rows[i];
            Assert.False(Path.IsPathRooted(path));
            Assert.True(CharacterSet.Default.CanEncode(text), text);
            // The PNG decodes (outside decoder: Skia's codec) to a greyscale line wider than tall.
            using var bmp = SKBitmap.Decode(Path.Combine(_dir, path));
            Assert.NotNull(bmp);
            Assert.True(bmp.Width > bmp.Height, $"{path}: {bmp.Width}x{bmp.Height}");

            using var row = JsonDocument.Parse(jsonl[i]);
            Assert.Equal(path, row.RootElement.GetProperty("path").GetString());
            Assert.Equal(text, row.RootElement.GetProperty("text").GetString());
            Assert.Equal("phrase", row.RootElement.GetProperty("source").GetString());
            var font = row.RootElement.GetProperty("font").GetString();
            Assert.Contains(font, Catalog.Fonts.Select(f => f.Name));
            var d = row.RootElement.GetProperty("degradation");
            Assert.True(d.GetProperty("fontSizePx").GetDouble() is >= 32 and <= 48);
            Assert.True(d.TryGetProperty("jpegQuality", out _));
        }
        Assert.Equal(PhraseGenerator.CountSymbols(rows.Select(r => r.Text)), summary.SymbolCounts);
        Assert.Equal(12, summary.FontsUsed.Values.Sum());
    }

    [Fact]
    public void Same_seed_gives_identical_files_and_another_seed_does_not()
    {
        string Run(string name, int seed)
        {
            var dir = Path.Combine(_dir, name);
            LineSynthesiser.Generate(new SynthesisRequest(Catalog, 6, dir, seed), null);
            return dir;
        }
        var a = Run("a", 9);
        var b = Run("b", 9);
        var c = Run("c", 10);
        foreach (var file in new[] { LineSynthesiser.ManifestName, LineSynthesiser.DegradationsName })
            Assert.Equal(File.ReadAllBytes(Path.Combine(a, file)), File.ReadAllBytes(Path.Combine(b, file)));
        foreach (var png in Directory.GetFiles(Path.Combine(a, "lines")))
            Assert.Equal(File.ReadAllBytes(png), File.ReadAllBytes(Path.Combine(b, "lines", Path.GetFileName(png))));
        Assert.NotEqual(ReadManifest(a), ReadManifest(c));
    }

    [Fact]
    public void Line_without_glyphs_in_any_font_is_skipped_not_drawn_as_boxes()
    {
        string[] texts = ["Recd of Wm. Stonebridge £3", "Pd 漢字 Recd", "Pd \uE000 Jas. Haybarn"];
        var log = new StringWriter();
        var summary = LineSynthesiser.Generate(
            new SynthesisRequest(Catalog, 3, _dir, 1, texts, DegradationRanges.None), log);

        Assert.Equal(1, summary.LinesWritten);
        Assert.Equal([1, 2], summary.Skipped.Select(s => s.Index));
        Assert.Contains("U+6F22", summary.Skipped[0].Reason, StringComparison.Ordinal);
        Assert.Contains("U+E000", summary.Skipped[1].Reason, StringComparison.Ordinal);
        Assert.Contains("skipped", log.ToString(), StringComparison.Ordinal);
        Assert.Equal([("lines/000000.png", texts[0])], ReadManifest(_dir));
        Assert.Single(Directory.GetFiles(Path.Combine(_dir, "lines")));
    }

    [Fact]
    public void A_font_lacking_a_glyph_of_the_line_is_never_chosen_for_it()
    {
        // Humor Sans has no ½ (fontconfig charset 20-7e a2-a3 ac b1 ...), Comic Neue has.
        var texts = Enumerable.Range(0, 20).Select(i => i % 2 == 0 ? $"{i}½ doz. eggs" : $"Pd Jas. Haybarn {i}/6").ToList();
        LineSynthesiser.Generate(new SynthesisRequest(Catalog, texts.Count, _dir, 3, texts, DegradationRanges.None), null);
        var rows = File.ReadAllLines(Path.Combine(_dir, LineSynthesiser.DegradationsName))
            .Select(l => JsonDocument.Parse(l).RootElement)
            .Select(r => (Text: r.GetProperty("text").GetString()!, Font: r.GetProperty("font").GetString()!))
            .ToList();
        Assert.All(rows.Where(r => r.Text.Contains('½')), r => Assert.Equal(Comic, r.Font));
        // Lines both fonts can draw use both (chance of one font for all 10: 2 * 2^-10).
        Assert.Equal(2, rows.Where(r => !r.Text.Contains('½')).Select(r => r.Font).Distinct().Count());
    }

    [Fact]
    public void RenderOne_draws_in_memory_and_declines_uncovered_text()
    {
        var rng = new Random(4);
        var line = LineSynthesiser.RenderOne("Xmas Quarter: Zinnwood £4", Catalog, rng, new DegradationRanges());
        Assert.NotNull(line);
        Assert.True(line.Font.Covers(line.Text));
        Assert.Equal(LineRenderer.Render(line.Text, line.Font, line.Degradation).Pixels, line.Image.Pixels);
        Assert.Null(LineSynthesiser.RenderOne("漢", Catalog, rng, new DegradationRanges()));
    }

    [Fact]
    public void A_word_list_mixes_the_text_and_logs_each_line_source()
    {
        var words = TestWords.Words;
        var summary = LineSynthesiser.Generate(
            new SynthesisRequest(Catalog, 40, _dir, 6, Ranges: DegradationRanges.None, Words: words), null);

        var rows = File.ReadAllLines(Path.Combine(_dir, LineSynthesiser.DegradationsName))
            .Select(l => JsonDocument.Parse(l).RootElement)
            .Select(r => (Text: r.GetProperty("text").GetString()!, Source: r.GetProperty("source").GetString()!))
            .ToList();
        Assert.Equal(ReadManifest(_dir).Select(r => r.Text), rows.Select(r => r.Text));
        Assert.All(rows, r => Assert.True(CharacterSet.Default.CanEncode(r.Text), r.Text));
        var names = Enum.GetValues<TextSource>().Select(MixedText.NameOf).ToHashSet();
        Assert.All(rows, r => Assert.Contains(r.Source, names));
        Assert.True(rows.Select(r => r.Source).Distinct().Count() >= 4, "40 lines should come from several sources");
        Assert.Equal(rows.GroupBy(r => r.Source).ToDictionary(g => g.Key, g => g.Count()), summary.SourceCounts);

        // Without the word list the same seed gives the phrase lines of before: the mixture draws its seed last.
        var plain = Path.Combine(_dir, "plain");
        var phrases = LineSynthesiser.Generate(new SynthesisRequest(Catalog, 40, plain, 6, Ranges: DegradationRanges.None), null);
        Assert.Equal(new Dictionary<string, int> { ["phrase"] = 40 }, phrases.SourceCounts);
        Assert.NotEqual(ReadManifest(plain).Select(r => r.Text), rows.Select(r => r.Text));
    }

    [Fact]
    public void Rejects_bad_requests()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() =>
            LineSynthesiser.Generate(new SynthesisRequest(Catalog, -1, _dir, 1), null));
        Assert.Throws<ArgumentException>(() =>
            LineSynthesiser.Generate(new SynthesisRequest(Catalog, 1, _dir, 1, Array.Empty<string>()), null));
        Assert.Throws<ArgumentException>(() =>
            LineSynthesiser.Generate(new SynthesisRequest(Catalog, 1, " ", 1), null));
        Assert.Throws<ArgumentException>(() =>
            LineSynthesiser.Generate(new SynthesisRequest(Catalog, 1, _dir, 1, ["Pd"], Words: TestWords.Words), null));
        Assert.Throws<ArgumentException>(() =>
            LineSynthesiser.Generate(new SynthesisRequest(Catalog, 1, _dir, 1, Words: Array.Empty<string>()), null));
    }

    [Fact]
    public void SymbolsBeyondTheDefaultSetAreDrawnWhenAFontHasThem()
    {
        // '%' is not in the default set; `train` grows a model's set for it, so synthesis must be able to draw it.
        Assert.False(CharacterSet.Default.Contains("%"));
        var summary = LineSynthesiser.Generate(new SynthesisRequest(SynthesisFixtures.Catalog, 2, _dir, 3, ["Interest 5% on £40"]), null);
        Assert.Equal(2, summary.LinesWritten);
        Assert.Equal(2, summary.SymbolCounts["%"]);
        Assert.Contains("Interest 5% on £40", File.ReadAllText(summary.ManifestPath));
    }
}
