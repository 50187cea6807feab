using System.Globalization;
using HandLine.Formats;

namespace HandLine.Synthesis;

/// <summary>
/// Writes a set of synthetic ledger and register pages (<see cref="PageRenderer"/>): <c>pages/page-NNNN.png</c>;
/// <c>boxes/page-NNNN.tsv</c>, each page's truth boxes in reading order (<see cref="BoxFile"/>); the manifest
/// <c>pages.tsv</c> with each page's text (its parts in reading order joined by one space, as <c>score</c> joins a
/// run's lines) and the columns family, group and kind; and the same writing as line images,
/// <c>lines/NNNNNN.png</c> with the manifest <c>lines.tsv</c> (columns family, group, page, entry, column), so a
/// page's CER can be set beside the CER of its lines read one by one. Same fonts, count and seed, same files.
/// </summary>
public static class PageSynthesiser
{
    public const string PagesFolder = "pages";
    public const string BoxesFolder = "boxes";
    public const string PagesManifest = "pages.tsv";

    /// <summary>Writes <paramref name="count"/> pages; returns the number of pages and of lines written.</summary>
    public static (int Pages, int Lines) Generate(FontCatalog fonts, int count, string outDir, int seed,
        PageSynthesisOptions options, TextWriter? log)
    {
        ArgumentNullException.ThrowIfNull(fonts);
        ArgumentException.ThrowIfNullOrWhiteSpace(outDir);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(count);
        options.Validate();
        // Faces that draw only capitals would turn a page's text to capitals; every other face may write a page.
        var usable = fonts.Fonts.Where(f => f.Covers("Recd of Thos. Pelling £1 4s 6d")).ToArray();
        if (usable.Length == 0)
            throw new ArgumentException("No font of the catalogue can write a ledger entry (letters, figures and £).");
        outDir = Path.GetFullPath(outDir);
        foreach (var d in new[] { PagesFolder, BoxesFolder, LineSynthesiser.ImagesFolder })
            Directory.CreateDirectory(Path.Combine(outDir, d));

        var rng = new Random(seed);
        var text = new PhraseGenerator(rng.Next());
        var pages = new List<(string Path, string Text, IReadOnlyList<string> Values)>();
        var lines = new List<(string Path, string Text, IReadOnlyList<string> Values)>();
        for (var i = 0; i < count; i++)
        {
            var font = usable[rng.Next(usable.Length)];
            var kind = rng.NextDouble() < options.RegisterShare ? PageKind.Register : PageKind.Ledger;
            var page = PageRenderer.Render(kind, font, text, rng.Next(), options);
            var name = string.Create(CultureInfo.InvariantCulture, $"page-{i + 1:D4}");
            var relative = $"{PagesFolder}/{name}.png";
            AtomicFile.WriteAllBytes(Path.Combine(outDir, PagesFolder, name + ".png"), LineSynthesiser.EncodePng(page.Image));
            BoxFile.Write(Path.Combine(outDir, BoxesFolder, name + ".tsv"),
                page.Parts.Select(p => new LineBox(p.X, p.Y, p.Width, p.Height)),
                string.Create(CultureInfo.InvariantCulture,
                    $"{relative}: {page.Kind} page, {page.Image.Width}x{page.Image.Height} px, skew {page.SkewDegrees:F2} deg, " +
                    $"{(page.TouchingRows ? "touching rows" : "spaced rows")}, {page.Font.Name}; x, y, w, h per line in reading order"));
            pages.Add((relative, string.Join(' ', page.Parts.Select(p => p.Text)),
                [page.Font.Family, page.Font.Group, page.Kind.ToString().ToLowerInvariant()]));
            for (var k = 0; k < page.Parts.Count; k++)
            {
                var p = page.Parts[k];
                var path = string.Create(CultureInfo.InvariantCulture, $"{LineSynthesiser.ImagesFolder}/{lines.Count:D6}.png");
                AtomicFile.WriteAllBytes(Path.Combine(outDir, path), LineSynthesiser.EncodePng(page.LineImages[k]));
                lines.Add((path, p.Text, [page.Font.Family, page.Font.Group, relative,
                    p.Entry.ToString(CultureInfo.InvariantCulture), p.Column.ToString(CultureInfo.InvariantCulture)]));
            }
            log?.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"synthesis: {relative} ({page.Kind}, {page.Parts.Count} lines, skew {page.SkewDegrees:F2} deg, {page.Font.Name})"));
        }
        var comment = string.Create(CultureInfo.InvariantCulture, $"synthetic pages: seed {seed}, {count} pages, {fonts.Fonts.Count} fonts");
        Manifest.Write(Path.Combine(outDir, PagesManifest), [LineSynthesiser.FamilyColumn, LineSynthesiser.GroupColumn, "kind"], pages, comment);
        Manifest.Write(Path.Combine(outDir, LineSynthesiser.ManifestName),
            [LineSynthesiser.FamilyColumn, LineSynthesiser.GroupColumn, "page", "entry", "column"], lines, comment);
        return (pages.Count, lines.Count);
    }
}
