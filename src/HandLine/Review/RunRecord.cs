using System.Text.Json.Nodes;

namespace HandLine.Review;

/// <summary>
/// One record of a run's <c>lines.jsonl</c>, kept whole: <see cref="Raw"/> is its text as read (written back
/// unchanged when the record is not corrected) and <see cref="Fields"/> every field, so a correction changes only
/// the fields it means to.
/// </summary>
public sealed record RunRecord(string Raw, JsonObject Fields, string Source, int Line)
{
    /// <summary>The text the run holds now: the corrected text once a correction is applied.</summary>
    public string Text => Fields["text"]?.GetValue<string>() ?? "";

    /// <summary>The machine's own reading: kept beside the corrected text, or the text itself while uncorrected.</summary>
    public string MachineText => Fields[RunRecordFields.MachineText]?.GetValue<string>() ?? Text;

    public bool Corrected => Fields[RunRecordFields.Corrected]?.GetValue<bool>() ?? false;

    public bool Illegible => Fields[RunRecordFields.Illegible]?.GetValue<bool>() ?? false;

    public bool Flagged => Fields["flagged"]?.GetValue<bool>() ?? false;

    /// <summary>The line's confidence; 0 when the record has none, so such lines come first in review.</summary>
    public double Confidence => Fields["confidence"] is JsonValue v && v.TryGetValue<double>(out var c) ? c : 0;
}
