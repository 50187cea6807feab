using System.Diagnostics;
using HandLine.Decoding;
using HandLine.Imaging;
using HandLine.Model;

namespace HandLine.Batch;

/// <summary>Settings of one transcription run.</summary>
public sealed record TranscribeOptions(
    string OutDir,
    string ModelPath,
    double FlagBelow = TranscribeOptions.DefaultFlagBelow,
    ImagingOptions? Imaging = null,
    DecodingOptions? Decoding = null)
{
    /// <summary>
    /// Lines whose confidence is below this are flagged for review. Set by `handline calibrate --catch 0.9` on the
    /// bundled model's 1,000 validation lines (unseen fonts, default beam 8): 0.63935 catches 90% of character
    /// errors (it flags 40% of lines), rounded up to 0.64.
    /// Re-measure for other models.
    /// </summary>
    public const double DefaultFlagBelow = 0.64;
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
        var reader = new PageReader(model, options.Imaging ?? new ImagingOptions(), options.FlagBelow, options.Decoding);
        var decoding = reader.Decoder.Options;
        var (sources, inputErrors) = InputSet.Expand(inputs);

        var job = new BatchJob(options.OutDir, sources, inputErrors, reader.Imaging, reader.Read, model.Id,
            OptionsFingerprint.Of(options), batch);
        var c = BatchRunner.Run(job, new BatchProgress(progress, batch.Progress, batch),
            counts => Summary(counts, clock.Elapsed.TotalSeconds), cancel);
        return new TranscribeSummary(c.Sources, c.Lines, c.Flagged, c.Errors, clock.Elapsed.TotalSeconds, model.Id)
        {
            Reused = c.Reused, Cancelled = c.Cancelled,
        };

        IDictionary<string, object?> Summary(BatchCounts c, double seconds) => new Dictionary<string, object?>
        {
            ["sources"] = c.Sources,
            ["sources_done"] = c.Done,
            ["lines"] = c.Lines,
            ["flagged"] = c.Flagged,
            ["errors"] = c.Errors,
            ["flag_below"] = options.FlagBelow,
            ["model_id"] = model.Id,
            ["model_path"] = Path.GetFullPath(options.ModelPath),
            ["decoder"] = reader.Decoder.Name,
            ["beam"] = decoding.UsesBeam ? decoding.Beam : null,
            ["lexicon"] = decoding.Lexicon?.Source,
            ["lexicon_mode"] = decoding.Lexicon is null ? null : decoding.LexiconPenalty is null ? "strict" : "soft",
            ["lexicon_weight"] = decoding.LexiconPenalty,
            ["lm"] = decoding.LanguageModel?.Source,
            ["lm_weight"] = decoding.LanguageModel is null ? null : decoding.LmWeight,
            ["char_bonus"] = decoding.UsesBeam ? decoding.CharBonus : null,
            ["started_utc"] = started.ToString("O"),
            ["elapsed_seconds"] = Math.Round(seconds, 3),
            ["lines_per_second"] = Math.Round(c.Lines / Math.Max(seconds, 1e-9), 2),
            ["cancelled"] = c.Cancelled,
        };
    }
}
