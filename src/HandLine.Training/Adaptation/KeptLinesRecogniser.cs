using HandLine.Imaging;
using HandLine.Recognition;

namespace HandLine.Adaptation;

/// <summary>
/// The adapted model's recogniser for the re-read run, keeping what an editor has checked: a source whose every
/// line is checked is not read at all (its checked lines are its results), and in a page that is read again each
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

    /// <summary>Sources read again by the model (not wholly checked), for the report.</summary>
    public int SourcesRead { get; private set; }

    public IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors)
    {
        if (!_kept.TryGetValue(source, out var kept))
        {
            SourcesRead++;
            return _inner.Read(imageBytes, source, nameForErrors);
        }
        var earlier = _earlier[source];
        if (earlier.All(l => kept.ContainsKey(l.Line)))
            return earlier.Select(l => kept[l.Line]).ToArray();
        SourcesRead++;
        var fresh = _inner.Read(imageBytes, source, nameForErrors);
        if (fresh.Count != earlier.Count)
            return earlier.Select(l => kept.GetValueOrDefault(l.Line) ?? l).ToArray();
        return fresh.Select(l => kept.GetValueOrDefault(l.Line) ?? l).ToArray();
    }
}
