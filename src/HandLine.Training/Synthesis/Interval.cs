namespace HandLine.Synthesis;

/// <summary>A closed range [Min, Max] sampled uniformly.</summary>
public sealed record Interval
{
    public Interval(double min, double max)
    {
        if (!double.IsFinite(min) || !double.IsFinite(max) || min > max)
            throw new ArgumentException($"Invalid interval [{min}, {max}].");
        Min = min;
        Max = max;
    }

    public double Min { get; }
    public double Max { get; }

    public bool Contains(double value) => value >= Min && value <= Max;

    internal double Sample(Random rng) => Min + (Max - Min) * rng.NextDouble();
}
