using HandLine.Features;
using HandLine.Model;
using static TorchSharp.torch;

namespace HandLine.Tests.Model;

public sealed class ColumnConvolutionTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-conv-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static readonly FeatureConfig Pixels = new(LineHeight: 16, FrameStride: 2);

    private static LineModel ConvModel(FeatureConfig features, int seed = 5) =>
        LineModel.Create(CharacterSet.FromString("abc £½"), features, new NetworkConfig(Hidden: 8, Layers: 1, Convolution: true), seed);

    [Fact]
    public void OnePixelReachesOnlyTheFramesItsFiltersCover()
    {
        // Rebuilding the line image from the frames must put every column back where it was: two 3x3 filters
        // reach two columns either side, so ink at column 20 (frame 10 of stride-2 frames) may change frames 9-11
        // only. A wrong reshape would scatter the change across other frames.
        using var scope = NewDisposeScope();
        using var front = new ColumnConvolution(lineHeight: 16, frameStride: 2);
        var line = ModelFileTests.RandomFeatures(20, Pixels.FrameDimension, 1);
        var changed = (float[])line.Values.Clone();
        changed[20 * 16 + 7] += 1f; // column 20, row 7 (a frame is its columns' values, top to bottom, in turn)

        Tensor Run(float[] v) => front.call(tensor(v, [20, 1, Pixels.FrameDimension]), tensor(new long[] { 20 }));
        var before = Run(line.Values);
        var after = Run(changed);
        Assert.Equal([20L, 1L, ColumnConvolution.OutputSize(16)], before.shape);
        var moved = (after - before).abs().amax([1, 2]).data<float>().ToArray();
        for (var t = 0; t < 20; t++)
        {
            if (t is >= 9 and <= 11) continue;
            Assert.True(moved[t] == 0f, $"frame {t} changed by {moved[t]}");
        }
        Assert.True(moved[10] > 0f, "the frame holding the pixel did not change");
    }

    [Fact]
    public void ALineReadsTheSameAloneAndInABatch()
    {
        // Zero padding frames look like the convolutions' own zero border, so padding cannot reach a short line.
        using var model = ConvModel(Pixels);
        var shortLine = ModelFileTests.RandomFeatures(5, Pixels.FrameDimension, 2);
        var longLine = ModelFileTests.RandomFeatures(17, Pixels.FrameDimension, 3);
        var alone = model.Run(shortLine).LogProbs;
        var batched = model.Run([longLine, shortLine])[1].LogProbs;
        for (var i = 0; i < alone.Length; i++) Assert.Equal(alone[i], batched[i], 4);
    }

    [Fact]
    public void AConvolutionalModelSavesAndLoadsWithIdenticalOutputs()
    {
        using var model = ConvModel(Pixels);
        var path = Path.Combine(_dir, "conv.hlm");
        model.Save(path, null, null);
        var input = ModelFileTests.RandomFeatures(9, Pixels.FrameDimension, 4);
        using var loaded = ModelFile.Load(path);
        Assert.True(loaded.Header.Network.Convolution);
        Assert.Equal(model.Run(input).LogProbs, loaded.Run(input).LogProbs);
    }

    [Fact]
    public void GeometricFeaturesAreRefusedWithAReason()
    {
        var e = Assert.Throws<ArgumentException>(() => ConvModel(Pixels with { Geometric = true }));
        Assert.Contains("pixel columns only", e.Message);
    }
}
