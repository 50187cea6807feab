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

/// <summary>
/// How a model's temperature was fitted: on which lines, and the calibration before and after. With it, the line
/// threshold chosen on the same lines at that temperature (<c>flag_below</c>: the fewest flagged lines that hold
/// 90 % of the character errors; <c>flag_catches</c> the share of errors it caught there, <c>flag_flags</c> the
/// share of lines it flagged), which <c>transcribe</c> uses when no <c>--flag-below</c> is given: a threshold
/// chosen for one model means little for another, whose confidences are spread differently.
/// </summary>
public sealed record TemperatureRecord(
    [property: JsonPropertyName("lines_data")] string LinesData,
    [property: JsonPropertyName("lines")] int Lines,
    [property: JsonPropertyName("characters")] int Characters,
    [property: JsonPropertyName("decoding")] string Decoding,
    [property: JsonPropertyName("char_ece_before")] double CharEceBefore,
    [property: JsonPropertyName("char_ece_after")] double CharEceAfter,
    [property: JsonPropertyName("fitted_utc")] string FittedUtc,
    [property: JsonPropertyName("flag_below"), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] double? FlagBelow = null,
    [property: JsonPropertyName("flag_catches"), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] double? FlagCatches = null,
    [property: JsonPropertyName("flag_flags"), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] double? FlagFlags = null);

/// <summary>
/// The JSON header of a model file. <see cref="Temperature"/> divides the network's outputs before decoding
/// (absent = 1, as trained; left out of the file then, so older files are written again byte for byte); training
/// resets it, as new weights need a new fit.
/// </summary>
public sealed record ModelHeader(
    [property: JsonPropertyName("format_version")] int FormatVersion,
    [property: JsonPropertyName("charset")] string Charset,
    [property: JsonPropertyName("features")] FeatureConfig Features,
    [property: JsonPropertyName("network")] NetworkConfig Network,
    [property: JsonPropertyName("training")] TrainingRecord? Training,
    [property: JsonPropertyName("validation_cer")] double? ValidationCer,
    [property: JsonPropertyName("created_utc")] string CreatedUtc,
    [property: JsonPropertyName("weights_sha256")] string WeightsSha256 = "",
    [property: JsonPropertyName("temperature"), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] double? Temperature = null,
    [property: JsonPropertyName("temperature_fit"), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] TemperatureRecord? TemperatureFit = null,
    [property: JsonPropertyName("adaptation"), JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] AdaptationRecord? Adaptation = null)
{
    public const int CurrentFormatVersion = 1;
}
