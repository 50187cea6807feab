using System.Globalization;

namespace HandLine.Training;

/// <summary>The progress line while training: a redrawn bar on a terminal, an occasional line in a log.</summary>
internal sealed class TrainingProgress(TextWriter progress, bool interactive)
{
    private readonly TextWriter _progress = progress;
    private readonly bool _interactive = interactive;

    public void Report(TrainingState s, int batchesPerEpoch, TrainingOptions o, float loss, double seconds, long lines)
    {
        var rate = lines / Math.Max(1e-6, seconds);
        var remainingBatches = ((long)(o.Epochs - s.Epoch) * batchesPerEpoch) - s.Batch;
        var eta = TimeSpan.FromSeconds(remainingBatches * o.BatchSize / Math.Max(1e-6, rate));
        if (o.MaxMinutes > 0) eta = TimeSpan.FromMinutes(Math.Min(eta.TotalMinutes, Math.Max(0, o.MaxMinutes - s.Minutes)));
        var best = double.IsInfinity(s.BestCer) ? "-" : s.BestCer.ToString("P2", CultureInfo.InvariantCulture);
        var line = string.Create(CultureInfo.InvariantCulture,
            $"epoch {s.Epoch + 1}/{o.Epochs} batch {s.Batch}/{batchesPerEpoch} loss {loss:F3} best CER {best} {rate:F1} lines/s ETA {eta:hh\\:mm\\:ss}");
        if (_interactive) _progress.Write("\r" + Bar(s.Batch / (double)batchesPerEpoch) + " " + line.PadRight(100));
        else if (s.Batch % 200 == 1 || s.Batch == batchesPerEpoch) _progress.WriteLine(line);
    }

    /// <summary>The epoch's share done as a 20-cell bar.</summary>
    internal static string Bar(double done)
    {
        var cells = (int)Math.Round(Math.Clamp(done, 0, 1) * 20);
        return "[" + new string('#', cells) + new string('.', 20 - cells) + "]";
    }
}
