using System.Globalization;
using System.Text.Json.Nodes;

namespace HandLine.Batch;

/// <summary>
/// Combines the summaries of shard runs into the summary an unsharded run would have written: counts add up,
/// measurements combine (earliest start, summed time, largest memory peak), the shard field is cleared, and
/// every other field must agree, or it is reported as a conflict. Field order follows the first summary.
/// </summary>
internal static class SummaryMerge
{
    public static JsonObject Combine(IReadOnlyList<(string Run, JsonObject Summary)> runs, ICollection<string> conflicts)
    {
        ArgumentOutOfRangeException.ThrowIfZero(runs.Count);
        var (firstRun, first) = runs[0];
        var merged = new JsonObject();
        foreach (var (key, value) in first)
        {
            var all = runs.Select(r => r.Summary[key]).ToArray();
            if (RunSummaryFields.Counts.Contains(key))
            {
                long sum = 0;
                for (var i = 0; i < runs.Count; i++)
                {
                    if (all[i] is JsonValue v && v.TryGetValue<long>(out var n)) sum += n;
                    else conflicts.Add($"{runs[i].Run}: summary field '{key}' is {Show(all[i])}, not a whole number");
                }
                merged[key] = sum;
            }
            else if (key == RunSummaryFields.Shard)
                merged[key] = null;
            else if (RunSummaryFields.Measured.Contains(key) || RunSummaryFields.PerMachine.Contains(key))
                merged[key] = value?.DeepClone();
            else
            {
                merged[key] = value?.DeepClone();
                for (var i = 1; i < runs.Count; i++)
                    if (!JsonNode.DeepEquals(value, all[i]))
                        conflicts.Add($"{runs[i].Run}: summary field '{key}' is {Show(all[i])}, but {Show(value)} in {firstRun}");
            }
        }
        foreach (var (run, summary) in runs.Skip(1))
            foreach (var (key, _) in summary)
                if (!first.ContainsKey(key))
                    conflicts.Add($"{run}: summary field '{key}' is missing from {firstRun} (runs made by different builds?)");

        // Measurements over the whole job.
        if (merged.ContainsKey("started_utc"))
            merged["started_utc"] = runs.Select(r => r.Summary["started_utc"]?.GetValue<string>()).OfType<string>().Min(StringComparer.Ordinal);
        if (merged.ContainsKey("elapsed_seconds"))
        {
            var seconds = runs.Sum(r => NumberOrZero(r.Summary["elapsed_seconds"]));
            merged["elapsed_seconds"] = Math.Round(seconds, 3);
            if (merged.ContainsKey("lines_per_second") && merged["lines"] is not null)
                merged["lines_per_second"] = Math.Round(merged["lines"]!.GetValue<long>() / Math.Max(seconds, 1e-9), 2);
        }
        if (merged.ContainsKey("peak_memory_mb"))
            merged["peak_memory_mb"] = runs.Max(r => NumberOrZero(r.Summary["peak_memory_mb"]));
        return merged;
    }

    private static double NumberOrZero(JsonNode? node) => node is JsonValue v && v.TryGetValue<double>(out var d) ? d : 0;

    private static string Show(JsonNode? node) => node?.ToJsonString() ?? "null";

    /// <summary>"K/N" of a summary's shard field, or 0/1 for an unsharded run.</summary>
    public static (int Index, int Count)? ShardOf(JsonObject summary)
    {
        var node = summary[RunSummaryFields.Shard];
        if (node is null) return (0, 1);
        if (node is not JsonValue v || !v.TryGetValue<string>(out var text)) return null;
        try
        {
            var spec = ShardSpec.Parse(text);
            return (spec.Index, spec.Count);
        }
        catch (ArgumentException)
        {
            return null;
        }
    }

    internal static string Format(int index, int count) => string.Create(CultureInfo.InvariantCulture, $"{index}/{count}");
}
