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
    /// <summary>Lines whose confidence is below this are flagged for review (common practice, no source; not yet calibrated).</summary>
    public const double DefaultFlagBelow = 0.8;
}

/// <summary>Counts for the run summary.</summary>
public sealed record TranscribeSummary(int Sources, int Lines, int Flagged, int Errors, double Seconds, string ModelId)
{
    public bool HasErrors => Errors > 0;
}

/// <summary>
/// The batch stage: every source is read and its text file written before the next starts; a bad source
/// becomes an entry in errors.jsonl and the batch goes on. Reports are renamed into place at the end.
/// </summary>
public static class TranscribeRun
{
    public static TranscribeSummary Run(
        IEnumerable<string> inputs, TranscribeOptions options, TextWriter? progress = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(options);
        var clock = Stopwatch.StartNew();
        var started = DateTime.UtcNow;
        Directory.CreateDirectory(options.OutDir);
        using var model = ModelFile.Load(options.ModelPath);
        var reader = new PageReader(model, options.Imaging ?? new ImagingOptions(), options.FlagBelow, options.Decoding);
        var decoding = reader.Decoder.Options;
        var (sources, inputErrors) = InputSet.Expand(inputs);

        using var reports = new RunReports(options.OutDir);
        int lines = 0, flagged = 0, done = 0, errors = 0;
        foreach (var e in inputErrors) { reports.AddError(e); errors++; }
        foreach (var source in sources)
        {
            if (cancel.IsCancellationRequested) break;
            try
            {
                var results = reader.Read(source);
                var text = string.Join("\n", results.Select(r => r.Text)) + "\n";
                var target = Path.Combine(options.OutDir, Path.ChangeExtension(source.Source, ".txt"));
                Directory.CreateDirectory(Path.GetDirectoryName(target)!);
                AtomicFile.WriteAllText(target, text);
                reports.Add(results);
                lines += results.Count;
                flagged += results.Count(r => r.Flagged);
                done++;
            }
            catch (InputException e)
            {
                reports.AddError(e);
                errors++;
                progress?.WriteLine($"error: {e.Message}");
            }
        }

        var seconds = clock.Elapsed.TotalSeconds;
        reports.Complete(new Dictionary<string, object?>
        {
            ["sources"] = sources.Count,
            ["sources_done"] = done,
            ["lines"] = lines,
            ["flagged"] = flagged,
            ["errors"] = errors,
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
            ["lines_per_second"] = Math.Round(lines / Math.Max(seconds, 1e-9), 2),
            ["cancelled"] = cancel.IsCancellationRequested,
        });
        return new TranscribeSummary(sources.Count, lines, flagged, errors, seconds, model.Id);
    }
}
