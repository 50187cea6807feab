using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>What the HTML report shows of one scored line beyond its scores: its image file and the machine's confidence.</summary>
public sealed record ReportLineSource(string? ImagePath, double? Confidence)
{
    /// <summary>
    /// Per manifest path: the image the truth manifest names and the run's confidence for that source (the mean of
    /// its lines' confidences when it has several), null where the run has none.
    /// </summary>
    public static IReadOnlyDictionary<string, ReportLineSource> Read(string truthTsv, string runDir)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(truthTsv);
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        var confidence = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var g in RunReader.ReadLines(runDir).Where(l => l.Confidence is not null).GroupBy(l => l.Source, StringComparer.Ordinal))
            if (RelativePaths.TryCanonicalise(g.Key, out var key, out _))
                confidence[key] = g.Average(l => l.Confidence!.Value);
        return Manifest.Read(truthTsv).Entries.ToDictionary(
            e => e.RelativePath,
            e => new ReportLineSource(e.FullPath, confidence.TryGetValue(e.RelativePath, out var c) ? c : null),
            StringComparer.Ordinal);
    }
}
