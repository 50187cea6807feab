using System.Diagnostics;
using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using HandLine.Batch;
using HandLine.Decoding;
using HandLine.Features;
using HandLine.Model;
using HandLine.Recognition;
using HandLine.Training;

namespace HandLine.Adaptation;

/// <summary>
/// <c>handline adapt</c>: fine-tunes a run's model on an editor's corrections and reads the run again with it.
/// In order: the corrections are checked against the run (<see cref="CorrectionSet"/>; a problem stops everything
/// before anything is written); the corrected lines are split, seeded, into lines to train on and lines held back;
/// the trainer (<see cref="Trainer"/>, the same loop as <c>train</c>) fine-tunes a copy of the model on the training
/// lines mixed with replayed general lines (<see cref="ReplayLines"/>), keeping the weights that read the held-back
/// lines best; when even those read the held-back lines worse than the model did before, the adaptation is refused
/// and nothing is written. Otherwise the adapted model goes into the output folder with an
/// <see cref="AdaptationRecord"/> in its header, and the run's sources are read again into the same folder by the
/// batch runner (journal, resume, reports), checked lines keeping their checked text (<see cref="KeptLinesRecogniser"/>).
/// Run again after a stop, the same command finds its model (same run, corrections and settings) and resumes the reading.
/// </summary>
public static class Adapter
{
    /// <summary>The adapted model's file name in the output folder.</summary>
    public const string ModelFileName = "adapted.hlm";

    private const string Stage = "adapt";

    /// <param name="modelPath">The model to adapt; null for the run's own (summary.json's model_path).</param>
    /// <exception cref="InputException">The run, corrections, images or model cannot be used; nothing is written.</exception>
    public static AdaptResult Run(string runDir, string correctionsPath, string outDir, string? modelPath, AdaptOptions options,
        double flagBelow, DecodingOptions? decoding, BatchOptions batch, TextWriter progress, CancellationToken cancel = default)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        ArgumentException.ThrowIfNullOrWhiteSpace(outDir);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(batch);
        ArgumentNullException.ThrowIfNull(progress);
        options.Validate();
        batch.Validate();
        if (string.Equals(Path.GetFullPath(runDir).TrimEnd(Path.DirectorySeparatorChar), Path.GetFullPath(outDir).TrimEnd(Path.DirectorySeparatorChar), StringComparison.Ordinal))
            throw new ArgumentException("--out must be a new folder, not the run being adapted");

        var set = CorrectionSet.Read(runDir, correctionsPath, options.ImagesRoot);
        var summaryPath = Path.Combine(runDir, "summary.json");
        var runModel = File.Exists(summaryPath) ? RunSummary.Read(summaryPath) : null;
        var basePath = modelPath ?? runModel?.ModelPath
            ?? throw new InputException(summaryPath, Stage, "the run has no summary.json naming its model: give the model with --model");
        if (!File.Exists(basePath))
            throw new InputException(basePath, Stage, modelPath is null ? "the run's model is not there any more: give it with --model" : "no such model file");
        using var original = ModelFile.Load(basePath);
        if (runModel is not null && runModel.ModelId != original.Id)
            progress.WriteLine($"note: the run was read with model {runModel.ModelId}, adapting {original.Id}");

        // The corrected lines' symbols join the model's set, as in 'train --from'.
        var missing = original.Charset.MissingSymbols(set.Lines.Select(l => l.Text));
        using var model = missing.Count == 0 ? Copy(original) : original.WithSymbols(missing, options.Seed);
        if (missing.Count > 0)
            progress.WriteLine($"character set grows by {missing.Count}: {string.Join(", ", missing)}");

        var (samples, skipped) = Prepare(set.Lines, model.Features, model.Charset);
        if (samples.Count < options.MinLines)
            throw new InputException(correctionsPath, Stage,
                $"{samples.Count} corrected line(s) to learn from ({set.Illegible} illegible, {set.Uncut} on pages that could not be cut into lines, {skipped} unreadable); adapt needs at least {options.MinLines}");
        var (train, held) = Split(samples, options);

        var modelOut = Path.Combine(outDir, ModelFileName);
        var record = new AdaptationRecord(Path.GetFullPath(runDir), original.Id, Path.GetFileName(correctionsPath), set.Sha256,
            train.Count, held.Count, 0, 0, 0, options.Describe());
        var reused = Reusable(modelOut, record);
        double before, after, minutes = 0;
        int replayCount;
        if (reused is not null)
        {
            progress.WriteLine($"the adapted model in {modelOut} was made from the same run, corrections and settings: reading with it");
            (before, after, replayCount) = (reused.HeldBackCerBefore, reused.HeldBackCerAfter, reused.ReplayLines);
        }
        else
        {
            var replay = ReplayLines.Load(options.Replay, (int)Math.Round(options.ReplayShare * train.Count), options.Seed, model.Features, model.Charset);
            replayCount = replay.Count;
            before = Validation.Run(original, held).Cer;
            progress.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"training on {train.Count} corrected and {replay.Count} general line(s); {held.Count} held back, read at {before:P2} CER before"));
            var scratch = Directory.CreateTempSubdirectory("handline-adapt-");
            try
            {
                var scratchModel = Path.Combine(scratch.FullName, ModelFileName);
                var recipe = new TrainingRecord("handline adapt", [Path.GetFileName(correctionsPath)], "held-back corrections",
                    options.Seed, 0, 0, 0, original.Id);
                (after, minutes) = Fit(model, train, replay, held, scratchModel, options, recipe, progress, cancel);
                if (cancel.IsCancellationRequested)
                    return new AdaptResult(train.Count, held.Count, replayCount, before, after, Refused: false, Cancelled: true, null, null, false, minutes, skipped);
                if (after > before)
                    return new AdaptResult(train.Count, held.Count, replayCount, before, after, Refused: true, Cancelled: false, null, null, false, minutes, skipped);
                Directory.CreateDirectory(outDir);
                using var adapted = ModelFile.Load(scratchModel);
                adapted.Save(modelOut, null, Math.Round(after, 5), record with
                {
                    ReplayLines = replayCount,
                    HeldBackCerBefore = Math.Round(before, 5),
                    HeldBackCerAfter = Math.Round(after, 5),
                });
            }
            finally
            {
                scratch.Delete(recursive: true);
            }
        }

        using var final = ModelFile.Load(modelOut);
        var counts = ReRead(set, final, modelOut, outDir, options.ImagesRoot, flagBelow, decoding, batch, progress, cancel, out var sourcesRead, out var seconds);
        return new AdaptResult(train.Count, held.Count, replayCount, before, after, Refused: false, Cancelled: counts.Cancelled, modelOut, final.Id,
            reused is not null, minutes, skipped)
        {
            Sources = counts.Sources, SourcesRead = sourcesRead, Lines = counts.Lines, Flagged = counts.Flagged, Errors = counts.Errors,
            ReReadSeconds = seconds,
        };
    }

    /// <summary>
    /// Fine-tunes <paramref name="model"/> on the training lines mixed with the replayed ones, stopping early on the
    /// held-back lines; the weights that read them best are saved at <paramref name="modelPath"/>.
    /// </summary>
    /// <returns>The held-back CER of the saved weights, and the minutes spent.</returns>
    internal static (double HeldBackCer, double Minutes) Fit(LineModel model, IReadOnlyList<LineSample> train, IReadOnlyList<LineSample> replay,
        IReadOnlyList<LineSample> held, string modelPath, AdaptOptions options, TrainingRecord recipe, TextWriter progress, CancellationToken cancel)
    {
        var result = new Trainer(progress).Train(model, [.. train, .. replay], held, modelPath, options.Training(options.Seed), recipe, cancel);
        return (result.BestValidationCer, result.Minutes);
    }

    /// <summary>An independent copy of a model (the trainer changes the weights it is given).</summary>
    private static LineModel Copy(LineModel model)
    {
        var path = Path.GetTempFileName();
        try
        {
            model.Save(path, null, model.Header.ValidationCer);
            return ModelFile.Load(path);
        }
        finally
        {
            File.Delete(path);
        }
    }

    /// <summary>The lines normalised as transcription would (a corrected line is one line already).</summary>
    private static (List<LineSample> Samples, int Skipped) Prepare(IReadOnlyList<AdaptationLine> lines, FeatureConfig features, CharacterSet charset)
    {
        var preparer = new LinePreparer(features);
        var samples = new LineSample?[lines.Count];
        Parallel.For(0, lines.Count, i =>
        {
            var l = lines[i];
            try
            {
                var line = preparer.Normalise(preparer.Load(l.Image, l.NameForErrors), l.NameForErrors);
                if (line.HasInk && charset.CanEncode(l.Text))
                    samples[i] = new LineSample($"{l.Source}#{l.Line}", l.Text, line.Ink, features, charset.Encode(l.Text));
            }
            catch (InputException)
            {
                // An image the reader cannot use teaches nothing; it is counted as skipped.
            }
        });
        var kept = samples.OfType<LineSample>().ToList();
        return (kept, lines.Count - kept.Count);
    }

    /// <summary>A seeded split: a share held back (at least <see cref="AdaptOptions.MinHeldBack"/> when there are lines enough), the rest to train on.</summary>
    internal static (List<LineSample> Train, List<LineSample> Held) Split(IReadOnlyList<LineSample> samples, AdaptOptions options)
    {
        var order = samples.ToArray();
        new Random(options.Seed).Shuffle(order);
        var n = order.Length;
        var held = (int)Math.Round(options.HoldBackShare * n);
        held = Math.Max(held, Math.Min(options.MinHeldBack, n / 2));
        held = Math.Clamp(held, 1, n - 1);
        return (order[held..].ToList(), order[..held].ToList());
    }

    /// <summary>The model already in the output folder when an earlier run of the same adaptation wrote it.</summary>
    private static AdaptationRecord? Reusable(string path, AdaptationRecord wanted)
    {
        if (!File.Exists(path))
            return null;
        try
        {
            using var model = ModelFile.Load(path);
            return model.Header.Adaptation is { } a && a.Run == wanted.Run && a.RunModelId == wanted.RunModelId
                && a.CorrectionsSha256 == wanted.CorrectionsSha256 && a.Settings == wanted.Settings
                ? a
                : throw new InputException(path, Stage, "the output folder holds a model adapted from another run, corrections or settings: choose another folder");
        }
        catch (InputException e) when (e.Stage == "model")
        {
            throw new InputException(path, Stage, $"the output folder holds a model file that cannot be read ({e.Reason}): choose another folder", e);
        }
    }

    private static BatchCounts ReRead(CorrectionSet set, LineModel model, string modelPath, string outDir, string imagesRoot, double flagBelow,
        DecodingOptions? decoding, BatchOptions batch, TextWriter progress, CancellationToken cancel, out int sourcesRead, out double seconds)
    {
        var clock = Stopwatch.StartNew();
        var started = DateTime.UtcNow;
        var recogniser = new Recogniser(model, decoding: decoding, flagBelow: flagBelow);
        var keeping = new KeptLinesRecogniser(recogniser, set.Kept, set.Earlier());
        var sources = set.Records.Select(r => r.Source).Distinct(StringComparer.Ordinal)
            .Select(s => new SourceImage(s, Path.GetFullPath(Path.Combine(imagesRoot, s)))).ToArray();
        // The kept lines are results too: a journal written with other corrections is not reused.
        var transcribe = new TranscribeOptions(outDir, modelPath, flagBelow, Decoding: decoding);
        var hash = Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(OptionsFingerprint.Of(transcribe) + "\n" + set.Sha256)))[..16];
        var job = new BatchJob(outDir, sources, [], keeping, RunSettings.Of(recogniser, flagBelow, modelPath), hash, batch, started, clock);
        var counts = BatchRunner.Run(job, new BatchProgress(progress, batch.Progress, batch), cancel);
        sourcesRead = keeping.SourcesRead;
        seconds = clock.Elapsed.TotalSeconds;
        return counts;
    }
}
