using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;
using HandLine.Recognition;

namespace HandLine.Adaptation;

/// <summary>
/// The adapted model's recogniser for the re-read run, keeping what an editor has checked: a source whose every
/// line is checked keeps its checked lines as its results, and in a page that is read again each
/// checked line keeps its record. Should the page now split into a different number of lines, the old lines
/// cannot be matched to the new ones, and the whole page keeps the earlier run's lines.
/// </summary>
internal sealed class KeptLinesRecogniser : IImageRecogniser
{
    private readonly IImageRecogniser _inner;
    private readonly IReadOnlyDictionary<string, IReadOnlyDictionary<int, LineResult>> _kept;
    private readonly IReadOnlyDictionary<string, IReadOnlyList<LineResult>> _earlier;

    /// <param name="kept">Per source, the checked lines by index.</param>
    /// <param name="earlier">Per source with a checked line, all its lines as the earlier run left them.</param>
    public KeptLinesRecogniser(IImageRecogniser inner, IReadOnlyDictionary<string, IReadOnlyDictionary<int, LineResult>> kept,
        IReadOnlyDictionary<string, IReadOnlyList<LineResult>> earlier)
    {
        _inner = inner;
        _kept = kept;
        _earlier = earlier;
    }

    public InputLimits Limits => _inner.Limits;

    private int _sourcesRead;

    /// <summary>Sources read again by the model (not wholly checked), for the report.</summary>
    public int SourcesRead => Volatile.Read(ref _sourcesRead);

    public IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors) =>
        Keep(source, () => _inner.Read(imageBytes, source, nameForErrors));

    // The batch runner's stages: a wholly checked source is still prepared and run (its results are then
    // replaced), which costs a little time and keeps this wrapper out of the runner's scheduling.
    public IReadOnlyList<PreparedLine> Prepare(byte[] imageBytes, string nameForErrors) => _inner.Prepare(imageBytes, nameForErrors);

    public IReadOnlyList<Posteriors> Run(IReadOnlyList<PreparedLine> lines) => _inner.Run(lines);

    public IReadOnlyList<LineResult> Decode(string source, IReadOnlyList<PreparedLine> lines, IReadOnlyList<Posteriors> posteriors) =>
        Keep(source, () => _inner.Decode(source, lines, posteriors));

    /// <summary>A source with checked lines keeps the rotation it was checked at; the others get the usual second look.</summary>
    public IReadOnlyList<LineResult> Settle(byte[] imageBytes, string source, string nameForErrors, IReadOnlyList<LineResult> first) =>
        _kept.ContainsKey(source) ? first : _inner.Settle(imageBytes, source, nameForErrors, first);

    private IReadOnlyList<LineResult> Keep(string source, Func<IReadOnlyList<LineResult>> read)
    {
        if (!_kept.TryGetValue(source, out var kept))
        {
            Interlocked.Increment(ref _sourcesRead);
            return read();
        }
        var earlier = _earlier[source];
        if (earlier.All(l => kept.ContainsKey(l.Line)))
            return earlier.Select(l => kept[l.Line]).ToArray();
        Interlocked.Increment(ref _sourcesRead);
        var fresh = read();
        if (fresh.Count != earlier.Count)
            return earlier.Select(l => kept.GetValueOrDefault(l.Line) ?? l).ToArray();
        return fresh.Select(l => kept.GetValueOrDefault(l.Line) ?? l).ToArray();
    }
}
