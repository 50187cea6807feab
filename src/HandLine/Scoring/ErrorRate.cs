namespace HandLine.Scoring;

/// <summary>Turns edit counts into a CER or WER.</summary>
public static class ErrorRate
{
    /// <summary>
    /// Distance / truth length, with the denominator floored at 1. An empty truth therefore gives 0 when
    /// the hypothesis is also empty and the number of inserted units otherwise: finite (JSON has no
    /// infinity) and still growing with every spurious unit. Common practice, no source.
    /// </summary>
    public static double Of(EditCounts counts) => (double)counts.Distance / Math.Max(1, counts.TruthLength);
}
