using System.Text.Json.Nodes;
using System.Text.Json.Serialization;
using HandLine.Recognition;

namespace HandLine.Batch.Journal;

/// <summary>
/// One line of a run journal. <see cref="Kind"/> says which fields are set:
/// "done" (a source read to completion: its key and its lines), "error" (an input that could not be read)
/// and "end" (the run's summary; the last record of a completed run). <see cref="Order"/> places the record in
/// the reports: input errors get negative numbers in their order, sources their index in the full, unsharded
/// input list, so shard journals can be merged back into the order of an unsharded run.
/// </summary>
internal sealed record JournalRecord
{
    public const string Done = "done";
    public const string Error = "error";
    public const string End = "end";

    [JsonPropertyName("kind")] public required string Kind { get; init; }
    [JsonPropertyName("order")] public long Order { get; init; }
    [JsonPropertyName("source")] public string? Source { get; init; }
    [JsonPropertyName("image_sha256")] public string? ImageSha256 { get; init; }
    [JsonPropertyName("model_id")] public string? ModelId { get; init; }
    [JsonPropertyName("options_hash")] public string? OptionsHash { get; init; }
    [JsonPropertyName("lines")] public IReadOnlyList<LineResult>? Lines { get; init; }
    [JsonPropertyName("path")] public string? Path { get; init; }
    [JsonPropertyName("stage")] public string? Stage { get; init; }
    [JsonPropertyName("reason")] public string? Reason { get; init; }
    [JsonPropertyName("summary")] public JsonObject? Summary { get; init; }

    public static JournalRecord ForError(long order, InputException e) =>
        new() { Kind = Error, Order = order, Path = e.Path, Stage = e.Stage, Reason = e.Reason };

    public InputException ToInputException() => new(Path ?? "", Stage ?? "", Reason ?? "");

    /// <summary>The key under which a "done" record can be reused: same source, same bytes, same model, same options.</summary>
    public static string ReuseKey(string source, string imageSha256, string modelId, string optionsHash) =>
        string.Join('\n', source, imageSha256, modelId, optionsHash);

    /// <summary>Whether the fields a record of its kind needs are present.</summary>
    public bool IsWellFormed => Kind switch
    {
        Done => !string.IsNullOrEmpty(Source) && !string.IsNullOrEmpty(ImageSha256) && !string.IsNullOrEmpty(ModelId)
                && !string.IsNullOrEmpty(OptionsHash) && Lines is not null && Lines.All(l => l is not null && l.Source == Source),
        Error => Path is not null && !string.IsNullOrEmpty(Stage) && Reason is not null,
        End => Summary is not null,
        _ => false,
    };
}
