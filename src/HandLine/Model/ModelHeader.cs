using System.Text.Json.Serialization;
using HandLine.Features;

namespace HandLine.Model;

/// <summary>What was done to make a model; kept in its file so results can be traced to a recipe.</summary>
public sealed record TrainingRecord(
    [property: JsonPropertyName("command")] string Command,
    [property: JsonPropertyName("train_data")] IReadOnlyList<string> TrainData,
    [property: JsonPropertyName("valid_data")] string? ValidData,
    [property: JsonPropertyName("seed")] int Seed,
    [property: JsonPropertyName("epochs")] int Epochs,
    [property: JsonPropertyName("lines_seen")] long LinesSeen,
    [property: JsonPropertyName("minutes")] double Minutes,
    [property: JsonPropertyName("from_model")] string? FromModel);

/// <summary>The JSON header of a model file.</summary>
public sealed record ModelHeader(
    [property: JsonPropertyName("format_version")] int FormatVersion,
    [property: JsonPropertyName("charset")] string Charset,
    [property: JsonPropertyName("features")] FeatureConfig Features,
    [property: JsonPropertyName("network")] NetworkConfig Network,
    [property: JsonPropertyName("training")] TrainingRecord? Training,
    [property: JsonPropertyName("validation_cer")] double? ValidationCer,
    [property: JsonPropertyName("created_utc")] string CreatedUtc,
    [property: JsonPropertyName("weights_sha256")] string WeightsSha256 = "",
    [property: JsonPropertyName("adaptation"), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] AdaptationRecord? Adaptation = null)
{
    public const int CurrentFormatVersion = 1;
}
