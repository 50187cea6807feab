namespace HandLine.Synthesis;

/// <summary>
/// Shares of each <see cref="TextSource"/> in a <see cref="TextMixture"/> and the limits of its lines. The
/// defaults: phrases 35 %, words 25 %, capitals 12 %, capitalised words 10 %, random characters 6 %,
/// figures 12 %. The phrase templates are kept under half so that the network cannot learn their grammar as
/// a language model of its own; the other shares are choices, not measurements (no source).
/// </summary>
public sealed record TextMixtureOptions
{
    public double PhraseShare { get; init; } = 0.35;
    public double WordsShare { get; init; } = 0.25;
    public double CapitalsShare { get; init; } = 0.12;
    public double TitledShare { get; init; } = 0.10;
    public double CharactersShare { get; init; } = 0.06;
    public double FiguresShare { get; init; } = 0.12;

    /// <summary>Word lines aim at a length drawn evenly between these (characters), like the phrase lines.</summary>
    public int MinLength { get; init; } = 12;

    public int MaxLength { get; init; } = 48;

    /// <summary>Random character lines are this long (characters, spaces included).</summary>
    public int MinCharacters { get; init; } = 4;

    public int MaxCharacters { get; init; } = 30;

    /// <summary>A word list larger than this is refused (Debian's British English list is about 1 MB).</summary>
    public long MaxWordListBytes { get; init; } = 64L << 20;

    public double ShareOf(TextSource source) => source switch
    {
        TextSource.Phrase => PhraseShare,
        TextSource.Words => WordsShare,
        TextSource.Capitals => CapitalsShare,
        TextSource.Titled => TitledShare,
        TextSource.Characters => CharactersShare,
        TextSource.Figures => FiguresShare,
        _ => throw new ArgumentOutOfRangeException(nameof(source), source, "Unknown text source."),
    };

    /// <summary>Throws ArgumentException unless every share is in [0, 1], they sum to 1 and the limits make sense.</summary>
    public void Validate()
    {
        var sum = 0.0;
        foreach (var source in Enum.GetValues<TextSource>())
        {
            var share = ShareOf(source);
            if (!(share is >= 0 and <= 1))
                throw new ArgumentException($"The {source} share must be between 0 and 1, not {share}.");
            sum += share;
        }
        // Shares are written as decimals, so allow for binary rounding.
        if (Math.Abs(sum - 1) > 1e-9)
            throw new ArgumentException($"The text source shares must sum to 1, not {sum}.");
        if (MinLength < 1 || MaxLength < MinLength)
            throw new ArgumentException($"Line lengths need 1 <= MinLength <= MaxLength (got {MinLength}, {MaxLength}).");
        if (MinCharacters < 1 || MaxCharacters < MinCharacters)
            throw new ArgumentException($"Random lines need 1 <= MinCharacters <= MaxCharacters (got {MinCharacters}, {MaxCharacters}).");
        if (MaxWordListBytes < 1)
            throw new ArgumentException("MaxWordListBytes must be positive.");
    }
}
