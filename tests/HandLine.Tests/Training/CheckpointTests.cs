using HandLine.Features;
using HandLine.Model;
using HandLine.Training;

namespace HandLine.Tests.Training;

public sealed class CheckpointTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-checkpoint-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void ACheckpointFromBeforeHandLinesOwnOptimiserIsRefusedWithAWayOut()
    {
        // Checkpoints written before AdamOptimiser held TorchSharp's optimiser state, which cannot be read now.
        var path = Path.Combine(_dir, "m.hlm.checkpoint");
        File.WriteAllBytes(path, [.. "HLCHECK1"u8, 1, 2, 3]);
        using var model = LineModel.Create(CharacterSet.FromString("ab"), new FeatureConfig(LineHeight: 8, FrameStride: 1), new NetworkConfig(4, 1, 0), 1);
        using var adam = new AdamOptimiser(model.Network.parameters(), 0.01);
        var e = Assert.Throws<InputException>(() => Checkpoint.Load(path, model.Network, adam));
        Assert.Equal(path, e.Path);
        Assert.Contains("older HandLine", e.Message);
        Assert.Contains("delete it", e.Message);
    }
}
