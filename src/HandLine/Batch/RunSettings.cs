using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>What a run computes with, as its summary reports it: the flag threshold, the model and the decoder.</summary>
public sealed record RunSettings(
    double FlagBelow,
    string ModelId,
    string ModelPath,
    string Decoder,
    int? Beam,
    string? Lexicon,
    string? LexiconMode,
    double? LexiconWeight,
    string? Lm,
    double? LmWeight,
    double? CharBonus)
{
    /// <summary>The settings of a recogniser's run; <paramref name="modelPath"/> as given (it is reported in full).</summary>
    public static RunSettings Of(Recogniser recogniser, double flagBelow, string modelPath)
    {
        ArgumentNullException.ThrowIfNull(recogniser);
        var d = recogniser.Decoder.Options;
        return new RunSettings(
            flagBelow,
            recogniser.Model.Id,
            Path.GetFullPath(modelPath),
            recogniser.Decoder.Name,
            d.UsesBeam ? d.Beam : null,
            d.Lexicon?.Source,
            d.Lexicon is null ? null : d.LexiconPenalty is null ? "strict" : "soft",
            d.LexiconPenalty,
            d.LanguageModel?.Source,
            d.LanguageModel is null ? null : d.LmWeight,
            d.UsesBeam ? d.CharBonus : null);
    }
}
