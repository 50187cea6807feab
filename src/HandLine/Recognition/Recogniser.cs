using HandLine.Decoding;
using HandLine.Features;
using HandLine.Imaging;
using HandLine.Layout;
using HandLine.Model;

namespace HandLine.Recognition;

/// <summary>
/// One image's bytes to its line results, through every stage in order: <see cref="LinePreparer"/> (load, find
/// lines, normalise, features) → <see cref="LineModel.Run(IReadOnlyList{FeatureSequence})"/> (all lines of the
/// image as one batch) → <see cref="LineDecoder"/> → <see cref="LineResult"/>. Made once from a model, the input
/// limits and the decoding options; the model alone fixes how lines are prepared. It reads no files and keeps no
/// state between images: the batch runner reads, hashes and reports, and calls <see cref="Read"/>.
/// </summary>
public sealed class Recogniser : IImageRecogniser
{
    /// <summary>
    /// Lines whose confidence is below this are flagged for review. Set by `handline calibrate --catch 0.9` on the
    /// bundled model's 1,000 validation lines (unseen fonts, default beam 8): 0.63935 catches 90% of character
    /// errors (it flags 40% of lines), rounded up to 0.64.
    /// Re-measure for other models.
    /// </summary>
    public const double DefaultFlagBelow = 0.64;

    private readonly double _flagBelow;

    /// <param name="model">The model; the caller keeps ownership (and disposes it).</param>
    /// <param name="limits">Safety limits on images and lines; null for the defaults.</param>
    /// <param name="decoding">How to decode; null means <see cref="DecodingOptions"/>' defaults.</param>
    /// <param name="flagBelow">Lines whose confidence is below this are flagged for review.</param>
    /// <param name="tuning">The imaging stage's tuning values; null for the defaults.</param>
    /// <exception cref="InputException">The lexicon has a word the model cannot write.</exception>
    public Recogniser(LineModel model, InputLimits? limits = null, DecodingOptions? decoding = null,
        double flagBelow = DefaultFlagBelow, ImagingOptions? tuning = null)
    {
        ArgumentNullException.ThrowIfNull(model);
        if (flagBelow is < 0 or > 1) throw new ArgumentOutOfRangeException(nameof(flagBelow), "must be within [0, 1]");
        Model = model;
        Lines = new LinePreparer(model.Features, tuning, limits);
        Decoder = new LineDecoder(model.Charset, decoding ?? new DecodingOptions());
        _flagBelow = flagBelow;
    }

    public LineModel Model { get; }

    /// <summary>The stages before the network, as this model prepares lines.</summary>
    public LinePreparer Lines { get; }

    public LineDecoder Decoder { get; }

    public InputLimits Limits => Lines.Limits;

    /// <summary>How images are taken: as lines, as whole pages, or decided per image (the default).</summary>
    public LayoutMode Layout { get; init; } = LayoutMode.Auto;

    /// <summary>The one entry point: an image file's bytes to the results of its lines, top to bottom.</summary>
    /// <param name="source">The source's name in the reports.</param>
    /// <param name="nameForErrors">Named in any <see cref="InputException"/> (normally the file's path).</param>
    public IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors)
    {
        ArgumentNullException.ThrowIfNull(imageBytes);
        ArgumentNullException.ThrowIfNull(source);
        var (prepared, page) = Lines.PrepareImage(imageBytes, nameForErrors, Layout);
        var results = Decode(source, prepared, Run(prepared));
        return page is null
            ? results.Select(r => r with { Layout = "line" }).ToArray()
            : results.Select((r, i) => r with
            {
                Layout = "page",
                Box = page[i].Box.ToArray(),
                Column = page[i].Column,
                Entry = page[i].Entry,
            }).ToArray();
    }

    /// <summary>The network on an image's prepared lines, as one batch.</summary>
    public IReadOnlyList<Posteriors> Run(IReadOnlyList<PreparedLine> lines)
    {
        ArgumentNullException.ThrowIfNull(lines);
        return Model.Run(lines.Select(p => p.Features).ToArray());
    }

    /// <summary>Decodes an image's lines and flags the doubtful ones.</summary>
    public IReadOnlyList<LineResult> Decode(string source, IReadOnlyList<PreparedLine> lines, IReadOnlyList<Posteriors> posteriors)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(lines);
        ArgumentNullException.ThrowIfNull(posteriors);
        if (lines.Count != posteriors.Count) throw new ArgumentException("one posterior per line is needed", nameof(posteriors));
        var results = new LineResult[lines.Count];
        for (var i = 0; i < lines.Count; i++)
        {
            var h = Decoder.Decode(posteriors[i]);
            results[i] = new LineResult(source, i, h.Text, h.Confidence, h.Confidence < _flagBelow, h.Chars,
                lines[i].Line.DeskewDegrees, lines[i].Line.SlantDegrees)
            { Alternatives = h.Alternatives };
        }
        return results;
    }
}
