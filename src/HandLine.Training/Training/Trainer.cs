using System.Diagnostics;
using System.Globalization;
using HandLine.Features;
using HandLine.Model;
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
/// This is the loop; its parts live beside it: <see cref="BatchPlan"/> (batch order), <see cref="TrainingStep"/>
/// (one step, CTC loss, seeding), <see cref="TrainingSchedule"/> (step size, early stopping),
/// <see cref="Validation"/>, <see cref="TrainingProgress"/> (progress line), <see cref="TrainingLog"/> (CSV log)
/// and <see cref="Checkpoint"/>.
/// </summary>
public sealed class Trainer
{
    private readonly TextWriter _progress;
    private readonly TrainingProgress _report;

    public Trainer(TextWriter progress, bool interactive = false)
    {
        _progress = progress;
        _report = new TrainingProgress(progress, interactive);
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
            var batches = BatchPlan.EpochBatches(train, options, state.Epoch, batchesPerEpoch, batchesPerPass);
            var epoch = state.Epoch;
            // The next batch's lines are distorted and turned into features on another thread while the network
            // trains on this one. Each line's distortion is seeded by its place in the run, so the order of work
            // changes nothing.
            Task<FeatureSequence[]> Prepare(int index) => Task.Run(() => TrainingStep.Features(batches[index], options, epoch, index));
            var pending = state.Batch < batches.Count ? Prepare(state.Batch) : null;
            for (var b = state.Batch; b < batches.Count; b++)
            {
                var features = pending!.GetAwaiter().GetResult();
                pending = b + 1 < batches.Count ? Prepare(b + 1) : null;
                var loss = TrainingStep.Step(network, optimizer, batches[b], features, options, state.Epoch, b);
                state = state with
                {
                    Batch = b + 1,
                    LinesSeen = state.LinesSeen + batches[b].Length,
                    BatchesDone = state.BatchesDone + 1,
                    EpochLossSum = state.EpochLossSum + loss,
                    Minutes = Minutes(),
                };
                if (b % 10 == 0 || b == batches.Count - 1)
                    _report.Report(state, batchesPerEpoch, options, loss, clock.Elapsed.TotalSeconds, state.LinesSeen - linesAtStart);
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
            state = TrainingSchedule.AfterEpoch(state, cer, validLoss, options) with { EpochLossSum = 0, Minutes = Minutes() };
            var lr = state.LearningRate;
            SetLearningRate(optimizer, lr);
            TrainingLog.Append(logPath, state, meanLoss, cer, validLoss, batchesPerEpoch, validation.WorstFamily);
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
            sum += TrainingStep.CtcLoss(model.Network, chunk).item<float>() * chunk.Length;
        }
        return sum / Math.Max(1, lines.Count);
    }

    private static void SetLearningRate(AdamOptimiser optimizer, double lr) => optimizer.LearningRate = lr;
}
