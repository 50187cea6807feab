namespace HandLine.Synthesis;

/// <summary>
/// A degradation applied to a line with the given probability; when applied its strength is drawn
/// uniformly from [Min, Max], otherwise it is 0 (off).
/// </summary>
public sealed record Effect
{
    public Effect(double probability, double min, double max)
    {
        if (!(probability >= 0 && probability <= 1))
            throw new ArgumentOutOfRangeException(nameof(probability), probability, "Probability must be in [0, 1].");
        Probability = probability;
        Range = new Interval(min, max);
    }

    public static Effect Off { get; } = new(0, 0, 0);

    public double Probability { get; }

    public Interval Range { get; }

    /// <summary>True when the value is what <see cref="Sample"/> can return.</summary>
    public bool Allows(double value) =>
        (value == 0 && Probability < 1) || (Probability > 0 && Range.Contains(value));

    internal double Sample(Random rng)
    {
        // Both draws always happen, so changing one probability does not shift later values.
        var on = rng.NextDouble() < Probability;
        var v = Range.Sample(rng);
        return on ? v : 0;
    }
}
