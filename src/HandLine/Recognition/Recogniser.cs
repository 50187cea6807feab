using HandLine.Decoding;
using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;

namespace HandLine.Recognition;

/// <summary>
/// One image's bytes to its line results, through every stage in order: load, turn upright
/// (<see cref="OrientationOptions"/>), <see cref="LinePreparer"/> (find lines, normalise, features) → <see cref="LineModel.Run(IReadOnlyList{FeatureSequence})"/> (all lines of the
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
    /// <param name="orientation">Which way images are read; null to detect it (<see cref="OrientationOptions.Auto"/>).</param>
    /// <exception cref="InputException">The lexicon has a word the model cannot write.</exception>
    public Recogniser(LineModel model, InputLimits? limits = null, DecodingOptions? decoding = null,
        double flagBelow = DefaultFlagBelow, ImagingOptions? tuning = null, OrientationOptions? orientation = null)
    {
        ArgumentNullException.ThrowIfNull(model);
        if (flagBelow is < 0 or > 1) throw new ArgumentOutOfRangeException(nameof(flagBelow), "must be within [0, 1]");
        Orientation = orientation ?? OrientationOptions.Auto;
        Orientation.Validate();
        Model = model;
        Lines = new LinePreparer(model.Features, tuning, limits);
        Decoder = new LineDecoder(model.Charset, decoding ?? new DecodingOptions());
        _flagBelow = flagBelow;
    }

    public LineModel Model { get; }

    /// <summary>The stages before the network, as this model prepares lines.</summary>
    public LinePreparer Lines { get; }

    public LineDecoder Decoder { get; }

    public OrientationOptions Orientation { get; }

    public InputLimits Limits => Lines.Limits;

    /// <summary>The one entry point: an image file's bytes to the results of its lines, top to bottom.</summary>
    /// <param name="source">The source's name in the reports.</param>
    /// <param name="nameForErrors">Named in any <see cref="InputException"/> (normally the file's path).</param>
    public IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors)
    {
        ArgumentNullException.ThrowIfNull(imageBytes);
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(nameForErrors);
        var page = Lines.Load(imageBytes, nameForErrors);
        if (Orientation.Fixed is { } fixedRotation)
            return ReadAt(page, fixedRotation, source, nameForErrors).Results;
        return Upright(page, source, nameForErrors);
    }

    /// <summary>
    /// The rotation detected as <see cref="OrientationOptions"/> describes: the readings left by the ink cue, in
    /// turn, the first kept at once when confident enough, otherwise the most confident (the first with its margin).
    /// </summary>
    private IReadOnlyList<LineResult> Upright(GrayImage page, string source, string nameForErrors)
    {
        // No ink: read it upright, which reports the blank image as it always has.
        if (OrientationEstimator.Guess(page, Lines.Tuning) is not { } guess)
            return ReadAt(page, 0, source, nameForErrors).Results;
        int[] candidates = guess.AxisMargin >= Orientation.SureAxisMargin ? [0, 180]
            : guess.AxisMargin <= -Orientation.SureAxisMargin ? [90, 270]
            : guess.AxisMargin >= 0 ? [0, 180, 90, 270] : [90, 270, 0, 180];
        (IReadOnlyList<LineResult> Results, double Score)? best = null;
        InputException? firstProblem = null;
        foreach (var rotation in candidates)
        {
            try
            {
                var reading = ReadAt(page, rotation, source, nameForErrors);
                if (rotation == candidates[0] && reading.Score >= Orientation.CheckBelow) return reading.Results;
                // The first reading competes with its margin added.
                if (rotation == candidates[0]) reading = (reading.Results, reading.Score + Orientation.PreferFirstBy);
                if (best is null || reading.Score > best.Value.Score) best = reading;
            }
            catch (InputException e)
            {
                // A wrong turn can split a page into lines over the limits; another reading may still succeed.
                firstProblem ??= e;
            }
        }
        return best?.Results ?? throw firstProblem!;
    }

    /// <summary>The image read as turned <paramref name="rotation"/>°, and the model's mean confidence over its characters.</summary>
    private (IReadOnlyList<LineResult> Results, double Score) ReadAt(GrayImage page, int rotation, string source, string nameForErrors)
    {
        var prepared = Lines.PreparePage(QuarterTurn.Upright(page, rotation), nameForErrors);
        var results = Decode(source, prepared, Run(prepared)).Select(r => r with { RotationDegrees = rotation }).ToArray();
        var chars = results.SelectMany(r => r.Chars).ToArray();
        return (results, chars.Length == 0 ? 0 : chars.Average(c => c.Confidence));
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
