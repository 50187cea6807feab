namespace HandLine.Proof;

/// <summary>
/// How <see cref="ProofSampler"/> draws: a number of lines or a share of the run's lines (exactly one of the
/// two), the seed (same seed, same run: same sample), where the run's images are, and whether the keying
/// manifest shows the machine's text.
/// </summary>
public sealed record ProofSampleOptions
{
    /// <summary>Lines to draw; null when <see cref="Fraction"/> is given.</summary>
    public int? Count { get; init; }

    /// <summary>Share of the run's lines to draw, in (0, 1]; rounded to whole lines, at least one.</summary>
    public double? Fraction { get; init; }

    /// <summary>
    /// Lines worth correcting first (<see cref="LinePicker"/>) instead of a random draw; null for a proof sample. Such a
    /// pick is for keying lines that teach a model, never for judging the run: it is chosen for its doubt.
    /// </summary>
    public int? Pick { get; init; }

    public int Seed { get; init; }

    /// <summary>
    /// The folder the run's sources are relative to: the folder given to <c>transcribe</c>, or the manifest's
    /// folder. A run folder does not record it.
    /// </summary>
    public required string ImagesRoot { get; init; }

    /// <summary>Adds the machine text as a column of the keying manifest (keyers then see it: off by default).</summary>
    public bool WithMachineText { get; init; }

    /// <exception cref="ArgumentException">Neither or both of count and fraction, or one out of range.</exception>
    public void Validate()
    {
        if ((Count is null ? 0 : 1) + (Fraction is null ? 0 : 1) + (Pick is null ? 0 : 1) != 1)
            throw new ArgumentException("Give one of a count, a fraction or a number of lines to pick.");
        if (Pick is { } pick && pick < 1)
            throw new ArgumentException($"The number of lines to pick must be at least 1, not {pick}.");
        if (Count is { } count && count < 1)
            throw new ArgumentException($"The count must be at least 1, not {count}.");
        if (Fraction is { } f && !(f > 0 && f <= 1))
            throw new ArgumentException($"The fraction must be above 0 and at most 1, not {f}.");
        ArgumentException.ThrowIfNullOrWhiteSpace(ImagesRoot);
    }

    /// <summary>Lines to draw out of <paramref name="population"/>.</summary>
    /// <exception cref="ArgumentException">The count is more than the run has.</exception>
    public int SizeFor(int population)
    {
        if (Count is { } count)
            return count <= population
                ? count
                : throw new ArgumentException($"The run has {population} line(s); cannot draw {count}.");
        return Math.Min(population, Math.Max(1, (int)Math.Round(Fraction!.Value * population, MidpointRounding.AwayFromZero)));
    }
}
