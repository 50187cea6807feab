using HandLine.Features;
using HandLine.Model;

namespace HandLine.Tests.Model;

public sealed class ModelFileTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-model-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    internal static LineModel SmallModel(int seed = 5) =>
        LineModel.Create(CharacterSet.FromString("abc £½"), new FeatureConfig(LineHeight: 16, FrameStride: 2, Geometric: true),
            new NetworkConfig(Hidden: 8, Layers: 2), seed);

    internal static FeatureSequence RandomFeatures(int frames, int dim, int seed)
    {
        var rng = new Random(seed);
        return new FeatureSequence(frames, dim, Enumerable.Range(0, frames * dim).Select(_ => (float)rng.NextDouble()).ToArray());
    }

    [Fact]
    public void SavedModelLoadsWithIdenticalHeaderAndOutputs()
    {
        using var model = SmallModel();
        var path = Path.Combine(_dir, "m.hlm");
        var id = model.Save(path, new TrainingRecord("test", ["a.tsv"], "v.tsv", 5, 1, 10, 0.1, null), 0.25);
        var input = RandomFeatures(11, model.Features.FrameDimension, 1);
        var before = model.Run(input).LogProbs;

        using var loaded = ModelFile.Load(path);
        Assert.Equal(id, loaded.Id);
        Assert.Equal(model.Charset.ToString(), loaded.Charset.ToString());
        Assert.Equal(model.Features, loaded.Features);
        Assert.Equal(0.25, loaded.Header.ValidationCer);
        Assert.Equal("a.tsv", Assert.Single(loaded.Header.Training!.TrainData));
        Assert.Equal(before, loaded.Run(input).LogProbs);
        Assert.Equal(64, loaded.Header.WeightsSha256.Length);
    }

    [Fact]
    public void ALineReadsTheSameAloneAndInABatch()
    {
        // Packing keeps padding out of the backward LSTM; without it the short line would change.
        using var model = SmallModel();
        var shortLine = RandomFeatures(5, model.Features.FrameDimension, 2);
        var longLine = RandomFeatures(17, model.Features.FrameDimension, 3);
        var alone = model.Run(shortLine).LogProbs;
        var batched = model.Run([longLine, shortLine])[1].LogProbs;
        for (var i = 0; i < alone.Length; i++) Assert.Equal(alone[i], batched[i], 4);
    }

    [Theory]
    [InlineData("flip-weights")]
    [InlineData("flip-header")]
    [InlineData("truncate")]
    [InlineData("magic")]
    [InlineData("empty")]
    public void DamagedFilesAreRejectedWithAClearMessage(string damage)
    {
        using var model = SmallModel();
        var path = Path.Combine(_dir, "m.hlm");
        model.Save(path, null, null);
        var bytes = File.ReadAllBytes(path);
        bytes = damage switch
        {
            "flip-weights" => Flip(bytes, bytes.Length - 100),
            "flip-header" => Flip(bytes, 20),
            "truncate" => bytes[..(bytes.Length / 2)],
            "magic" => Flip(bytes, 0),
            _ => [],
        };
        File.WriteAllBytes(path, bytes);

        var e = Assert.Throws<InputException>(() => ModelFile.Load(path));
        Assert.Equal(path, e.Path);
        Assert.Equal("model", e.Stage);
        Assert.Matches(damage switch
        {
            "magic" or "empty" => "not a HandLine model file",
            _ => "checksum mismatch",
        }, e.Reason);
    }

    [Fact]
    public void AMissingFileIsAReadError()
    {
        var e = Assert.Throws<InputException>(() => ModelFile.Load(Path.Combine(_dir, "none.hlm")));
        Assert.Contains("cannot read the model file", e.Reason);
    }

    private static byte[] Flip(byte[] bytes, int at)
    {
        var copy = (byte[])bytes.Clone();
        copy[at] ^= 0x5a;
        return copy;
    }
}
