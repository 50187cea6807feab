using HandLine.Proof;

namespace HandLine.Review;

/// <summary>
/// Finds the images of a run's lines under the folder its sources are relative to (a run folder does not record
/// it: the <c>--images</c> of <c>sample</c>, <c>review</c> and <c>correct</c>), cutting page lines as
/// <c>sample</c> does. A page is cut once however many of its lines are asked for.
/// </summary>
internal sealed class LineImages
{
    private readonly string _root;
    private readonly IReadOnlyDictionary<string, int> _linesPerSource;
    private (string Source, byte[][]? Lines)? _lastPage;

    /// <param name="imagesRoot">The folder given to <c>transcribe</c>, or its manifest's folder.</param>
    /// <param name="records">Every record of the run, so that a source's line count is known.</param>
    public LineImages(string imagesRoot, IEnumerable<RunRecord> records)
    {
        _root = imagesRoot;
        _linesPerSource = records.GroupBy(r => r.Source, StringComparer.Ordinal)
            .ToDictionary(g => g.Key, g => g.Count(), StringComparer.Ordinal);
    }

    /// <summary>Where the source's image should be.</summary>
    public string PathOf(string source) => Path.Combine(_root, source);

    /// <summary>The line's image, or null when its file is missing or unreadable.</summary>
    public LineImage? Find(RunRecord record)
    {
        var path = PathOf(record.Source);
        if (!File.Exists(path))
            return null;
        var extension = Path.GetExtension(path).ToLowerInvariant();
        var lines = _linesPerSource.GetValueOrDefault(record.Source, 1);
        // A turned image is shown upright, as it was read (a run made before rotation_deg existed has none).
        var rotation = record.Fields["rotation_deg"] is System.Text.Json.Nodes.JsonValue v && v.TryGetValue<int>(out var r) ? r : 0;
        try
        {
            if (lines <= 1 && rotation == 0)
                return new LineImage(File.ReadAllBytes(path), extension, WholePage: false);
            if (_lastPage?.Source != record.Source)
                _lastPage = (record.Source, LineCrops.TryCutAll(path, lines, rotation));
            return _lastPage.Value.Lines is { } cut && record.Line < cut.Length
                ? new LineImage(cut[record.Line], ".png", WholePage: false)
                : new LineImage(File.ReadAllBytes(path), extension, WholePage: true);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            return null;
        }
    }
}
