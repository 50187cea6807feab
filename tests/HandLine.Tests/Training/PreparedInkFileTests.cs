using HandLine.Features;
using HandLine.Formats;
using HandLine.Imaging;
using HandLine.Model;
using HandLine.Synthesis;
using HandLine.Tests.Synthesis;
using HandLine.Training;

namespace HandLine.Tests.Training;

public sealed class PreparedInkFileTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-prep-").FullName;
    private static readonly FeatureConfig Features = new(LineHeight: 24, FrameStride: 2);

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private string WriteManifest()
    {
        var font = SynthesisFixtures.Font(SynthesisFixtures.Comic);
        var clean = Degradation.Sample(new Random(1), DegradationRanges.None);
        string[] texts = ["Recd 7/6", "hay 2 cwt", "Pd Thos. 4s"];
        for (var i = 0; i < texts.Length; i++)
            File.WriteAllBytes(Path.Combine(_dir, $"{i}.png"), LineSynthesiser.EncodePng(LineRenderer.Render(texts[i], font, clean)));
        File.WriteAllBytes(Path.Combine(_dir, "blank.png"), LineSynthesiser.EncodePng(new GrayImage(60, 20, Enumerable.Repeat(1f, 1200).ToArray())));
        var manifest = Path.Combine(_dir, "lines.tsv");
        Manifest.Write(manifest, [("0.png", texts[0]), ("blank.png", "gone"), ("1.png", texts[1]), ("2.png", texts[2])]);
        return manifest;
    }

    private static (IReadOnlyList<LineSample> Samples, IReadOnlyList<InputException> Errors, List<string> Notes) Load(string manifest, bool keep)
    {
        var notes = new List<string>();
        var (samples, errors) = TrainingData.Load([manifest], Features, CharacterSet.Default, InputLimits.Default, 1, keep, notes.Add);
        return (samples, errors, notes);
    }

    private static void AssertSame(IReadOnlyList<LineSample> expected, IReadOnlyList<LineSample> actual)
    {
        Assert.Equal(expected.Select(s => (s.Id, s.Text, s.Width)), actual.Select(s => (s.Id, s.Text, s.Width)));
        for (var i = 0; i < expected.Count; i++)
            Assert.Equal(expected[i].Ink().Pixels, actual[i].Ink().Pixels);
    }

    [Fact]
    public void AStopWhilePreparingEndsAtOnceAndKeepsNothing()
    {
        var manifest = WriteManifest();
        using var stop = new CancellationTokenSource();
        stop.Cancel();
        Assert.ThrowsAny<OperationCanceledException>(() => TrainingData.Load([manifest], Features, CharacterSet.Default,
            InputLimits.Default, 1, keepPrepared: true, cancel: stop.Token));
        Assert.Empty(Directory.GetFiles(_dir, "*.prepared*"));
    }

    [Fact]
    public void KeptLinesReadBackExactlyAsPreparedAndKeepTheirErrors()
    {
        var manifest = WriteManifest();
        var fresh = Load(manifest, keep: false);
        Assert.False(File.Exists(PreparedInkFile.CachePath(manifest)));
        Assert.Equal(3, fresh.Samples.Count);
        Assert.Contains("blank.png", Assert.Single(fresh.Errors).Path);

        var first = Load(manifest, keep: true);
        Assert.StartsWith("kept 4 prepared lines", Assert.Single(first.Notes));
        var second = Load(manifest, keep: true);
        Assert.StartsWith("read 4 prepared lines", Assert.Single(second.Notes));

        AssertSame(fresh.Samples, first.Samples);
        AssertSame(fresh.Samples, second.Samples);
        Assert.Equal(fresh.Errors.Select(e => (e.Path, e.Stage, e.Reason)), second.Errors.Select(e => (e.Path, e.Stage, e.Reason)));
    }

    [Fact]
    public void AChangedImageOrADamagedFileMeansPreparingAfresh()
    {
        var manifest = WriteManifest();
        Load(manifest, keep: true);

        // Another image under the same name: its size and time change, so the kept lines no longer fit.
        File.Copy(Path.Combine(_dir, "2.png"), Path.Combine(_dir, "1.png"), overwrite: true);
        File.SetLastWriteTimeUtc(Path.Combine(_dir, "1.png"), DateTime.UtcNow.AddMinutes(1));
        var changed = Load(manifest, keep: true);
        Assert.StartsWith("kept", Assert.Single(changed.Notes));
        Assert.Equal(changed.Samples[2].Ink().Pixels, changed.Samples[1].Ink().Pixels);

        // Cut short, as a full disk or a killed run would leave it (though writes go through a temp file).
        var cache = PreparedInkFile.CachePath(manifest);
        var bytes = File.ReadAllBytes(cache);
        File.WriteAllBytes(cache, bytes[..(bytes.Length - 10)]);
        var damaged = Load(manifest, keep: true);
        Assert.StartsWith("kept", Assert.Single(damaged.Notes));
        AssertSame(changed.Samples, damaged.Samples);
        Assert.Equal(bytes, File.ReadAllBytes(cache));
    }

    [Fact]
    public void OtherImagingSettingsDoNotReuseTheKeptLines()
    {
        var manifest = WriteManifest();
        Load(manifest, keep: true);
        var notes = new List<string>();
        var (samples, _) = TrainingData.Load([manifest], Features with { LineHeight = 32 }, CharacterSet.Default, InputLimits.Default, 1, true, notes.Add);
        Assert.StartsWith("kept", Assert.Single(notes));
        Assert.All(samples, s => Assert.Equal(32, s.Ink().Height));
    }
}
