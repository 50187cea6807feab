namespace HandLine.Proof;

/// <summary>An interval for an error rate at a confidence level (0.95 for 95 %).</summary>
public sealed record ConfidenceInterval(double Lower, double Upper, double Level)
{
    public bool Contains(double value) => value >= Lower && value <= Upper;
}
