using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>
/// What a scored proof sample says beyond its point CER: 95 % bootstrap intervals for CER and WER (overall and per
/// group of every breakdown), the verdict against a threshold, the design effect of the sample, and its character
/// confusions.
/// </summary>
public sealed class ProofAnalysis
{
    private ProofAnalysis(ProofOptions options, ConfidenceInterval cer, ConfidenceInterval wer,
        IReadOnlyDictionary<(string Key, string Value), ConfidenceInterval> groups, double designEffect,
        IReadOnlyList<Confusion> confusions)
    {
        Options = options;
        CerInterval = cer;
        WerInterval = wer;
        GroupCerIntervals = groups;
        DesignEffect = designEffect;
        Confusions = confusions;
        Verdict = options.MaxCer is { } max ? Acceptance.Decide(cer, max) : null;
    }

    public ProofOptions Options { get; }

    public ConfidenceInterval CerInterval { get; }

    public ConfidenceInterval WerInterval { get; }

    /// <summary>CER interval of each group, by breakdown key and group value.</summary>
    public IReadOnlyDictionary<(string Key, string Value), ConfidenceInterval> GroupCerIntervals { get; }

    /// <summary>Null when no threshold was given.</summary>
    public AcceptanceVerdict? Verdict { get; }

    /// <summary>See <see cref="Proof.DesignEffect"/>.</summary>
    public double DesignEffect { get; }

    /// <summary>Every distinct character error, most frequent first.</summary>
    public IReadOnlyList<Confusion> Confusions { get; }

    /// <summary>
    /// Analyses a report. <paramref name="groupOf"/> gives, per breakdown key, each line's group value in the
    /// report's line order (as the breakdown was built), so each group's interval resamples its own lines.
    /// </summary>
    public static ProofAnalysis Of(ScoreReport report, ProofOptions options,
        IReadOnlyDictionary<string, IReadOnlyList<string>>? groupOf = null)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        var chars = report.PerLine.Select(l => l.CharCounts).ToArray();
        var words = report.PerLine.Select(l => l.WordCounts).ToArray();
        var groups = new Dictionary<(string, string), ConfidenceInterval>();
        foreach (var (key, values) in groupOf ?? new Dictionary<string, IReadOnlyList<string>>())
        {
            if (values.Count != chars.Length)
                throw new ArgumentException($"The groups of '{key}' do not match the report's lines.", nameof(groupOf));
            foreach (var g in Enumerable.Range(0, chars.Length).GroupBy(i => values[i], StringComparer.Ordinal))
                groups[(key, g.Key)] = BootstrapInterval.Of(g.Select(i => chars[i]).ToArray(), options.Resamples, options.Seed);
        }
        return new ProofAnalysis(options,
            BootstrapInterval.Of(chars, options.Resamples, options.Seed),
            BootstrapInterval.Of(words, options.Resamples, options.Seed),
            groups,
            Proof.DesignEffect.Estimate(chars),
            ConfusionTable.Of(report.PerLine));
    }
}
