using System.Globalization;
using System.Text.Json.Nodes;

namespace HandLine.Batch;

/// <summary>
/// Combines the summaries of shard runs into the summary an unsharded run would have written: counts add up,
/// measurements combine (earliest start, summed time, largest memory peak), the first model path is kept, the
/// shard field is cleared, and every other field must agree, or it is reported as a conflict.
/// </summary>
internal static class SummaryMerge
{
    public static RunSummary Combine(IReadOnlyList<(string Run, RunSummary Summary)> runs, ICollection<string> conflicts)
    {
        ArgumentOutOfRangeException.ThrowIfZero(runs.Count);
        var (firstRun, first) = runs[0];
        var agreed = MustAgree(first);
        foreach (var (run, summary) in runs.Skip(1))
        {
            // Field by field through the JSON form, so a conflict names the field as summary.json does.
            var other = MustAgree(summary);
            foreach (var (key, value) in agreed)
                if (!JsonNode.DeepEquals(value, other[key]))
                    conflicts.Add($"{run}: summary field '{key}' is {Show(other[key])}, but {Show(value)} in {firstRun}");
        }

        var seconds = runs.Sum(r => r.Summary.ElapsedSeconds);
        var lines = runs.Sum(r => r.Summary.Lines);
        return first with
        {
            Sources = runs.Sum(r => r.Summary.Sources),
            SourcesDone = runs.Sum(r => r.Summary.SourcesDone),
            Lines = lines,
            Flagged = runs.Sum(r => r.Summary.Flagged),
            Errors = runs.Sum(r => r.Summary.Errors),
            StartedUtc = runs.Select(r => r.Summary.StartedUtc).Min(StringComparer.Ordinal)!,
            ElapsedSeconds = Math.Round(seconds, 3),
            LinesPerSecond = Math.Round(lines / Math.Max(seconds, 1e-9), 2),
            PeakMemoryMb = runs.Max(r => r.Summary.PeakMemoryMb),
            Shard = null,
        };
    }

    /// <summary>The fields that must be equal in every shard: all but counts, measurements, model path and shard.</summary>
    private static JsonObject MustAgree(RunSummary s) => (s with
    {
        Sources = 0,
        SourcesDone = 0,
        Lines = 0,
        Flagged = 0,
        Errors = 0,
        ModelPath = "",
        StartedUtc = "",
        ElapsedSeconds = 0,
        LinesPerSecond = 0,
        PeakMemoryMb = 0,
        Shard = null,
    }).ToJsonObject();

    private static string Show(JsonNode? node) => node?.ToJsonString() ?? "null";

    /// <summary>"K/N" of a summary's shard field, or 0/1 for an unsharded run; null when it is not of that form.</summary>
    public static (int Index, int Count)? ShardOf(RunSummary summary)
    {
        if (summary.Shard is null) return (0, 1);
        try
        {
            var spec = ShardSpec.Parse(summary.Shard);
            return (spec.Index, spec.Count);
        }
        catch (ArgumentException)
        {
            return null;
        }
    }

    internal static string Format(int index, int count) => string.Create(CultureInfo.InvariantCulture, $"{index}/{count}");
}
