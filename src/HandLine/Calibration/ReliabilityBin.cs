namespace HandLine.Calibration;

/// <summary>
/// One bin of a reliability table: items whose confidence lies in (Lower, Upper] (the first bin also takes 0),
/// their mean confidence and the share of them that were right.
/// </summary>
public sealed record ReliabilityBin(double Lower, double Upper, int Count, double MeanConfidence, double Accuracy)
{
    /// <summary>Accuracy minus mean confidence: negative means the confidence promised more than it delivered.</summary>
    public double Gap => Count == 0 ? 0 : Accuracy - MeanConfidence;
}
