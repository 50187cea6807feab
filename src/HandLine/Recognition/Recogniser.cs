using HandLine.Decoding;
using HandLine.Features;
using HandLine.Imaging;
using HandLine.Layout;
using HandLine.Model;

namespace HandLine.Recognition;

/// <summary>
/// One image's bytes to its line results, through every stage in order: <see cref="Prepare"/> (load, turn upright as
/// the ink suggests (<see cref="OrientationOptions"/>), find lines, normalise, features: <see cref="LinePreparer"/>) →
/// <see cref="Run"/> (the network, <see cref="LineModel.RunInLanes"/>) → <see cref="Decode"/> (<see cref="LineDecoder"/>
/// → <see cref="LineResult"/>) → <see cref="Settle"/> (an unsure reading compared with the image's other way up);
/// <see cref="Read"/> is the four in a row. Made once from a model, the input limits and the decoding options; the model alone fixes how lines are
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

    /// <summary>How images are taken: as lines, as whole pages, or decided per image (the default).</summary>
    public LayoutMode Layout { get; init; } = LayoutMode.Auto;

    public InputLimits Limits => Lines.Limits;

    /// <summary>The one entry point: an image file's bytes to the results of its lines, top to bottom.</summary>
    /// <param name="source">The source's name in the reports.</param>
    /// <param name="nameForErrors">Named in any <see cref="InputException"/> (normally the file's path).</param>
    public IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors)
    {
        ArgumentNullException.ThrowIfNull(imageBytes);
        ArgumentNullException.ThrowIfNull(source);
        var prepared = Prepare(imageBytes, nameForErrors);
        return Settle(imageBytes, source, nameForErrors, Decode(source, prepared, Run(prepared)));
    }

    /// <summary>
    /// Stages 1 to 4 for one image (see <see cref="LinePreparer.PreparePage"/>), turned to the fixed rotation or to
    /// the ink cue's first candidate; safe to call from several threads.
    /// </summary>
    public IReadOnlyList<PreparedLine> Prepare(byte[] imageBytes, string nameForErrors)
    {
        ArgumentNullException.ThrowIfNull(imageBytes);
        ArgumentNullException.ThrowIfNull(nameForErrors);
        var page = Lines.Load(imageBytes, nameForErrors);
        if (Orientation.Fixed is { } fixedRotation) return PrepareAt(page, fixedRotation, nameForErrors);
        var candidates = Candidates(page);
        InputException? firstProblem = null;
        foreach (var rotation in candidates)
        {
            try
            {
                return PrepareAt(page, rotation, nameForErrors);
            }
            catch (InputException e)
            {
                // A wrong turn can split a page into lines over the limits; another reading may still succeed.
                firstProblem ??= e;
            }
        }
        throw firstProblem!;
    }

    /// <summary>
    /// With rotation detection on: an image whose first reading is not confident enough is read the other ways the
    /// ink cue left open, and the most confident reading is kept (the first with its margin). Reads the network, so
    /// one thread at a time, like <see cref="Run"/>. Returns <paramref name="first"/> when nothing needs comparing.
    /// </summary>
    public IReadOnlyList<LineResult> Settle(byte[] imageBytes, string source, string nameForErrors, IReadOnlyList<LineResult> first)
    {
        ArgumentNullException.ThrowIfNull(imageBytes);
        ArgumentNullException.ThrowIfNull(first);
        if (Orientation.Fixed is not null || first.Count == 0) return first;
        var firstScore = Score(first);
        if (firstScore >= Orientation.CheckBelow) return first;
        var page = Lines.Load(imageBytes, nameForErrors);
        var firstRotation = first[0].RotationDegrees;
        // The first reading competes with its margin added.
        var best = (Results: first, Score: firstScore + Orientation.PreferFirstBy);
        foreach (var rotation in Candidates(page).Where(r => r != firstRotation))
        {
            try
            {
                var prepared = PrepareAt(page, rotation, nameForErrors);
                var results = Decode(source, prepared, Run(prepared));
                var score = Score(results);
                if (score > best.Score) best = (results, score);
            }
            catch (InputException)
            {
                // This way up does not even give lines within the limits: the reading already made stands.
            }
        }
        return best.Results;
    }

    /// <summary>
    /// The rotations worth reading, in order: the ink cue's axis first (<see cref="OrientationEstimator"/>), both of
    /// its readings; all four when the cue is unsure; upright only when there is no ink (the blank image is then
    /// reported as it always has been); for an image taken as a whole page, the two readings of the page cue's axis
    /// (<see cref="LinePreparer.GuessPageAxis"/>), upright and upside down when it is unsure.
    /// </summary>
    private int[] Candidates(GrayImage page)
    {
        // The line cue measures bands of ink; a ruled page's rules and columns mislead it, and read across, a page
        // gives short scraps that can outscore the real reading, so the model never chooses a page's axis: the page
        // cue does, measured on the writing with the rules taken off.
        if (Lines.TakesAsPageEitherWay(page, Layout))
            return Lines.GuessPageAxis(page)?.Axis(Orientation.SurePageSpread, Orientation.SurePageRhythm) == -1 ? [90, 270] : [0, 180];
        if (OrientationEstimator.Guess(page, Lines.Tuning) is not { } guess) return [0];
        return guess.AxisMargin >= Orientation.SureAxisMargin ? [0, 180]
            : guess.AxisMargin <= -Orientation.SureAxisMargin ? [90, 270]
            : guess.AxisMargin >= 0 ? [0, 180, 90, 270] : [90, 270, 0, 180];
    }

    /// <summary>The image read turned upright from <paramref name="rotation"/>; a page line's box is mapped back into the image's own pixels.</summary>
    private IReadOnlyList<PreparedLine> PrepareAt(GrayImage page, int rotation, string nameForErrors)
    {
        var upright = QuarterTurn.Upright(page, rotation);
        return Lines.PrepareImage(upright, nameForErrors, Layout)
            .Select(p => p with
            {
                RotationDegrees = rotation,
                Box = p.Box is { } box ? QuarterTurn.TurnBox(box, upright.Width, upright.Height, rotation) : null,
            })
            .ToArray();
    }

    /// <summary>The model's mean confidence over a reading's characters.</summary>
    private static double Score(IReadOnlyList<LineResult> results)
    {
        var chars = results.SelectMany(r => r.Chars).ToArray();
        return chars.Length == 0 ? 0 : chars.Average(c => c.Confidence);
    }

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
            {
                Alternatives = h.Alternatives,
                RotationDegrees = lines[i].RotationDegrees,
                Layout = lines[i].Layout,
                Box = lines[i].Box?.ToArray(),
                Column = lines[i].Column,
                Entry = lines[i].Entry,
            };
        }
        return results;
    }
}
