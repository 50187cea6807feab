using System.Security.Cryptography;
using HandLine.Adaptation;
using HandLine.Batch;
using HandLine.Model;
using HandLine.Review;
using HandLine.Tests.Review;
using HandLine.Tests.Training;
using HandLine.Training;

namespace HandLine.Tests.Adaptation;

public sealed class AdapterTests
{
    private static AdaptOptions Options(string images, double learningRate = 1e-7, int passes = 1) => new()
    {
        ImagesRoot = images,
        Replay = [DemoRunFixture.Fonts],
        LearningRate = learningRate,
        Passes = passes,
        Threads = 1,
        Augmentation = null,
    };

    private static AdaptResult Adapt(DemoRunFixture run, AdaptOptions options, string? corrections = null) =>
        Adapter.Run(run.Run, corrections ?? run.Corrections, run.Out, DemoRunFixture.ModelPath, options, TranscribeOptions.DefaultFlagBelow,
            null, new BatchOptions { Progress = ProgressStyle.None }, TextWriter.Null);

    [Fact]
    public void Corrections_that_do_not_fit_the_run_are_named_and_nothing_is_written()
    {
        using var run = new ReviewRunFixture();
        var line = ReviewRunFixture.Lines[0];
        var other = ReviewRunFixture.Lines[2];
        File.Delete(Path.Combine(run.Images, other.Source));
        var corrections = run.File_("c.tsv");
        File.WriteAllText(corrections, CorrectionsFile.Write(
        [
            new(line.Source, 0, "Paid to Wm Oakes for barley", line.Text, false),
            new("ledger/999.png", 0, "Rent", "Rnt", false),
            new(other.Source, 0, "Baptised Anne daughter of", other.Text, false),
        ]));
        var before = run.Snapshot();
        var outDir = run.File_("adapted");

        var e = Assert.Throws<InputException>(() => Adapter.Run(run.Run, corrections, outDir, DemoRunFixture.ModelPath,
            Options(run.Images), 0.64, null, new BatchOptions(), TextWriter.Null));

        Assert.Contains("source 'ledger/999.png' line 0 is not in the run", e.Message);
        Assert.Contains($"source '{other.Source}': image not found", e.Message);
        Assert.Contains("2 correction(s)", e.Message);
        Assert.False(Directory.Exists(outDir));
        Assert.Equal(before, run.Snapshot());
    }

    [Fact]
    public void A_manifest_naming_lines_not_in_the_run_or_missing_images_is_refused_too()
    {
        using var run = new ReviewRunFixture();
        var manifest = run.File_("keyed.tsv");
        File.WriteAllText(manifest,
            "#columns\tpath\ttext\tsource\tline\n" +
            $"lines/0001.png\tPaid to Wm Oakes\t{ReviewRunFixture.Lines[0].Source}\t0\n" +
            "lines/0002.png\tRent\tledger/002.png\t7\n");
        var outDir = run.File_("adapted");

        var e = Assert.Throws<InputException>(() => Adapter.Run(run.Run, manifest, outDir, DemoRunFixture.ModelPath,
            Options(run.Images), 0.64, null, new BatchOptions(), TextWriter.Null));

        Assert.Contains("image not found at " + run.File_(Path.Combine("lines", "0001.png")), e.Message);
        Assert.Contains("source 'ledger/002.png' line 7 is not in the run", e.Message);
        Assert.False(Directory.Exists(outDir));
    }

    [Fact]
    public void The_re_read_run_holds_every_source_once_and_the_corrected_lines_as_they_were()
    {
        using var run = new DemoRunFixture();
        // The editor applied the corrections first ('correct'); adapt keeps those records byte for byte.
        RunCorrector.Apply(run.Run, run.Corrections, DemoRunFixture.Images);
        var corrected = File.ReadAllLines(Path.Combine(run.Run, "lines.jsonl")).Where(l => l.Contains("\"corrected\":true", StringComparison.Ordinal)).ToArray();
        Assert.Equal(7, corrected.Length);

        // No replay here (the refusal test covers it), to keep the test short.
        var options = Options(DemoRunFixture.Images) with { ReplayShare = 0 };
        var result = Adapt(run, options);

        Assert.False(result.Refused);
        var lines = File.ReadAllLines(Path.Combine(run.Out, "lines.jsonl"));
        Assert.Equal(8, lines.Length);
        Assert.Equal(8, run.RunLines(run.Out).Select(r => (string)r["source"]!).Distinct().Count());
        Assert.All(corrected, c => Assert.Contains(c, lines));
        var fresh = Assert.Single(run.RunLines(run.Out), r => (string)r["source"]! == DemoRunFixture.Uncorrected);
        Assert.Null(fresh["corrected"]);
        Assert.Equal(1, result.SourcesRead);
        Assert.True(File.Exists(Path.Combine(run.Out, "summary.json")));
        Assert.True(File.Exists(Path.Combine(run.Out, "ledger-06.txt")));

        // The card records the run, the corrections' checksum and the check before and after.
        using var model = ModelFile.Load(Path.Combine(run.Out, Adapter.ModelFileName));
        var card = Assert.IsType<AdaptationRecord>(model.Header.Adaptation);
        Assert.Equal(Path.GetFullPath(run.Run), card.Run);
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(File.ReadAllBytes(run.Corrections))), card.CorrectionsSha256);
        Assert.Equal(result.HeldBackCerBefore, card.HeldBackCerBefore, 5);
        Assert.Equal(result.HeldBackCerAfter, card.HeldBackCerAfter, 5);
        Assert.Equal(7, card.TrainedLines + card.HeldBackLines);

        // The same command again finds its model and reuses the journalled reading.
        var again = Adapt(run, options);
        Assert.True(again.ModelReused);
        Assert.Equal(result.ModelId, again.ModelId);
        Assert.Equal(lines, File.ReadAllLines(Path.Combine(run.Out, "lines.jsonl")));
    }

    [Fact]
    public void An_adaptation_that_reads_the_held_back_lines_worse_is_refused_and_writes_nothing()
    {
        using var run = new DemoRunFixture();

        // A step size this large wrecks the model in one pass.
        var result = Adapt(run, Options(DemoRunFixture.Images, learningRate: 0.5));

        Assert.True(result.Refused);
        Assert.True(result.HeldBackCerAfter > result.HeldBackCerBefore, $"{result.HeldBackCerBefore} -> {result.HeldBackCerAfter}");
        Assert.Null(result.ModelPath);
        Assert.False(Directory.Exists(run.Out));
        // Replay mixing: one general line rendered per corrected training line.
        Assert.Equal(result.TrainedLines, result.ReplayLines);
    }

    [Fact]
    public void Fine_tuning_a_tiny_seeded_case_reads_the_held_back_lines_better()
    {
        var charset = CharacterSet.FromString("ab");
        using var model = LineModel.Create(charset, new HandLine.Features.FeatureConfig(LineHeight: 8, FrameStride: 1), new NetworkConfig(12, 1, 0, false), seed: 9);
        var train = TrainerTests.PatternLines(64, 1);
        var held = TrainerTests.PatternLines(8, 5);
        var before = Validation.Run(model, held).Cer;
        var dir = Directory.CreateTempSubdirectory("hl-fit-");
        try
        {
            var options = new AdaptOptions { ImagesRoot = ".", Replay = [], ReplayShare = 0, LearningRate = 0.02, Passes = 12, Threads = 1, Augmentation = null };
            var (after, _) = Adapter.Fit(model, train, [], held, Path.Combine(dir.FullName, "m.hlm"), options,
                new TrainingRecord("test", [], null, 1, 0, 0, 0, null), TextWriter.Null, default);
            Assert.True(after < before / 2, $"held-back CER {before:P1} -> {after:P1}");
        }
        finally
        {
            dir.Delete(recursive: true);
        }
    }

    [Fact]
    public void The_split_is_seeded_and_holds_back_a_share_of_at_least_five_lines()
    {
        var lines = TrainerTests.PatternLines(40, 1);
        var options = new AdaptOptions { ImagesRoot = ".", Replay = [], Seed = 3 };
        var (train, held) = Adapter.Split(lines, options);
        Assert.Equal(8, held.Count);
        Assert.Equal(32, train.Count);
        Assert.Empty(train.Select(l => l.Id).Intersect(held.Select(l => l.Id)));
        Assert.Equal(held.Select(l => l.Id), Adapter.Split(lines, options).Held.Select(l => l.Id));
        Assert.Equal(5, Adapter.Split(lines.Take(12).ToList(), options).Held.Count);
        Assert.Equal(2, Adapter.Split(lines.Take(4).ToList(), options).Held.Count);
    }

    [Fact]
    public void Replayed_lines_are_rendered_from_the_fonts_the_same_for_a_seed()
    {
        using var model = ModelFile.Load(DemoRunFixture.ModelPath);
        var first = ReplayLines.Load([DemoRunFixture.Fonts], 6, 2, model.Features, model.Charset);
        var again = ReplayLines.Load([DemoRunFixture.Fonts], 6, 2, model.Features, model.Charset);
        var other = ReplayLines.Load([DemoRunFixture.Fonts], 6, 3, model.Features, model.Charset);
        Assert.Equal(6, first.Count);
        Assert.Equal(first.Select(l => l.Text), again.Select(l => l.Text));
        Assert.NotEqual(first.Select(l => l.Text), other.Select(l => l.Text));
        // From a manifest too: its lines, drawn at random.
        var fromManifest = ReplayLines.Load([Path.Combine(DemoRunFixture.Images, "lines.tsv")], 3, 2, model.Features, model.Charset);
        Assert.Equal(3, fromManifest.Count);
        var demo = HandLine.Formats.Manifest.Read(Path.Combine(DemoRunFixture.Images, "lines.tsv")).Entries.Select(e => e.Text).ToHashSet();
        Assert.All(fromManifest, l => Assert.Contains(l.Text, demo));
    }
}
