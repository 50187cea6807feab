using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;
using HandLine.Training;

namespace HandLine.Tests.Training;

public sealed class TrainerTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-train-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    /// <summary>Lines of 'a'/'b' where each symbol is three frames of its own pattern and gaps are background.</summary>
    internal static List<LineSample> PatternLines(int count, int seed)
    {
        var charset = CharacterSet.FromString("ab");
        var rng = new Random(seed);
        var lines = new List<LineSample>();
        for (var n = 0; n < count; n++)
        {
            var text = new string(Enumerable.Range(0, rng.Next(2, 6)).Select(_ => rng.Next(2) == 0 ? 'a' : 'b').ToArray());
            var frames = new List<float[]>();
            foreach (var ch in text)
            {
                frames.Add(new float[8]);
                for (var k = 0; k < 3; k++)
                    frames.Add(Enumerable.Range(0, 8).Select(i => (ch == 'a' ? i < 4 : i >= 4) ? 0.8f + 0.2f * (float)rng.NextDouble() : 0f).ToArray());
            }
            frames.Add(new float[8]);
            // Frames are one column each (stride 1), so the ink image is the frames side by side.
            var ink = new float[8 * frames.Count];
            for (var x = 0; x < frames.Count; x++)
                for (var y = 0; y < 8; y++)
                    ink[y * frames.Count + x] = frames[x][y];
            lines.Add(new LineSample($"l{n}", text, new GrayImage(frames.Count, 8, ink), Config, charset.Encode(text)));
        }
        return lines;
    }

    private static readonly FeatureConfig Config = new(LineHeight: 8, FrameStride: 1);

    private static LineModel Model(bool convolution = false) =>
        LineModel.Create(CharacterSet.FromString("ab"), Config, new NetworkConfig(12, 1, 0, convolution), seed: 9);

    [Theory]
    [InlineData(false)]
    [InlineData(true)] // with the convolutional front end
    public void AFewStepsOnSixtyFourLinesLowerTheCtcLoss(bool convolution)
    {
        using var model = Model(convolution);
        var lines = PatternLines(64, 1);
        var before = Trainer.MeanLoss(model, lines);
        new Trainer(TextWriter.Null).Train(model, lines, lines.Take(8).ToList(), Path.Combine(_dir, "m.hlm"),
            new TrainingOptions { Epochs = 3, BatchSize = 8, LearningRate = 0.01, Seed = 4, Threads = 1 },
            new TrainingRecord("test", [], null, 4, 0, 0, 0, null));
        var after = Trainer.MeanLoss(model, lines);
        Assert.True(after < before * 0.7, $"loss {before:F3} -> {after:F3}");
        Assert.True(File.Exists(Path.Combine(_dir, "m.hlm")));
        Assert.True(File.Exists(Path.Combine(_dir, "m.hlm.log.csv")));
    }

    [Fact]
    public void InterruptedThenResumedTrainingEqualsUninterruptedTraining()
    {
        var lines = PatternLines(64, 2);
        var probe = PatternLines(4, 3);
        var record = new TrainingRecord("test", [], null, 6, 0, 0, 0, null);
        TrainingOptions Options(long maxBatches, bool resume) =>
            new()
            {
                Epochs = 2, BatchSize = 8, LearningRate = 0.01, Seed = 6, Threads = 1, MaxBatches = maxBatches, Resume = resume,
                Augmentation = new Augmentation(), // fresh distortions must repeat exactly after a resume too
            };

        using var straight = Model();
        new Trainer(TextWriter.Null).Train(straight, lines, probe, Path.Combine(_dir, "a.hlm"), Options(6, false), record);

        TrainingResult stoppedRun;
        using (var first = Model())
            stoppedRun = new Trainer(TextWriter.Null).Train(first, lines, probe, Path.Combine(_dir, "b.hlm"), Options(3, false), record);
        // Stopped mid-epoch: the weights so far were validated and saved, so an interrupted run still leaves a
        // model, and the run reports that model's CER (no epoch had ended to give another).
        using (var saved = ModelFile.Load(Path.Combine(_dir, "b.hlm")))
        {
            Assert.NotNull(saved.Header.ValidationCer);
            Assert.Equal(saved.Header.ValidationCer!.Value, stoppedRun.BestValidationCer, 5);
        }
        using var resumed = Model(); // fresh weights: everything must come from the checkpoint
        new Trainer(TextWriter.Null).Train(resumed, lines, probe, Path.Combine(_dir, "b.hlm"), Options(6, true), record);

        foreach (var p in probe)
            Assert.Equal(straight.Run(p.Features).LogProbs, resumed.Run(p.Features).LogProbs);
    }

    [Fact]
    public void BatchesGroupSimilarWidthsAndDependOnlyOnSeedAndEpoch()
    {
        var lines = PatternLines(40, 5);
        var a = BatchPlan.BatchOrder(lines, 8, seed: 1, epoch: 0);
        var b = BatchPlan.BatchOrder(lines, 8, seed: 1, epoch: 0);
        Assert.Equal(a.Select(x => x.Select(s => s.Id)), b.Select(x => x.Select(s => s.Id)));
        Assert.Equal(40, a.Sum(x => x.Length));
        // Bucketing: a batch's width spread is small compared with the spread of the whole set.
        var wholeSpread = lines.Max(l => l.Frames) - lines.Min(l => l.Frames);
        Assert.All(a, batch => Assert.True(batch.Max(s => s.Frames) - batch.Min(s => s.Frames) <= wholeSpread / 2 + 8));
    }

    [Fact]
    public void EpochsOfAFixedLineCountWalkThroughWholeShuffledPasses()
    {
        var lines = PatternLines(40, 5);
        var options = new TrainingOptions { BatchSize = 8, Seed = 1, EpochLines = 24 }; // 3 batches an epoch, 5 a pass
        var walked = Enumerable.Range(0, 5).SelectMany(e => BatchPlan.EpochBatches(lines, options, e, 3, 5));
        var passes = Enumerable.Range(0, 3).SelectMany(p => BatchPlan.BatchOrder(lines, 8, 1, p));
        Assert.Equal(passes.Select(b => string.Join(",", b.Select(x => x.Id))), walked.Select(b => string.Join(",", b.Select(x => x.Id))));
        // Consecutive passes are shuffled differently.
        Assert.NotEqual(BatchPlan.BatchOrder(lines, 8, 1, 0).Select(b => b[0].Id), BatchPlan.BatchOrder(lines, 8, 1, 1).Select(b => b[0].Id));
    }

    [Theory]
    [InlineData(0.0, "[....................]")]
    [InlineData(0.5, "[##########..........]")]
    [InlineData(1.0, "[####################]")]
    [InlineData(1.7, "[####################]")]
    public void TheProgressBarShowsTheEpochShareDone(double done, string expected) =>
        Assert.Equal(expected, TrainingProgress.Bar(done));

    [Fact]
    public void TheStepSizeHoldsWhileTheLossFallsInTheAllBlankPhase()
    {
        // CTC first outputs blanks everywhere: the CER stays at 100 % while the validation loss falls. That is
        // progress; only epochs that improve neither CER nor loss halve the step size and count towards stopping.
        var options = new TrainingOptions { PlateauEpochs = 2, Patience = 4 };
        var s = new TrainingState(0, 0, 0, 0, 0, 0.001, double.PositiveInfinity, 0, 0, null);
        foreach (var loss in new[] { 4.6, 3.7, 3.6, 3.5, 3.4 })
            s = TrainingSchedule.AfterEpoch(s, 1.0, loss, options);
        Assert.Equal(0.001, s.LearningRate);
        Assert.Equal(0, s.EpochsSinceBest);
        Assert.Equal(3.4, s.BestLoss);

        s = TrainingSchedule.AfterEpoch(s, 1.0, 3.45, options); // neither better: one epoch without progress
        Assert.Equal((1, 0.001), (s.EpochsSinceBest, s.LearningRate));
        s = TrainingSchedule.AfterEpoch(s, 1.0, 3.39, options); // 0.3 % lower is below the 0.5 % that counts: the second halves the step size
        Assert.Equal((2, 0.0005), (s.EpochsSinceBest, s.LearningRate));
        Assert.Equal(3.39, s.BestLoss);
        s = TrainingSchedule.AfterEpoch(s, 0.9, 3.5, options); // a better CER alone is progress again
        Assert.Equal((0, 0.0005, 0.9), (s.EpochsSinceBest, s.LearningRate, s.BestCer));
    }

    [Fact]
    public void ACheckpointFromBeforeTheLossWasKeptResumesWithNoBestLoss()
    {
        // Older checkpoints have no best_loss: the first validation after resuming sets it.
        var old = new TrainingState(3, 0, 100, 10, 1, 0.0005, 0.2, 1, 0, 0.2);
        var json = System.Text.Json.JsonSerializer.Serialize(old).Replace(",\"best_loss\":null", "");
        Assert.DoesNotContain("best_loss", json);
        var back = System.Text.Json.JsonSerializer.Deserialize<TrainingState>(json)!;
        Assert.Null(back.BestLoss);
        var next = TrainingSchedule.AfterEpoch(back, 0.25, 2.0, new TrainingOptions());
        Assert.Equal((0, 2.0), (next.EpochsSinceBest, next.BestLoss));
    }
}
