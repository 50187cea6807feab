using HandLine.Decoding;
using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;

namespace HandLine.Recognition;

/// <summary>
/// One image's bytes to its line results, through every stage in order: <see cref="Prepare"/> (load, find lines,
/// normalise, features: <see cref="LinePreparer"/>) → <see cref="Run"/> (the network, <see cref="LineModel.RunInLanes"/>)
/// → <see cref="Decode"/> (<see cref="LineDecoder"/> → <see cref="LineResult"/>); <see cref="Read"/> is the three in
/// a row. Made once from a model, the input limits and the decoding options; the model alone fixes how lines are
/// prepared. It reads no files and keeps no state between images: the batch runner reads, hashes and reports, and
/// calls the stages itself (images prepared and decoded in parallel, the network over lines of many images).
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

    /// <summary>
    /// Lines the network runs side by side (<see cref="LineModel.RunInLanes"/>). A line's low bits depend on it, so
    /// it is fixed, not a setting: every run, resumed or sharded, computes with the same shapes. See
    /// docs/measurements.md for the lane counts `handline bench` compared.
    /// </summary>
    public const int Lanes = 16;

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

    /// <summary>The one entry point: an image file's bytes to the results of its lines, top to bottom.</summary>
    /// <param name="source">The source's name in the reports.</param>
    /// <param name="nameForErrors">Named in any <see cref="InputException"/> (normally the file's path).</param>
    public IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors)
    {
        ArgumentNullException.ThrowIfNull(imageBytes);
        ArgumentNullException.ThrowIfNull(source);
        var prepared = Prepare(imageBytes, nameForErrors);
        return Decode(source, prepared, Run(prepared));
    }

    /// <summary>Stages 1 to 4 for one image (see <see cref="LinePreparer.PreparePage"/>); safe to call from several threads.</summary>
    public IReadOnlyList<PreparedLine> Prepare(byte[] imageBytes, string nameForErrors) => Lines.PreparePage(imageBytes, nameForErrors);

    /// <summary>
    /// The network on prepared lines of one image or of many, <see cref="Lanes"/> at a time; a line's posteriors
    /// are the same bits whichever lines come with it.
    /// </summary>
    public IReadOnlyList<Posteriors> Run(IReadOnlyList<PreparedLine> lines) => RunInLanes(lines, Lanes);

    /// <summary>The network on prepared lines with another lane count (for measurements: low bits differ from <see cref="Run"/>).</summary>
    public IReadOnlyList<Posteriors> RunInLanes(IReadOnlyList<PreparedLine> lines, int lanes)
    {
        ArgumentNullException.ThrowIfNull(lines);
        return Model.RunInLanes(lines.Select(p => p.Features).ToArray(), lanes);
    }

    /// <summary>Decodes an image's lines and flags the doubtful ones; safe to call from several threads.</summary>
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
