using System.Globalization;
using HandLine.Scoring;

namespace HandLine.Training;

/// <summary>
/// Validation CER (greedy decoding, over NFC code points, pooled over all lines) and, when the validation lines
/// carry styles, the same lines split by style group and by family, so one unreadable style cannot hide
/// behind a good pooled figure.
/// </summary>
/// <param name="ByGroup">Null unless some validation line has a group.</param>
/// <param name="ByFamily">Null unless some validation line has a family.</param>
public sealed record ValidationResult(double Cer, ScoreBreakdown? ByGroup, ScoreBreakdown? ByFamily)
{
    /// <summary>The family with the highest CER, or null without families.</summary>
    public ScoreGroup? WorstFamily => ByFamily?.Worst;

    /// <summary>
    /// The epoch report's line on styles: CER per group, then the worst family with its CER beside the plain
    /// mean over families; null when the lines carry no styles.
    /// </summary>
    public string? StylesLine()
    {
        if (ByGroup is null && ByFamily is null) return null;
        var parts = new List<string>();
        if (ByGroup is { } groups)
            parts.Add("by group " + string.Join(", ", groups.Groups.Select(g => string.Create(CultureInfo.InvariantCulture, $"{Label(g.Value)} {g.Cer:P2}"))));
        if (ByFamily is { Worst: { } worst } families)
            parts.Add(string.Create(CultureInfo.InvariantCulture,
                $"worst family {Label(worst.Value)} {worst.Cer:P2} (of {families.Groups.Count} families, mean {families.MeanCer:P2})"));
        return "  validation CER " + string.Join("; ", parts);
    }

    private static string Label(string value) => value.Length == 0 ? "(none)" : value;
}
