using System.Globalization;
using HandLine.Scoring;

namespace HandLine.Training;

/// <summary>The training log, <c>--out</c> + <c>.log.csv</c>: one row per epoch.</summary>
internal static class TrainingLog
{
    private const string LogHeader = "epoch,lines_seen,minutes,mean_loss,valid_cer,learning_rate,batches_per_epoch,valid_loss";
    private const string FamilyLogColumns = ",worst_family,worst_family_cer";

    public static void Append(string path, TrainingState s, double loss, double cer, double validLoss, int batchesPerEpoch, ScoreGroup? worstFamily)
    {
        var header = !File.Exists(path);
        // A run resumed from a log written before the family columns existed keeps that log's shape.
        var families = header || File.ReadLines(path).FirstOrDefault()?.EndsWith(FamilyLogColumns, StringComparison.Ordinal) == true;
        using var w = new StreamWriter(path, append: true);
        if (header) w.WriteLine(LogHeader + FamilyLogColumns);
        var row = string.Create(CultureInfo.InvariantCulture,
            $"{s.Epoch},{s.LinesSeen},{s.Minutes:F2},{loss:F4},{cer:F5},{s.LearningRate:G4},{batchesPerEpoch},{validLoss:F4}");
        if (families)
            row += worstFamily is null ? ",," : string.Create(CultureInfo.InvariantCulture, $",{CsvField(worstFamily.Value)},{worstFamily.Cer:F5}");
        w.WriteLine(row);
    }

    /// <summary>A CSV field, quoted when it holds a comma, quote or line break (RFC 4180).</summary>
    private static string CsvField(string value) =>
        value.AsSpan().IndexOfAny(",\"\r\n") < 0 ? value : "\"" + value.Replace("\"", "\"\"") + "\"";
}
