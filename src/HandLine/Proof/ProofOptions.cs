namespace HandLine.Proof;

/// <summary>Settings of the proof figures <c>score</c> adds: the bootstrap, the contract threshold and table sizes.</summary>
public sealed record ProofOptions
{
    /// <summary>Bootstrap resamples; 2,000 keeps the 2.5 % tails on 50 values each. Common practice, no source.</summary>
    public int Resamples { get; init; } = 2000;

    /// <summary>Seed of the bootstrap: same lines, same seed, same interval.</summary>
    public int Seed { get; init; } = 1;

    /// <summary>The contract's highest acceptable CER (0.05 for 5 %), or null for no verdict.</summary>
    public double? MaxCer { get; init; }

    /// <exception cref="ArgumentOutOfRangeException">Too few resamples or a threshold that is not a rate.</exception>
    public void Validate()
    {
        if (Resamples < 100)
            throw new ArgumentOutOfRangeException(nameof(Resamples), Resamples, "Use at least 100 resamples.");
        if (MaxCer is { } max && !(max >= 0 && double.IsFinite(max)))
            throw new ArgumentOutOfRangeException(nameof(MaxCer), max, "The threshold must be a rate, 0 or more (0.05 for 5 %).");
    }
}
