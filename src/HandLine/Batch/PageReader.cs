using HandLine.Decoding;
using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;

namespace HandLine.Batch;

/// <summary>
/// Reads one image: finds its text lines, normalises each, runs the model on all of them as one batch and
/// decodes. Lines without ink are left out; an image with no ink at all is an error.
/// </summary>
public sealed class PageReader
{
    private readonly LineModel _model;
    private readonly ImagingOptions _imaging;
    private readonly double _flagBelow;
    private readonly LineDecoder _decoder;

    /// <param name="decoding">How to decode; null means <see cref="DecodingOptions"/>' defaults.</param>
    /// <exception cref="InputException">The lexicon has a word the model cannot write.</exception>
    public PageReader(LineModel model, ImagingOptions limits, double flagBelow, DecodingOptions? decoding = null)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(limits);
        if (flagBelow is < 0 or > 1) throw new ArgumentOutOfRangeException(nameof(flagBelow), "must be within [0, 1]");
        _model = model;
        _imaging = LinePreparation.ImagingFor(model.Features, limits);
        _flagBelow = flagBelow;
        _decoder = new LineDecoder(model.Charset, decoding ?? new DecodingOptions());
    }

    public LineDecoder Decoder => _decoder;

    public ImagingOptions Imaging => _imaging;

    public IReadOnlyList<LineResult> Read(SourceImage source) => Read(source, ImageLoader.ReadFile(source.FullPath, _imaging));

    /// <summary>Reads an image whose file the caller has already read (the batch hashes the same bytes).</summary>
    public IReadOnlyList<LineResult> Read(SourceImage source, byte[] imageBytes)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(imageBytes);
        var page = ImageLoader.Load(imageBytes, source.FullPath, _imaging);
        var prepared = LineFinder.Split(page, _imaging)
            .Select(region => LinePreparation.Prepare(region.Image, _model.Features, _imaging))
            .Where(p => p.Line.HasInk)
            .ToArray();
        if (prepared.Length == 0)
            throw new InputException(source.FullPath, "normalise", "no ink found: the image looks blank");

        var posteriors = _model.Run(prepared.Select(p => p.Features).ToArray());
        var results = new LineResult[prepared.Length];
        for (var i = 0; i < prepared.Length; i++)
        {
            var h = _decoder.Decode(posteriors[i]);
            results[i] = new LineResult(source.Source, i, h.Text, h.Confidence, h.Confidence < _flagBelow, h.Chars,
                prepared[i].Line.DeskewDegrees, prepared[i].Line.SlantDegrees) { Alternatives = h.Alternatives };
        }
        return results;
    }
}
