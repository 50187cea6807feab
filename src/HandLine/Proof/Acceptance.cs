namespace HandLine.Proof;

/// <summary>Turns an interval and a threshold into a verdict.</summary>
public static class Acceptance
{
    /// <summary>
    /// Pass when the interval's upper end is at or below <paramref name="maxCer"/>, fail when its lower end is
    /// above it, inconclusive otherwise (the interval contains it).
    /// </summary>
    public static AcceptanceVerdict Decide(ConfidenceInterval interval, double maxCer)
    {
        ArgumentNullException.ThrowIfNull(interval);
        if (!double.IsFinite(maxCer) || maxCer < 0)
            throw new ArgumentOutOfRangeException(nameof(maxCer), maxCer, "The threshold must be a finite rate, 0 or more.");
        if (interval.Upper <= maxCer)
            return AcceptanceVerdict.Pass;
        return interval.Lower > maxCer ? AcceptanceVerdict.Fail : AcceptanceVerdict.Inconclusive;
    }
}
