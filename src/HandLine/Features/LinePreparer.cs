using HandLine.Imaging;
using HandLine.Layout;

namespace HandLine.Features;

/// <summary>
/// The stages before the network, in order, made once for one feature configuration (a model's, or the one a
/// training run gives its model): load (with the input limits) → find lines → normalise → extract features.
/// Transcription, the benchmarks and training all prepare lines through this one object, so they cannot drift
/// apart; training stops after normalisation (it keeps the ink and extracts features as it trains). Every
/// setting is checked when it is made, none for each image. The line settings come only from
/// <see cref="FeatureConfig"/>; the tuning values and the limits have no say over them.
/// </summary>
public sealed class LinePreparer
{
    private readonly LineFinder _finder;
    private readonly LineNormaliser _normaliser;
    private readonly PageAnalyser _pages = new();

    /// <param name="features">What the model fixes: line height, slant correction, binarisation, features.</param>
    /// <param name="tuning">The imaging stage's tuning values; null for the defaults.</param>
    /// <param name="limits">Safety limits on images and lines; null for the defaults.</param>
    /// <exception cref="ArgumentException">A setting is out of range, or the settings do not fit together.</exception>
    public LinePreparer(FeatureConfig features, ImagingOptions? tuning = null, InputLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(features);
        Features = features;
        Tuning = tuning ?? new ImagingOptions();
        Limits = limits ?? InputLimits.Default;
        _finder = new LineFinder(Tuning);
        features.Validate();
        _normaliser = new LineNormaliser(features.LineHeight, features.CorrectSlant, features.Binarisation, Tuning, Limits);
    }

    public FeatureConfig Features { get; }

    public ImagingOptions Tuning { get; }

    public InputLimits Limits { get; }

    /// <summary>Stage 1: an image file's bytes to luminance, within the limits.</summary>
    public GrayImage Load(byte[] imageBytes, string nameForErrors) => ImageLoader.Load(imageBytes, nameForErrors, Limits);

    /// <summary>Stage 1 from a file (size checked before reading).</summary>
    public GrayImage Load(string path) => ImageLoader.Load(path, Limits);

    /// <summary>Stage 2: a page to its text lines, top to bottom (one for a line image).</summary>
    public IReadOnlyList<LineRegion> FindLines(GrayImage page) => _finder.Split(page);

    /// <summary>Stage 3: one line image to normalised ink of the model's line height.</summary>
    public NormalisedLine Normalise(GrayImage line, string nameForErrors) => _normaliser.Normalise(line, nameForErrors);

    /// <summary>Stage 4: normalised ink to the frames the network sees.</summary>
    public FeatureSequence Extract(NormalisedLine line) => ColumnFeatures.Extract(line, Features);

    /// <summary>Stages 3 and 4 for one line image.</summary>
    public PreparedLine Prepare(GrayImage line, string nameForErrors = "line image")
    {
        var normalised = Normalise(line, nameForErrors);
        return new PreparedLine(normalised, Extract(normalised));
    }

    /// <summary>
    /// Stages 1 to 4 for one image: its lines that hold ink, top to bottom. Lines without ink are left out; an
    /// image with no ink at all is an <see cref="InputException"/>.
    /// </summary>
    public IReadOnlyList<PreparedLine> PreparePage(byte[] imageBytes, string nameForErrors)
    {
        ArgumentNullException.ThrowIfNull(imageBytes);
        ArgumentNullException.ThrowIfNull(nameForErrors);
        return PreparePage(Load(imageBytes, nameForErrors), nameForErrors);
    }

    /// <summary>Stages 2 to 4 for one loaded image taken as lines (for instance one turned upright first).</summary>
    public IReadOnlyList<PreparedLine> PreparePage(GrayImage page, string nameForErrors)
    {
        ArgumentNullException.ThrowIfNull(page);
        ArgumentNullException.ThrowIfNull(nameForErrors);
        // As before this class: a line's normalisation error names "line image", not the file (left for a change of
        // its own, as it changes errors.jsonl).
        var prepared = FindLines(page)
            .Select(region => Prepare(region.Image))
            .Where(p => p.Line.HasInk)
            .ToArray();
        if (prepared.Length == 0)
            throw new InputException(nameForErrors, "normalise", "no ink found: the image looks blank");
        return prepared;
    }

    /// <summary>Whether <see cref="PrepareImage"/> takes this image as a whole page.</summary>
    public bool TakesAsPage(GrayImage image, LayoutMode layout) =>
        layout == LayoutMode.Page || (layout == LayoutMode.Auto && _pages.LooksLikePage(image));

    /// <summary>
    /// Whether the image would be taken as a page both as it is and turned a quarter: true of a page, false of a
    /// line image lying sideways (tall and narrow, it passes for a page only as it lies).
    /// </summary>
    public bool TakesAsPageEitherWay(GrayImage image, LayoutMode layout)
    {
        ArgumentNullException.ThrowIfNull(image);
        return layout == LayoutMode.Page
               || (layout == LayoutMode.Auto && _pages.LooksLikePage(image) && _pages.LooksLikePage(image.Height, image.Width));
    }

    /// <summary>
    /// Whether a page's text lines run across it or down it (<see cref="PageAnalyser.GuessAxis"/>); null for an image
    /// that is no page by its size either way (a line image taken as a page with `--layout page`: the cue's squares
    /// would be smaller than its letters) and for a page without writing.
    /// </summary>
    public PageAxisGuess? GuessPageAxis(GrayImage page)
    {
        ArgumentNullException.ThrowIfNull(page);
        return TakesAsPageEitherWay(page, LayoutMode.Auto) ? _pages.GuessAxis(page) : null;
    }

    /// <summary>
    /// Stages 2 to 4 for one loaded image taken as <paramref name="layout"/> says (auto: <see cref="PageAnalyser.LooksLikePage"/>):
    /// as lines, the lines of <see cref="PreparePage(GrayImage, string)"/>; as a page, the lines the page stage
    /// (<see cref="PageAnalyser.Analyse"/>) finds, in reading order, each with its place on the page (box, column, entry).
    /// </summary>
    public IReadOnlyList<PreparedLine> PrepareImage(GrayImage image, string nameForErrors, LayoutMode layout)
    {
        ArgumentNullException.ThrowIfNull(image);
        ArgumentNullException.ThrowIfNull(nameForErrors);
        if (!TakesAsPage(image, layout)) return PreparePage(image, nameForErrors);
        var found = _pages.Analyse(image).Lines;
        var lines = new List<PreparedLine>(found.Count);
        foreach (var line in found)
        {
            var prepared = Prepare(line.Image, nameForErrors);
            if (!prepared.Line.HasInk) continue;
            lines.Add(prepared with { Layout = "page", Box = line.Box, Column = line.Column, Entry = line.Entry });
        }
        if (lines.Count == 0)
            throw new InputException(nameForErrors, "segment", "no lines found: the page looks blank");
        return lines;
    }
}
