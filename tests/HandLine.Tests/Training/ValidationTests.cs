using System.Globalization;
using HandLine.Decoding;
using HandLine.Features;
using HandLine.Formats;
using HandLine.Imaging;
using HandLine.Model;
using HandLine.Scoring;
using HandLine.Synthesis;
using HandLine.Tests.Synthesis;
using HandLine.Training;

namespace HandLine.Tests.Training;

public sealed class ValidationTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-valid-").FullName;
    private static readonly FeatureConfig Config = new(LineHeight: 8, FrameStride: 1);

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    /// <summary>Pattern lines in three families of two groups: f0 and f1 in "script", f2 in "digits".</summary>
    private static List<LineSample> Styled(int count, int seed) =>
        TrainerTests.PatternLines(count, seed).Select((s, i) =>
            new LineSample(s.Id, s.Text, s.Ink(), s.Config, s.Target) { Family = $"f{i % 3}", Group = i % 3 == 2 ? "digits" : "script" }).ToList();

    private static LineModel Model() =>
        LineModel.Create(CharacterSet.FromString("ab"), Config, new NetworkConfig(12, 1, 0, false), seed: 9);

    [Fact]
    public void Styles_split_the_pooled_validation_CER_and_the_worst_family_is_the_highest()
    {
        using var model = Model();
        var valid = Styled(12, 2);

        var result = Validation.Run(model, valid);

        // The same lines scored one by one, outside Validation: greedy decoding, Levenshtein over code points.
        var counts = valid.Select(s => (s, c: EditDistance.AlignCharacters(s.Text, GreedyDecoder.Decode(model.Run([s.Features])[0], model.Charset).Text))).ToList();
        Assert.Equal(counts.Sum(x => x.c.Distance) / (double)counts.Sum(x => x.c.TruthLength), result.Cer, 12);
        Assert.Equal(result.Cer, Trainer.Validate(model, valid), 12);
        Assert.Equal(new[] { "digits", "script" }, result.ByGroup!.Groups.Select(g => g.Value));
        Assert.Equal(new[] { "f0", "f1", "f2" }, result.ByFamily!.Groups.Select(g => g.Value));
        foreach (var family in result.ByFamily.Groups)
        {
            var mine = counts.Where(x => x.s.Family == family.Value).ToList();
            Assert.Equal(mine.Sum(x => x.c.Distance), family.CharCounts.Distance);
            Assert.Equal(mine.Sum(x => x.s.Target.Length), family.CharCounts.TruthLength);
        }
        Assert.Equal(result.ByFamily.Groups.Max(g => g.Cer), result.WorstFamily!.Cer);
        Assert.Equal(counts.Sum(x => x.c.TruthLength), result.ByGroup.Groups.Sum(g => g.CharCounts.TruthLength));
        var line = result.StylesLine()!;
        Assert.Contains("by group digits ", line);
        Assert.Contains(string.Create(CultureInfo.InvariantCulture, $"worst family {result.WorstFamily.Value} {result.WorstFamily.Cer:P2} (of 3 families"), line);

        // Lines without styles: no breakdown, no extra line.
        var plain = Validation.Run(model, TrainerTests.PatternLines(4, 2));
        Assert.Null(plain.ByFamily);
        Assert.Null(plain.StylesLine());
    }

    [Fact]
    public void The_epoch_report_and_log_carry_the_worst_family()
    {
        using var model = Model();
        var progress = new StringWriter();
        var outPath = Path.Combine(_dir, "m.hlm");
        new Trainer(progress).Train(model, TrainerTests.PatternLines(16, 1), Styled(6, 3), outPath,
            new TrainingOptions { Epochs = 2, BatchSize = 8, LearningRate = 0.01, Seed = 4, Threads = 1 },
            new TrainingRecord("test", [], null, 4, 0, 0, 0, null));

        Assert.Equal(2, progress.ToString().Split('\n').Count(l => l.StartsWith("  validation CER by group digits ") && l.Contains("; worst family f")));
        var log = File.ReadAllLines(outPath + ".log.csv");
        Assert.EndsWith(",valid_loss,worst_family,worst_family_cer", log[0]);
        Assert.Equal(3, log.Length);
        Assert.All(log.Skip(1), row => Assert.Matches(@",f[012],[01]\.\d{5}$", row));
    }

    [Fact]
    public void Training_data_takes_family_and_group_from_the_manifest()
    {
        var clean = Degradation.Sample(new Random(1), DegradationRanges.None);
        var font = SynthesisFixtures.Font(SynthesisFixtures.Humor);
        File.WriteAllBytes(Path.Combine(_dir, "0.png"), LineSynthesiser.EncodePng(LineRenderer.Render("Recd 7/6", font, clean)));
        File.WriteAllBytes(Path.Combine(_dir, "1.png"), LineSynthesiser.EncodePng(LineRenderer.Render("hay 2 cwt", font, clean)));
        var manifest = Path.Combine(_dir, "lines.tsv");
        Manifest.Write(manifest, ["group", "family"], [("0.png", "Recd 7/6", ["sketch", "humor-sans"]), ("1.png", "hay 2 cwt", ["sketch", ""])]);

        var (samples, errors) = TrainingData.Load([manifest], new FeatureConfig(LineHeight: 24, FrameStride: 2), CharacterSet.Default, InputLimits.Default, 1);

        Assert.Empty(errors);
        Assert.Equal(new (string?, string?)[] { ("humor-sans", "sketch"), ("", "sketch") }, samples.Select(s => (s.Family, s.Group)));
        Manifest.Write(manifest, [("0.png", "Recd 7/6")]);
        Assert.Equal((null, null), TrainingData.Load([manifest], new FeatureConfig(LineHeight: 24, FrameStride: 2), CharacterSet.Default, InputLimits.Default, 1).Samples
            .Select(s => (s.Family, s.Group)).Single());
    }
}
