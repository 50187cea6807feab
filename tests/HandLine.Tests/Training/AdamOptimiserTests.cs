using HandLine.Features;
using HandLine.Model;
using HandLine.Tests.Model;
using HandLine.Training;
using static TorchSharp.torch;

namespace HandLine.Tests.Training;

public sealed class AdamOptimiserTests
{
    private static readonly FeatureConfig Config = new(LineHeight: 8, FrameStride: 1);

    private static LineModel Model() =>
        LineModel.Create(CharacterSet.FromString("ab"), Config, new NetworkConfig(6, 1, 0, Convolution: false), seed: 4);

    private static Tensor Loss(LineModel model, int step)
    {
        // A fixed, step-dependent target: squared distance of the network's outputs from a seeded pattern.
        var frames = ModelFileTests.RandomFeatures(5, Config.FrameDimension, step);
        var output = model.Network.call(tensor(frames.Values, [5, 1, Config.FrameDimension]), tensor(new long[] { 5 }));
        using var target = rand(output.shape, generator: new TorchSharp.torch.Generator((ulong)(step + 1)));
        return (output - target).pow(tensor(2f)).sum();
    }

    [Fact]
    public void TwentyStepsMatchTorchSharpsAdam()
    {
        // Reference: TorchSharp's own Adam (PyTorch's algorithm, Kingma & Ba 2015) on the same network, the same
        // losses and the same step size; HandLine's optimiser differs only in how it hands numbers to libtorch.
        using var ours = Model();
        using var theirs = Model();
        using var adam = new AdamOptimiser(ours.Network.parameters(), learningRate: 0.01);
        using var reference = optim.Adam(theirs.Network.parameters(), lr: 0.01);
        for (var step = 0; step < 20; step++)
        {
            using var scope = NewDisposeScope();
            adam.ZeroGrad();
            Loss(ours, step).backward();
            adam.Step();
            reference.zero_grad();
            Loss(theirs, step).backward();
            reference.step();
        }
        var a = ours.Network.parameters().ToArray();
        var b = theirs.Network.parameters().ToArray();
        Assert.Equal(b.Length, a.Length);
        for (var i = 0; i < a.Length; i++)
        {
            var x = a[i].data<float>().ToArray();
            var y = b[i].data<float>().ToArray();
            for (var k = 0; k < x.Length; k++) Assert.Equal(y[k], x[k], 5);
        }
        Assert.Equal(20, adam.Steps);
        // The weights did move: the comparison above is not between two untouched networks.
        using var fresh = Model();
        Assert.NotEqual(fresh.Network.parameters().First().data<float>().ToArray(), a[0].data<float>().ToArray());
    }

    [Fact]
    public void SavedStateLoadsIntoAFreshOptimiserAndContinuesIdentically()
    {
        using var model = Model();
        using var adam = new AdamOptimiser(model.Network.parameters(), 0.01);
        for (var step = 0; step < 3; step++)
        {
            using var scope = NewDisposeScope();
            adam.ZeroGrad();
            Loss(model, step).backward();
            adam.Step();
        }
        using var ms = new MemoryStream();
        using (var w = new BinaryWriter(ms, System.Text.Encoding.UTF8, leaveOpen: true)) adam.Save(w);

        using var copy = Model();
        foreach (var (to, from) in copy.Network.parameters().Zip(model.Network.parameters()))
            using (no_grad()) to.copy_(from);
        using var resumed = new AdamOptimiser(copy.Network.parameters(), 0.01);
        ms.Position = 0;
        using (var r = new BinaryReader(ms)) resumed.Load(r);
        Assert.Equal(3, resumed.Steps);
        foreach (var (m, opt) in new[] { (model, adam), (copy, resumed) })
        {
            using var scope = NewDisposeScope();
            opt.ZeroGrad();
            Loss(m, 3).backward();
            opt.Step();
        }
        Assert.Equal(model.Network.parameters().First().data<float>().ToArray(), copy.Network.parameters().First().data<float>().ToArray());
    }

    [Fact]
    public void StateForAnotherNetworkShapeIsRefused()
    {
        using var model = Model();
        using var adam = new AdamOptimiser(model.Network.parameters(), 0.01);
        using var ms = new MemoryStream();
        using (var w = new BinaryWriter(ms, System.Text.Encoding.UTF8, leaveOpen: true)) adam.Save(w);
        using var other = LineModel.Create(CharacterSet.FromString("ab"), Config, new NetworkConfig(7, 1, 0, Convolution: false), seed: 4);
        using var wrong = new AdamOptimiser(other.Network.parameters(), 0.01);
        ms.Position = 0;
        using var r = new BinaryReader(ms);
        var e = Assert.Throws<InvalidOperationException>(() => wrong.Load(r));
        Assert.Contains("another shape", e.Message);
    }
}
