using HandLine.Formats;
using HandLine.Proof;
using HandLine.Scoring;

namespace HandLine.Tests.Proof;

public sealed class StratifiedSamplingTests
{
    private static readonly Dictionary<string, int> Volumes = new()
    {
        ["ledger-1851"] = 120, ["ledger-1852"] = 45, ["register"] = 33, ["register/loose"] = 2,
    };

    [Theory]
    [InlineData(37)]
    [InlineData(1)]
    [InlineData(200)]
    public void EveryFolderGetsItsProportionalShareWithinOneLine(int count)
    {
        using var run = new ProofRunFixture(Volumes);
        var sample = ProofSampler.Draw(run.Run, run.Out("proof"), new ProofSampleOptions { Count = count, Seed = 4, ImagesRoot = run.Images });
        Assert.Equal(count, sample.Lines.Count);
        var total = Volumes.Values.Sum();
        foreach (var (folder, lines) in Volumes)
        {
            var drawn = sample.Lines.Count(l => l.Folder == folder);
            Assert.InRange(drawn, Math.Floor(count * lines / (double)total), Math.Ceiling(count * lines / (double)total));
            Assert.Contains((folder, lines, drawn), sample.Strata);
        }
    }

    [Fact]
    public void TheSameSeedGivesTheSameSampleAndAnotherSeedAnother()
    {
        using var run = new ProofRunFixture(Volumes);
        ProofSample Draw(string name, int seed) =>
            ProofSampler.Draw(run.Run, run.Out(name), new ProofSampleOptions { Fraction = 0.1, Seed = seed, ImagesRoot = run.Images });
        var a = Draw("a", 11);
        var b = Draw("b", 11);
        var c = Draw("c", 12);
        Assert.Equal(20, a.Lines.Count);
        Assert.Equal(a.Lines.Select(l => l.Source), b.Lines.Select(l => l.Source));
        Assert.Equal(File.ReadAllText(run.Out("a/keying.tsv")), File.ReadAllText(run.Out("b/keying.tsv")));
        Assert.NotEqual(a.Lines.Select(l => l.Source), c.Lines.Select(l => l.Source));
    }

    [Fact]
    public void PickCropsTheLinesWorthCorrectingFirstTheSameForASeed()
    {
        using var run = new ProofRunFixture(Volumes);
        ProofSample Draw(string name) =>
            ProofSampler.Draw(run.Run, run.Out(name), new ProofSampleOptions { Pick = 12, Seed = 5, ImagesRoot = run.Images });
        var a = Draw("a");
        Assert.Equal(12, a.Lines.Count);
        Assert.Equal(a.Lines.Select(l => l.Source), Draw("b").Lines.Select(l => l.Source));
        Assert.Equal(File.ReadAllText(run.Out("a/keying.tsv")), File.ReadAllText(run.Out("b/keying.tsv")));
        Assert.Contains("\"pick\": 12", File.ReadAllText(run.Out("a/sample.json")));
        Assert.Throws<ArgumentException>(() => ProofSampler.Draw(run.Run, run.Out("c"), new ProofSampleOptions { Pick = 3, Count = 3, Seed = 1, ImagesRoot = run.Images }));
    }

    [Fact]
    public void TheKeyingManifestHasEmptyTranscriptsAndTheMachineTextIsKeptApart()
    {
        using var run = new ProofRunFixture(Volumes);
        var dir = run.Out("proof");
        var sample = ProofSampler.Draw(run.Run, dir, new ProofSampleOptions { Count = 10, Seed = 1, ImagesRoot = run.Images });

        var manifest = Manifest.Read(Path.Combine(dir, ProofSampler.KeyingFileName));
        Assert.Empty(manifest.Errors);
        Assert.Equal(10, manifest.Entries.Count);
        Assert.All(manifest.Entries, e => Assert.Equal("", e.Text));
        Assert.All(manifest.Entries, e => Assert.True(File.Exists(e.FullPath)));
        Assert.DoesNotContain("machine", manifest.Columns);
        Assert.All(manifest.Entries, e => Assert.DoesNotContain(e.Columns.Values, v => v.Contains(" line ", StringComparison.Ordinal)));
        // The machine folder reads as a run whose sources are the crops, so score can match it to the keyed manifest.
        var machine = RunReader.ReadHypotheses(Path.Combine(dir, ProofSampler.MachineFolderName));
        Assert.Equal(sample.Lines.Select(l => l.CropPath).Order(StringComparer.Ordinal), machine.Keys.Order(StringComparer.Ordinal));
        Assert.All(sample.Lines, l => Assert.Equal(l.MachineText, machine[l.CropPath]));
        // Each entry's folder column is the volume the line came from, so --by folder scores per volume.
        Assert.All(manifest.Entries, e => Assert.Equal(ScoreBreakdown.FolderOf(e.Column("source")!), e.Column("folder")));
    }

    [Fact]
    public void MachineTextGoesIntoTheManifestOnlyWhenAskedFor()
    {
        using var run = new ProofRunFixture(Volumes);
        ProofSampler.Draw(run.Run, run.Out("proof"), new ProofSampleOptions { Count = 5, Seed = 1, ImagesRoot = run.Images, WithMachineText = true });
        var manifest = Manifest.Read(run.Out("proof/keying.tsv"));
        Assert.Contains("machine", manifest.Columns);
        Assert.All(manifest.Entries, e => Assert.Contains(" line ", e.Column("machine")));
        Assert.All(manifest.Entries, e => Assert.Equal("", e.Text));
    }

    [Fact]
    public void ASampleFolderIsNeverOverwrittenAndMissingImagesAreReported()
    {
        using var run = new ProofRunFixture(Volumes);
        var options = new ProofSampleOptions { Count = 5, Seed = 1, ImagesRoot = run.Images };
        ProofSampler.Draw(run.Run, run.Out("proof"), options);
        Assert.Throws<InputException>(() => ProofSampler.Draw(run.Run, run.Out("proof"), options));
        Assert.Throws<InputException>(() => ProofSampler.Draw(run.Run, run.Out("other"), options with { ImagesRoot = run.Out("nowhere") }));
        Assert.Throws<ArgumentException>(() => ProofSampler.Draw(run.Run, run.Out("big"), options with { Count = 201 }));
    }

    [Theory]
    [InlineData(new[] { 10, 10, 10 }, 2, new[] { 1, 1, 0 })] // equal remainders go to the earlier folders
    [InlineData(new[] { 120, 45, 33, 2 }, 37, new[] { 22, 8, 6, 1 })] // shares 22.2, 8.3, 6.1, 0.37 -> remainders
    [InlineData(new[] { 5, 0, 5 }, 10, new[] { 5, 0, 5 })]
    public void AllocationRoundsByLargestRemainder(int[] sizes, int total, int[] expected) =>
        Assert.Equal(expected, StratifiedAllocation.Allocate(sizes, total));
}
