namespace HandLine.Batch;

/// <summary>
/// How each field of summary.json combines when shard runs are merged. Fields not listed here must be equal in
/// every shard (settings, model id, fingerprints), and a difference is a merge conflict.
/// </summary>
public static class RunSummaryFields
{
    public const string Shard = "shard";
    public const string OptionsHash = "options_hash";
    public const string InputsHash = "inputs_hash";
    public const string Cancelled = "cancelled";

    /// <summary>Counts: the merged value is the sum.</summary>
    public static readonly IReadOnlySet<string> Counts = new HashSet<string>(StringComparer.Ordinal)
    {
        "sources", "sources_done", "lines", "flagged", "errors",
    };

    /// <summary>
    /// Measurements of one process (time, speed, memory): they differ from run to run, so comparisons of
    /// runs ignore them. Merged: earliest start, summed time, speed from the sums, largest memory peak.
    /// </summary>
    public static readonly IReadOnlySet<string> Measured = new HashSet<string>(StringComparer.Ordinal)
    {
        "started_utc", "elapsed_seconds", "lines_per_second", "peak_memory_mb",
    };

    /// <summary>Facts of the machine a shard ran on, which may differ between shards: the merge keeps the first.</summary>
    public static readonly IReadOnlySet<string> PerMachine = new HashSet<string>(StringComparer.Ordinal)
    {
        "model_path",
    };
}
