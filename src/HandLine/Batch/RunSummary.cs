using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Nodes;
using System.Text.Json.Serialization;

namespace HandLine.Batch;

/// <summary>
/// summary.json: what a run did, with what, and what it cost. Written by <see cref="BatchRunner"/> (and by
/// <see cref="RunMerge"/> for merged shards), closing the run's journal too, and read back through this same type
/// by <c>merge</c> and <c>bench-batch</c>. The file's field order is the order of the properties here.
/// Fields fall into four kinds, which decide how shard summaries merge (<see cref="SummaryMerge"/>): counts (summed),
/// measurements of one process (<see cref="Measurements"/>: combined, and ignored when runs are compared), facts
/// of the machine (<see cref="ModelPath"/>: the first kept), the shard (cleared), and everything else, which
/// must agree between shards.
/// </summary>
public sealed record RunSummary
{
    /// <summary>How summary.json is written: indented, with transcripts' symbols (£, ½) kept readable.</summary>
    public static readonly JsonSerializerOptions Json = new()
    {
        WriteIndented = true,
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        RespectNullableAnnotations = true,
    };

    /// <summary>The JSON names of the measurement fields, which differ from run to run.</summary>
    public static readonly IReadOnlyList<string> Measurements = ["started_utc", "elapsed_seconds", "lines_per_second", "peak_memory_mb"];

    // Counts (merged: summed).
    [JsonPropertyName("sources")] public required int Sources { get; init; }
    [JsonPropertyName("sources_done")] public required int SourcesDone { get; init; }
    [JsonPropertyName("lines")] public required int Lines { get; init; }
    [JsonPropertyName("flagged")] public required int Flagged { get; init; }
    [JsonPropertyName("errors")] public required int Errors { get; init; }

    // Settings (must agree between shards), from RunSettings; model_path is a fact of the machine.
    [JsonPropertyName("flag_below")] public required double FlagBelow { get; init; }
    [JsonPropertyName("model_id")] public required string ModelId { get; init; }
    [JsonPropertyName("model_path")] public required string ModelPath { get; init; }
    [JsonPropertyName("decoder")] public required string Decoder { get; init; }
    [JsonPropertyName("beam")] public required int? Beam { get; init; }
    [JsonPropertyName("lexicon")] public required string? Lexicon { get; init; }
    [JsonPropertyName("lexicon_mode")] public required string? LexiconMode { get; init; }
    [JsonPropertyName("lexicon_weight")] public required double? LexiconWeight { get; init; }
    [JsonPropertyName("lm")] public required string? Lm { get; init; }
    [JsonPropertyName("lm_weight")] public required double? LmWeight { get; init; }
    [JsonPropertyName("char_bonus")] public required double? CharBonus { get; init; }

    // Measurements (merged: earliest start, summed time, speed from the sums).
    [JsonPropertyName("started_utc")] public required string StartedUtc { get; init; }
    [JsonPropertyName("elapsed_seconds")] public required double ElapsedSeconds { get; init; }
    [JsonPropertyName("lines_per_second")] public required double LinesPerSecond { get; init; }

    [JsonPropertyName("cancelled")] public required bool Cancelled { get; init; }

    /// <summary>"K/N" for a shard run, null for a whole one.</summary>
    [JsonPropertyName("shard")] public required string? Shard { get; init; }

    [JsonPropertyName("options_hash")] public required string OptionsHash { get; init; }

    /// <summary>Fingerprint of the full input list, so a merge can tell that its shards listed the same inputs.</summary>
    [JsonPropertyName("inputs_hash")] public required string InputsHash { get; init; }

    /// <summary>Largest resident memory of the process, in MB (merged: the largest).</summary>
    [JsonPropertyName("peak_memory_mb")] public required double PeakMemoryMb { get; init; }

    /// <summary>A summary from a run's counts and settings and the runner's own facts.</summary>
    public static RunSummary Of(BatchCounts counts, RunSettings settings, DateTime startedUtc, double seconds,
        string? shard, string optionsHash, string inputsHash, double peakMemoryMb)
    {
        ArgumentNullException.ThrowIfNull(counts);
        ArgumentNullException.ThrowIfNull(settings);
        return new RunSummary
        {
            Sources = counts.Sources,
            SourcesDone = counts.Done,
            Lines = counts.Lines,
            Flagged = counts.Flagged,
            Errors = counts.Errors,
            FlagBelow = settings.FlagBelow,
            ModelId = settings.ModelId,
            ModelPath = settings.ModelPath,
            Decoder = settings.Decoder,
            Beam = settings.Beam,
            Lexicon = settings.Lexicon,
            LexiconMode = settings.LexiconMode,
            LexiconWeight = settings.LexiconWeight,
            Lm = settings.Lm,
            LmWeight = settings.LmWeight,
            CharBonus = settings.CharBonus,
            StartedUtc = startedUtc.ToString("O"),
            ElapsedSeconds = Math.Round(seconds, 3),
            LinesPerSecond = Math.Round(counts.Lines / Math.Max(seconds, 1e-9), 2),
            Cancelled = counts.Cancelled,
            Shard = shard,
            OptionsHash = optionsHash,
            InputsHash = inputsHash,
            PeakMemoryMb = peakMemoryMb,
        };
    }

    /// <summary>summary.json's text.</summary>
    public string ToJson() => JsonSerializer.Serialize(this, Json) + "\n";

    /// <summary>As the journal stores it.</summary>
    public JsonObject ToJsonObject() => JsonSerializer.SerializeToNode(this, Json)!.AsObject();

    /// <summary>Reads a summary back; a field missing or of the wrong type is a <see cref="JsonException"/>.</summary>
    public static RunSummary FromJson(JsonNode node) =>
        node.Deserialize<RunSummary>(Json) ?? throw new JsonException("the summary is empty");

    /// <summary>Reads a run folder's summary.json.</summary>
    /// <exception cref="InputException">The file is missing, unreadable or not a summary this build writes.</exception>
    public static RunSummary Read(string path)
    {
        var bytes = InputFile.ReadAllBytes(path, "summary", "run summary");
        try
        {
            return JsonSerializer.Deserialize<RunSummary>(bytes, Json) ?? throw new JsonException("the summary is empty");
        }
        catch (JsonException e)
        {
            throw new InputException(path, "summary", $"not a run summary this build can read: {e.Message}", e);
        }
    }
}
