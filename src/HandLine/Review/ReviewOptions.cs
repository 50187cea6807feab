namespace HandLine.Review;

/// <summary>What the review page shows: which lines, where their images are, and which characters it marks.</summary>
public sealed record ReviewOptions
{
    /// <summary>The folder the run's sources are relative to (see <c>sample --images</c>); a run folder does not record it.</summary>
    public required string ImagesRoot { get; init; }

    /// <summary>Every line of the run, not only the flagged ones.</summary>
    public bool All { get; init; }

    /// <summary>
    /// Show only the lines worth correcting first (<see cref="Proof.LinePicker"/>), at most this many; null shows
    /// the flagged lines (or all with <see cref="All"/>).
    /// </summary>
    public int? Pick { get; init; }

    /// <summary>Seed of <see cref="Pick"/>'s tie-breaking: the same run and seed give the same lines.</summary>
    public int Seed { get; init; } = 1;

    /// <summary>
    /// A character whose confidence is below this is marked doubtful. 0.75 is a rule of thumb chosen by eye on the
    /// demo runs (common practice, no source): lower marks only the worst letters, higher marks most of a poor line.
    /// </summary>
    public double DoubtBelow { get; init; } = 0.75;

    /// <summary>Alternatives offered per line (keys 1 to 3).</summary>
    public const int MaxAlternatives = 3;

    /// <exception cref="ArgumentException">No images folder, or a threshold outside [0, 1].</exception>
    public void Validate()
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(ImagesRoot);
        if (Pick is < 1)
            throw new ArgumentException($"The number of lines to pick must be at least 1, not {Pick}.");
        if (Pick is not null && All)
            throw new ArgumentException("Give either --pick or --all, not both.");
        if (!(DoubtBelow >= 0 && DoubtBelow <= 1))
            throw new ArgumentException($"The doubt threshold must be between 0 and 1, not {DoubtBelow}.");
    }
}
