using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using HandLine.Formats;
using HandLine.Imaging;

namespace HandLine.Synthesis;

/// <summary>
/// Writes a training set of synthetic lines: <c>lines/NNNNNN.png</c>, the manifest <c>lines.tsv</c>
/// (relative path, transcript, and the extra columns <c>family</c> and <c>group</c> of the style each line was
/// drawn in, so a set can be scored per style) and <c>degradations.jsonl</c> (per line: path, font, text, the
/// text's source and the degradation values). The same request and seed give
/// byte-identical files: all random choices are drawn in line order before the parallel rendering.
/// </summary>
public static class LineSynthesiser
{
    public const string ImagesFolder = "lines";
    public const string ManifestName = "lines.tsv";
    public const string DegradationsName = "degradations.jsonl";

    /// <summary>Manifest column: the line's style family (<see cref="FontFace.Family"/>, or <see cref="DigitFamily"/>).</summary>
    public const string FamilyColumn = "family";

    /// <summary>Manifest column: the line's style group (<see cref="FontFace.Group"/>, or <see cref="DigitGroup"/>).</summary>
    public const string GroupColumn = "group";

    /// <summary>Family of MNIST digit lines: the handwriting is the digits', whatever font draws the separators.</summary>
    public const string DigitFamily = "mnist";

    /// <summary>Group of MNIST digit lines.</summary>
    public const string DigitGroup = "digits";
    private const int BatchSize = 256;

    private static readonly JsonSerializerOptions Json = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        // Keep £ and fractions readable in the log; quotes and controls are still escaped.
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    /// <summary>The source recorded for lines from the user's text file.</summary>
    public const string TextFileSource = "text";

    /// <summary>The source recorded for MNIST digit lines.</summary>
    public const string DigitsSource = "digits";

    private sealed record Plan(int Index, string RelativePath, string Text, string Source, FontFace Font, Degradation Degradation, int[]? Mnist);

    // Mnist: the sample index of each digit, in text order (digit lines only).
    private sealed record DegradationRow(string Path, string Font, string Text, string Source, Degradation Degradation,
        [property: System.Text.Json.Serialization.JsonIgnore(Condition = System.Text.Json.Serialization.JsonIgnoreCondition.WhenWritingNull)] int[]? Mnist);

    public static SynthesisSummary Generate(SynthesisRequest request, TextWriter? log)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentNullException.ThrowIfNull(request.Fonts);
        ArgumentOutOfRangeException.ThrowIfNegative(request.Count);
        ArgumentException.ThrowIfNullOrWhiteSpace(request.OutDir);
        if (request.Fonts.Fonts.Count == 0)
            throw new ArgumentException("The font catalog has no usable fonts.", nameof(request));
        var userTexts = request.Texts?.ToList();
        if (userTexts is { Count: 0 })
            throw new ArgumentException("The text list is empty.", nameof(request));
        if (request.Words is not null && (userTexts is not null || request.Digits is not null))
            throw new ArgumentException("A word list cannot be combined with a text list or digit lines.", nameof(request));
        if (request.Words is { Count: 0 })
            throw new ArgumentException("The word list is empty.", nameof(request));
        var ranges = request.Ranges ?? new DegradationRanges();

        var outDir = Path.GetFullPath(request.OutDir);
        var imageDir = Path.Combine(outDir, ImagesFolder);
        Directory.CreateDirectory(imageDir);

        var rng = new Random(request.Seed);
        var generator = new PhraseGenerator(rng.Next());
        // Drawn only with a word list, so that sets made without one stay byte-identical to earlier versions.
        var mixture = request.Words is null ? null : new TextMixture(rng.Next(), request.Words, request.Mixture);
        var plans = new List<Plan>(request.Count);
        var skipped = new List<SkippedLine>();
        for (var i = 0; i < request.Count; i++)
        {
            var (raw, source) = userTexts is not null ? (userTexts[i % userTexts.Count], TextFileSource)
                : request.Digits is not null ? (DigitLineText.Next(rng), DigitsSource)
                : mixture is not null ? Mixed(mixture.Next())
                : (generator.Next(), MixedText.NameOf(TextSource.Phrase));
            var text = TextUnits.ToNfc(raw ?? "").Trim();
            // Digit lines need the font only for what is not a digit.
            var font = PickFont(text, request.Fonts, rng, out var reason, request.Digits is null ? text : WithoutDigits(text));
            if (font is null)
            {
                skipped.Add(new SkippedLine(i, text, reason!));
                log?.WriteLine($"synthesis: line {i} skipped: {reason}");
                continue;
            }
            // The label says what is drawn: an all-capitals hand writes "Rent" as RENT.
            if (font.DrawsOnlyCapitals) text = text.ToUpperInvariant();
            var path = string.Create(CultureInfo.InvariantCulture, $"{ImagesFolder}/{plans.Count:D6}.png");
            var degradation = Degradation.Sample(rng, ranges);
            plans.Add(new Plan(i, path, text, source, font, degradation, request.Digits is null ? null : PickSamples(text, request.Digits, rng)));
        }

        for (var start = 0; start < plans.Count; start += BatchSize)
        {
            var end = Math.Min(plans.Count, start + BatchSize);
            // Each render depends only on its plan, so the order of work does not change any byte.
            Parallel.For(start, end, k => WriteImage(plans[k], outDir, request.Digits));
            log?.WriteLine($"synthesis: {end}/{plans.Count} lines drawn");
        }

        var comment = string.Create(CultureInfo.InvariantCulture,
            $"synthetic lines: seed {request.Seed}, {plans.Count} lines, {request.Fonts.Fonts.Count} fonts")
            + (request.Digits is null ? "" : $", MNIST digits ({request.Digits.Split} split)");
        var jsonl = new StringBuilder();
        foreach (var p in plans)
        {
            jsonl.Append(JsonSerializer.Serialize(new DegradationRow(p.RelativePath, p.Font.Name, p.Text, p.Source, p.Degradation, p.Mnist), Json))
                .Append('\n');
        }
        var manifestPath = Path.Combine(outDir, ManifestName);
        var degradationsPath = Path.Combine(outDir, DegradationsName);
        var utf8 = new UTF8Encoding(encoderShouldEmitUTF8Identifier: false);
        Manifest.Write(manifestPath, [FamilyColumn, GroupColumn],
            plans.Select(p => (p.RelativePath, p.Text, Style(p.Font, request.Digits is not null))), comment);
        WriteAtomically(degradationsPath, utf8.GetBytes(jsonl.ToString()));

        var fontsUsed = new SortedDictionary<string, int>(StringComparer.Ordinal);
        foreach (var p in plans)
            fontsUsed[p.Font.Name] = fontsUsed.TryGetValue(p.Font.Name, out var n) ? n + 1 : 1;
        var sources = new SortedDictionary<string, int>(StringComparer.Ordinal);
        foreach (var p in plans)
            sources[p.Source] = sources.TryGetValue(p.Source, out var n) ? n + 1 : 1;
        var summary = new SynthesisSummary(
            plans.Count, skipped, PhraseGenerator.CountSymbols(plans.Select(p => p.Text)), fontsUsed,
            manifestPath, degradationsPath, sources);
        log?.WriteLine($"synthesis: wrote {summary.LinesWritten} lines, skipped {summary.LinesSkipped}, " +
                       $"{fontsUsed.Count} fonts used");
        return summary;
    }

    private static (string Text, string Source) Mixed(MixedText line) => (line.Text, line.SourceName);

    /// <summary>
    /// Samples degradations and renders one line in memory with a random font that has every glyph
    /// of the text; null when no font does. For on-the-fly training data.
    /// </summary>
    public static SyntheticLine? RenderOne(string text, FontCatalog fonts, Random rng, DegradationRanges ranges)
    {
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(fonts);
        ArgumentNullException.ThrowIfNull(rng);
        ArgumentNullException.ThrowIfNull(ranges);
        var font = PickFont(text, fonts, rng, out _);
        if (font is null)
            return null;
        if (font.DrawsOnlyCapitals) text = text.ToUpperInvariant();
        var d = Degradation.Sample(rng, ranges);
        return new SyntheticLine(text, font, d, LineRenderer.Render(text, font, d));
    }

    /// <summary>8-bit greyscale PNG of a luminance image.</summary>
    public static byte[] EncodePng(GrayImage image)
    {
        ArgumentNullException.ThrowIfNull(image);
        return RasterOps.EncodePng(image.Pixels, image.Width, image.Height);
    }

    /// <summary>A font drawn at random among those with real glyphs for all of the text.</summary>
    private static FontFace? PickFont(string text, FontCatalog fonts, Random rng, out string? reason, string? drawnText = null)
    {
        if (text.Length == 0)
        {
            reason = "empty line";
            return null;
        }
        var covering = fonts.Fonts.Where(f => f.Covers(drawnText ?? text)).ToList();
        if (covering.Count == 0)
        {
            var missing = text.EnumerateRunes()
                .Where(r => !fonts.Fonts.Any(f => f.Covers(r.ToString())))
                .Select(r => string.Create(CultureInfo.InvariantCulture, $"U+{r.Value:X4}"))
                .Distinct()
                .ToList();
            reason = missing.Count > 0
                ? $"no font has glyphs for {string.Join(" ", missing)}"
                : "no single font has glyphs for all of the line";
            return null;
        }
        // Symbols beyond the default set are drawn too: `train` adds them to a model's character set.
        reason = null;
        var weights = covering.Select(fonts.Weight).ToArray();
        // Equal weights keep the plain uniform draw, so sets rendered before weighting existed draw the same fonts.
        if (weights.All(w => w == weights[0])) return covering[rng.Next(covering.Count)];
        var target = rng.NextDouble() * weights.Sum();
        for (var i = 0; i < covering.Count; i++)
        {
            target -= weights[i];
            if (target < 0) return covering[i];
        }
        return covering[^1];
    }

    /// <summary>The family and group values of a line, in column order.</summary>
    private static IReadOnlyList<string> Style(FontFace font, bool digits) =>
        digits ? [DigitFamily, DigitGroup] : [font.Family, font.Group];

    private static string WithoutDigits(string text) => string.Concat(text.Where(c => c is < '0' or > '9'));

    /// <summary>One MNIST sample per digit of the text, drawn from the digit's samples in the split.</summary>
    private static int[] PickSamples(string text, DigitSource source, Random rng) =>
        text.Where(c => c is >= '0' and <= '9').Select(c =>
        {
            var available = source.Digits.Available(c - '0', source.Split);
            if (available.Count == 0)
                throw new InvalidOperationException($"No {source.Split} samples of digit {c} in {source.Digits.Source}.");
            return available[rng.Next(available.Count)];
        }).ToArray();

    private static void WriteImage(Plan plan, string outDir, DigitSource? digits)
    {
        var image = digits is null
            ? LineRenderer.Render(plan.Text, plan.Font, plan.Degradation)
            : DigitLineRenderer.Render(plan.Text, plan.Mnist!, digits.Digits, digits.Split, plan.Font, plan.Degradation);
        WriteAtomically(Path.Combine(outDir, plan.RelativePath), EncodePng(image));
    }

    /// <summary>Temp file in the same folder then rename, so readers never see half a file.</summary>
    private static void WriteAtomically(string path, byte[] bytes)
    {
        var temp = path + ".tmp";
        try
        {
            File.WriteAllBytes(temp, bytes);
            File.Move(temp, path, overwrite: true);
        }
        finally
        {
            if (File.Exists(temp))
                File.Delete(temp);
        }
    }
}
