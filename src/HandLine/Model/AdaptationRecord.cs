using System.Text.Json.Serialization;

namespace HandLine.Model;

/// <summary>
/// What a model adapted to one collection's hand (<c>handline adapt</c>) was adapted on, kept in its header: the
/// run whose corrections taught it, the SHA-256 of the corrections file, how many corrected lines it trained on and
/// how many were held back, the held-back lines' CER (greedy, as training validates) before and after, the general
/// lines replayed beside them, and the settings, so the card says what the model is and how far to trust it.
/// </summary>
public sealed record AdaptationRecord(
    [property: JsonPropertyName("run")] string Run,
    [property: JsonPropertyName("run_model_id")] string RunModelId,
    [property: JsonPropertyName("corrections")] string Corrections,
    [property: JsonPropertyName("corrections_sha256")] string CorrectionsSha256,
    [property: JsonPropertyName("trained_lines")] int TrainedLines,
    [property: JsonPropertyName("held_back_lines")] int HeldBackLines,
    [property: JsonPropertyName("replay_lines")] int ReplayLines,
    [property: JsonPropertyName("held_back_cer_before")] double HeldBackCerBefore,
    [property: JsonPropertyName("held_back_cer_after")] double HeldBackCerAfter,
    [property: JsonPropertyName("settings")] string Settings);
