using System.Diagnostics;
using HandLine.Decoding;
using HandLine.Imaging;
using HandLine.Layout;
using HandLine.Model;
using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>Settings of one transcription run.</summary>
public sealed record TranscribeOptions(
    string OutDir,
    string ModelPath,
    double? FlagBelow = null,
    InputLimits? Limits = null,
    DecodingOptions? Decoding = null,
    OrientationOptions? Orientation = null,
    LayoutMode Layout = LayoutMode.Auto,
    bool Alto = false)
{
    /// <summary>
    /// Lines whose confidence is below this are flagged for review when neither <see cref="FlagBelow"/> nor the
    /// model (<see cref="LineModel.FittedFlagBelow"/>) gives a threshold (see <see cref="Recogniser.DefaultFlagBelow"/>).
    /// </summary>
    public const double DefaultFlagBelow = Recogniser.DefaultFlagBelow;

    /// <summary>The threshold a run with this model uses: the one given, else the model's own, else the default.</summary>
    public double FlagBelowFor(LineModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        return FlagBelow ?? model.FittedFlagBelow ?? DefaultFlagBelow;
    }
}

/// <summary>Counts for the run summary.</summary>
public sealed record TranscribeSummary(int Sources, int Lines, int Flagged, int Errors, double Seconds, string ModelId)
{
    public bool HasErrors => Errors > 0;

    /// <summary>Sources whose results came from the journal of an earlier, interrupted run.</summary>
    public int Reused { get; init; }

    /// <summary>The run stopped early on request; the reports cover what was done.</summary>
    public bool Cancelled { get; init; }
}

/// <summary>
/// The batch stage: every source is read and its text file written before the next starts; a bad source
/// becomes an entry in errors.jsonl and the batch goes on. Reports are renamed into place at the end.
/// Rerunning into the same folder reuses the journalled results of an interrupted run (see <see cref="BatchRunner"/>).
/// </summary>
public static class TranscribeRun
{
    public static TranscribeSummary Run(
        IEnumerable<string> inputs, TranscribeOptions options, TextWriter? progress = null, CancellationToken cancel = default) =>
        Run(inputs, options, new BatchOptions(), progress, cancel);

    public static TranscribeSummary Run(
        IEnumerable<string> inputs, TranscribeOptions options, BatchOptions batch, TextWriter? progress, CancellationToken cancel)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(batch);
        batch.Validate();
        var clock = Stopwatch.StartNew();
        var started = DateTime.UtcNow;
        Directory.CreateDirectory(options.OutDir);
        using var model = ModelFile.Load(options.ModelPath);
        var flagBelow = options.FlagBelowFor(model);
        var recogniser = new Recogniser(model, options.Limits, options.Decoding, flagBelow, orientation: options.Orientation)
        {
            Layout = options.Layout,
        };
        var (sources, inputErrors) = InputSet.Expand(inputs);

        var job = new BatchJob(options.OutDir, sources, inputErrors, recogniser,
            RunSettings.Of(recogniser, flagBelow, options.ModelPath), OptionsFingerprint.Of(options with { FlagBelow = flagBelow }), batch, started, clock);
        var c = BatchRunner.Run(job, new BatchProgress(progress, batch.Progress, batch), cancel);
        if (options.Alto && !c.Cancelled)
            AltoWriter.WriteRun(options.OutDir, sources, model.Id);
        return new TranscribeSummary(c.Sources, c.Lines, c.Flagged, c.Errors, clock.Elapsed.TotalSeconds, model.Id)
        {
            Reused = c.Reused, Cancelled = c.Cancelled,
        };
    }
}
