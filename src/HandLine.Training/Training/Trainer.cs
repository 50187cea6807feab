using System.Diagnostics;
using System.Globalization;
using HandLine.Features;
using HandLine.Model;
using HandLine.Scoring;
using static TorchSharp.torch;

namespace HandLine.Training;

/// <summary>
/// Outcome of a training run. <see cref="BestValidationCer"/> is the validation CER of the model file written,
/// which may come from the validation made when the run stopped mid-epoch.
/// </summary>
public sealed record TrainingResult(double BestValidationCer, int Epochs, long LinesSeen, double Minutes, bool StoppedEarly, string? ModelId);

/// <summary>
/// CTC training (Graves et al. 2006) with Adam, gradient clipping, step-size halving on plateaus, validation
/// CER after every epoch, the best model kept at the output path, early stopping, and checkpoints that let an
/// interrupted run resume and end exactly as an uninterrupted one would (same seed, same thread count).
/// </summary>
public sealed class Trainer
{
    private readonly TextWriter _progress;
    private readonly bool _interactive;

    public Trainer(TextWriter progress, bool interactive = false)
    {
        _progress = progress;
        _interactive = interactive;
    }

    public TrainingResult Train(
        LineModel model,
        IReadOnlyList<LineSample> train,
        IReadOnlyList<LineSample> valid,
        string outPath,
        TrainingOptions options,
        TrainingRecord recipe,
        CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(model);
        options.Validate();
        if (train.Count == 0) throw new ArgumentException("no training lines");
        if (valid.Count == 0) throw new ArgumentException("no validation lines");
        TorchRuntime.SetThreads(options.Threads);

        var network = model.Network;
        using var optimizer = new AdamOptimiser(network.parameters(), options.LearningRate);
        var checkpointPath = Checkpoint.PathFor(outPath);
        var logPath = outPath + ".log.csv";
        var state = new TrainingState(0, 0, 0, 0, 0, options.LearningRate, double.PositiveInfinity, 0, 0, null);
        if (options.Resume && File.Exists(checkpointPath))
        {
            state = Checkpoint.Load(checkpointPath, network, optimizer);
            _progress.WriteLine($"resuming at epoch {state.Epoch + 1}, batch {state.Batch}, {state.LinesSeen} lines seen");
        }
        else if (File.Exists(logPath))
        {
            File.Delete(logPath);
        }
        SetLearningRate(optimizer, state.LearningRate);

        var batchesPerPass = (train.Count + options.BatchSize - 1) / options.BatchSize;
        // An "epoch" is one pass over the lines, or a fixed number of lines when EpochLines is set, so a large
        // set still gets validation, step-size halving and best-model saves within one pass.
        var batchesPerEpoch = options.EpochLines > 0
            ? (int)Math.Max(1, (options.EpochLines + options.BatchSize - 1) / options.BatchSize)
            : batchesPerPass;
        var clock = Stopwatch.StartNew();
        var startMinutes = state.Minutes;
        var lastCheckpoint = clock.Elapsed;
        var linesAtStart = state.LinesSeen;
        var stopped = false;
        string? bestId = null;
        double Minutes() => startMinutes + clock.Elapsed.TotalMinutes;

        while (state.Epoch < options.Epochs && !stopped)
        {
            var batches = EpochBatches(train, options, state.Epoch, batchesPerEpoch, batchesPerPass);
            for (var b = state.Batch; b < batches.Count; b++)
            {
                var loss = Step(network, optimizer, batches[b], options, state.Epoch, b);
                state = state with
                {
                    Batch = b + 1,
                    LinesSeen = state.LinesSeen + batches[b].Length,
                    BatchesDone = state.BatchesDone + 1,
                    EpochLossSum = state.EpochLossSum + loss,
                    Minutes = Minutes(),
                };
                if (b % 10 == 0 || b == batches.Count - 1)
                    Report(state, batchesPerEpoch, options, loss, clock.Elapsed.TotalSeconds, state.LinesSeen - linesAtStart);
                var outOfTime = options.MaxMinutes > 0 && Minutes() >= options.MaxMinutes;
                var outOfBatches = options.MaxBatches > 0 && state.BatchesDone >= options.MaxBatches;
                if (outOfTime || outOfBatches || cancel.IsCancellationRequested)
                {
                    stopped = true;
                    break;
                }
                if ((clock.Elapsed - lastCheckpoint).TotalMinutes >= options.CheckpointMinutes)
                {
                    Checkpoint.Save(checkpointPath, state, network, optimizer);
                    lastCheckpoint = clock.Elapsed;
                }
            }
            if (stopped && state.Batch < batches.Count)
            {
                // The epoch is unfinished: the schedule waits for its end in a resumed run, but the weights
                // reached so far are validated now and kept if they beat the saved model.
                var partial = Validate(model, valid);
                _progress.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"stopped in epoch {state.Epoch + 1} at batch {state.Batch}: validation CER {partial:P2}"));
                if (partial < state.SavedOrBestCer)
                {
                    bestId = model.Save(outPath, RecipeAt(recipe, state), Math.Round(partial, 5));
                    state = state with { SavedCer = partial };
                }
                Checkpoint.Save(checkpointPath, state, network, optimizer);
                break;
            }

            var validation = Validation.Run(model, valid);
            var cer = validation.Cer;
            var validLoss = MeanLoss(model, valid);
            var meanLoss = state.EpochLossSum / Math.Max(1, batches.Count);
            var beatsSaved = cer < state.SavedOrBestCer; // before the state update below
            state = AfterEpoch(state, cer, validLoss, options) with { EpochLossSum = 0, Minutes = Minutes() };
            var lr = state.LearningRate;
            SetLearningRate(optimizer, lr);
            AppendLog(logPath, state, meanLoss, cer, validLoss, batchesPerEpoch, validation.WorstFamily);
            _progress.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"epoch {state.Epoch}/{options.Epochs}: mean loss {meanLoss:F3}, validation CER {cer:P2} loss {validLoss:F3}{(beatsSaved ? " (saved)" : "")}, step size {lr:G3}"));
            if (validation.StylesLine() is { } styles)
                _progress.WriteLine(styles);
            if (beatsSaved)
            {
                bestId = model.Save(outPath, RecipeAt(recipe, state), Math.Round(cer, 5));
                state = state with { SavedCer = cer };
            }
            Checkpoint.Save(checkpointPath, state, network, optimizer);
            if (state.EpochsSinceBest >= options.Patience)
            {
                _progress.WriteLine($"no better validation CER or loss for {state.EpochsSinceBest} epochs: stopping early");
                break;
            }
        }
        return new TrainingResult(state.SavedOrBestCer, state.Epoch, state.LinesSeen, state.Minutes, stopped, bestId);
    }

    /// <summary>
    /// The schedule at an epoch's end. Progress is a better validation CER or a lower validation CTC loss: early
    /// on, CTC first learns to output blanks everywhere and the CER sits at 100 % for thousands of lines while
    /// the loss falls, and halving the step size or stopping then would only prolong that phase. After
    /// <see cref="TrainingOptions.PlateauEpochs"/> epochs without progress the step size halves; the caller stops
    /// after <see cref="TrainingOptions.Patience"/>.
    /// </summary>
    internal const double LossProgress = 0.005;

    internal static TrainingState AfterEpoch(TrainingState state, double cer, double validLoss, TrainingOptions options)
    {
        // A loss has to fall by 0.5 % to count, so a long tail of tiny gains cannot hold the step size forever
        // (a relative threshold as plateau schedules commonly use: common practice, no source).
        var progress = cer < state.BestCer || validLoss < (state.BestLoss ?? double.PositiveInfinity) * (1 - LossProgress);
        var sinceBest = progress ? 0 : state.EpochsSinceBest + 1;
        var lr = !progress && sinceBest % options.PlateauEpochs == 0 ? state.LearningRate / 2 : state.LearningRate;
        return state with
        {
            Epoch = state.Epoch + 1,
            Batch = 0,
            BestCer = Math.Min(cer, state.BestCer),
            BestLoss = Math.Min(validLoss, state.BestLoss ?? double.PositiveInfinity),
            EpochsSinceBest = sinceBest,
            LearningRate = lr,
        };
    }

    private static TrainingRecord RecipeAt(TrainingRecord recipe, TrainingState s) =>
        recipe with { Epochs = s.Epoch, LinesSeen = s.LinesSeen, Minutes = Math.Round(s.Minutes, 1) };

    /// <summary>Validation CER with greedy decoding, over code points (the same measure as `score`).</summary>
    public static double Validate(LineModel model, IReadOnlyList<LineSample> valid) => Validation.Run(model, valid).Cer;

    /// <summary>Mean CTC loss per line over a set, without training (for reports and tests).</summary>
    public static double MeanLoss(LineModel model, IReadOnlyList<LineSample> lines)
    {
        model.Network.eval();
        using var noGrad = no_grad();
        double sum = 0;
        foreach (var chunk in lines.Chunk(32))
        {
            using var scope = NewDisposeScope();
            sum += CtcLoss(model.Network, chunk).item<float>() * chunk.Length;
        }
        return sum / Math.Max(1, lines.Count);
    }

    private static Tensor CtcLoss(LineNetwork network, IReadOnlyList<LineSample> batch, IReadOnlyList<FeatureSequence>? features = null)
    {
        var (frames, lengths) = Batching.Stack(features ?? batch.Select(s => s.Features).ToArray());
        var logProbs = network.call(frames, lengths);
        var targets = tensor(batch.SelectMany(s => s.Target.Select(c => (long)c)).ToArray());
        var targetLengths = tensor(batch.Select(s => (long)s.Target.Length).ToArray());
        // zero_infinity: a line whose label cannot fit its frames contributes nothing instead of NaN.
        return nn.functional.ctc_loss(logProbs, targets, lengths, targetLengths, blank: 0, zero_infinity: true);
    }

    internal static float Step(LineNetwork network, AdamOptimiser optimizer, IReadOnlyList<LineSample> batch, TrainingOptions options, int epoch, int index)
    {
        using var scope = NewDisposeScope();
        optimizer.ZeroGrad();
        network.train();
        var features = Features(batch, options, epoch, index);
        Tensor loss;
        // Dropout draws from torch's generator: seed it per batch so a resumed run repeats the same masks.
        lock (TorchRuntime.RandomLock)
        {
            TorchRuntime.Seed(((long)options.Seed * 1_000_003L) + (epoch * 100_003L) + index);
            loss = CtcLoss(network, batch, features);
        }
        loss.backward();
        nn.utils.clip_grad_norm_(network.parameters(), options.ClipNorm);
        optimizer.Step();
        return loss.item<float>();
    }

    /// <summary>
    /// The batch's features, each line distorted afresh when augmentation is on. The distortion's generator is
    /// seeded from (seed, epoch, batch, line), so a resumed run draws exactly what an uninterrupted one did.
    /// </summary>
    internal static FeatureSequence[] Features(IReadOnlyList<LineSample> batch, TrainingOptions options, int epoch, int index)
    {
        var result = new FeatureSequence[batch.Count];
        for (var i = 0; i < batch.Count; i++)
        {
            var s = batch[i];
            result[i] = options.Augmentation is null
                ? s.Features
                : s.FeaturesOf(options.Augmentation.Apply(s.Ink(), new Random(LineSeed(options.Seed, epoch, index, i))));
        }
        return result;
    }

    /// <summary>
    /// A fixed mix (SplitMix64 finaliser) of the run seed and a line's place in the run. Not HashCode.Combine:
    /// that is randomised per process, and a resumed run is a new process.
    /// </summary>
    internal static int LineSeed(int seed, int epoch, int batch, int line)
    {
        var z = unchecked((ulong)seed * 0x9E3779B97F4A7C15UL + (ulong)epoch * 0xBF58476D1CE4E5B9UL
                          + (ulong)batch * 0x94D049BB133111EBUL + (ulong)line);
        z = unchecked((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL);
        z = unchecked((z ^ (z >> 27)) * 0x94D049BB133111EBUL);
        return (int)((z ^ (z >> 31)) & int.MaxValue);
    }

    /// <summary>
    /// The batches of one epoch: a stretch of the endless sequence of passes, each pass in its own shuffled
    /// order. Without EpochLines an epoch is exactly one pass.
    /// </summary>
    internal static List<LineSample[]> EpochBatches(IReadOnlyList<LineSample> train, TrainingOptions options, int epoch, int batchesPerEpoch, int batchesPerPass)
    {
        if (batchesPerEpoch == batchesPerPass && options.EpochLines <= 0)
            return BatchOrder(train, options.BatchSize, options.Seed, epoch);
        var result = new List<LineSample[]>(batchesPerEpoch);
        List<LineSample[]>? order = null;
        var orderPass = -1;
        for (var g = (long)epoch * batchesPerEpoch; g < (long)(epoch + 1) * batchesPerEpoch; g++)
        {
            var pass = (int)(g / batchesPerPass);
            if (pass != orderPass)
            {
                order = BatchOrder(train, options.BatchSize, options.Seed, pass);
                orderPass = pass;
            }
            result.Add(order![(int)(g % batchesPerPass)]);
        }
        return result;
    }

    /// <summary>Batches of similar width (less padding), in an order shuffled per pass from the seed.</summary>
    internal static List<LineSample[]> BatchOrder(IReadOnlyList<LineSample> train, int batchSize, int seed, int epoch)
    {
        // Not HashCode.Combine: it is randomised per process, and a resumed run is a new process.
        var rng = new Random(unchecked((seed * 1_000_003) + epoch));
        // Sort by width with a random tie-break so bucket membership varies between epochs.
        var order = train.Select((s, i) => (s, key: s.Frames + rng.NextDouble() * 8, i))
            .OrderBy(x => x.key).ThenBy(x => x.i).Select(x => x.s).ToArray();
        var batches = order.Chunk(batchSize).ToList();
        for (var i = batches.Count - 1; i > 0; i--)
        {
            var j = rng.Next(i + 1);
            (batches[i], batches[j]) = (batches[j], batches[i]);
        }
        return batches;
    }

    private static void SetLearningRate(AdamOptimiser optimizer, double lr) => optimizer.LearningRate = lr;

    private void Report(TrainingState s, int batchesPerEpoch, TrainingOptions o, float loss, double seconds, long lines)
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

    private const string LogHeader = "epoch,lines_seen,minutes,mean_loss,valid_cer,learning_rate,batches_per_epoch,valid_loss";
    private const string FamilyLogColumns = ",worst_family,worst_family_cer";

    private static void AppendLog(string path, TrainingState s, double loss, double cer, double validLoss, int batchesPerEpoch, ScoreGroup? worstFamily)
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
