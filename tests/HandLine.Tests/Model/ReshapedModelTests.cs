using HandLine.Features;
using HandLine.Model;

namespace HandLine.Tests.Model;

/// <summary>Warm starts of another line height or LSTM width (<c>train --from M --line-height H / --hidden N</c>).</summary>
public sealed class ReshapedModelTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-reshape-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static LineModel Small(int seed = 2) =>
        LineModel.Create(CharacterSet.Default, new FeatureConfig(LineHeight: 16, FrameStride: 2), new NetworkConfig(Hidden: 8, Layers: 2, Convolution: true), seed);

    [Fact]
    public void AWiderLstmReadsExactlyAsTheSourceUntilTrained()
    {
        // The new units' outgoing weights are zero, so nothing they compute reaches an old unit, the next layer or
        // the output layer: the posteriors are the source's (to float rounding).
        using var model = Small();
        using var wider = model.Reshaped(model.Features, model.Header.Network with { Hidden = 13 }, seed: 5);
        Assert.Equal(13, wider.Header.Network.Hidden);
        for (var seed = 1; seed <= 3; seed++)
        {
            var input = ModelFileTests.RandomFeatures(21, model.Features.FrameDimension, seed);
            var before = model.Run(input);
            var after = wider.Run(input);
            Assert.Equal(before.Frames, after.Frames);
            for (var t = 0; t < before.Frames; t++)
                for (var c = 0; c < before.Classes; c++)
                    Assert.Equal(before[t, c], after[t, c], tolerance: 1e-5);
        }
    }

    [Fact]
    public void TheWiderModelsNewUnitsAreStillRandomSoTrainingCanUseThem()
    {
        // Zero outgoing weights alone would leave every new unit identical; their incoming weights keep the
        // seeded random initialisation, so the units differ and each gets its own gradient.
        using var model = Small();
        using var a = model.Reshaped(model.Features, model.Header.Network with { Hidden = 12 }, seed: 5);
        using var b = model.Reshaped(model.Features, model.Header.Network with { Hidden = 12 }, seed: 5);
        using var c = model.Reshaped(model.Features, model.Header.Network with { Hidden = 12 }, seed: 6);
        var path = Path.Combine(_dir, "a.hlm");
        a.Save(path, null, null);
        using var loaded = ModelFile.Load(path);
        var input = ModelFileTests.RandomFeatures(9, model.Features.FrameDimension, 3);
        Assert.Equal(a.Run(input).LogProbs, b.Run(input).LogProbs); // seeded
        Assert.Equal(a.Run(input).LogProbs, loaded.Run(input).LogProbs); // the shape is in the header
        Assert.Equal(12, loaded.Header.Network.Hidden);
        // Another seed draws other new units but, with no say yet, reads the same.
        var pa = a.Run(input);
        var pc = c.Run(input);
        for (var t = 0; t < pa.Frames; t++)
            Assert.Equal(pa[t, 1], pc[t, 1], tolerance: 1e-5);
    }

    [Fact]
    public void ATallerInputTakesFeaturesOfItsOwnHeight()
    {
        using var model = Small();
        var taller = model.Features with { LineHeight = 24, FrameStride = 3 };
        using var reshaped = model.Reshaped(taller, model.Header.Network, seed: 5);
        Assert.Equal(taller, reshaped.Features);
        Assert.Null(reshaped.Header.ValidationCer);
        var posteriors = reshaped.Run(ModelFileTests.RandomFeatures(11, taller.FrameDimension, 4));
        Assert.Equal(11, posteriors.Frames);
        Assert.Throws<ArgumentException>(() => reshaped.Run(ModelFileTests.RandomFeatures(11, model.Features.FrameDimension, 4)));
    }

    [Fact]
    public void RowResamplingInterpolatesBetweenRowCentresAndKeepsTheSum()
    {
        // Two rows to four: the new rows' centres fall at source rows -0.25, 0.25, 0.75, 1.25 (clamped to 0 and 1),
        // each value scaled by 2/4 so that the sum over rows is kept. Worked by hand.
        Span<float> row = stackalloc float[8];
        LineNetwork.ResampleChannelRows([1f, 3f, 10f, 20f], row, sourceRows: 2, rows: 4);
        float[] expected = [0.5f, 0.75f, 1.25f, 1.5f, 5f, 6.25f, 8.75f, 10f];
        Assert.Equal(expected, row.ToArray());
        Assert.Equal(1f + 3f, row[..4].ToArray().Sum(), 5);
        Assert.Equal(10f + 20f, row[4..].ToArray().Sum(), 5);

        // Same rows: unchanged.
        Span<float> same = stackalloc float[3];
        LineNetwork.ResampleChannelRows([4f, 5f, 6f], same, sourceRows: 3, rows: 3);
        Assert.Equal([4f, 5f, 6f], same.ToArray());
    }

    [Fact]
    public void ShapesThatCannotCarryTheWeightsOverAreRefused()
    {
        using var model = Small();
        var net = model.Header.Network;
        Assert.Throws<ArgumentException>(() => model.Reshaped(model.Features, net with { Hidden = 6 }, 1));   // shrinks
        Assert.Throws<ArgumentException>(() => model.Reshaped(model.Features, net with { Layers = 3 }, 1));   // deeper
        Assert.Throws<ArgumentException>(() => model.Reshaped(model.Features with { CorrectSlant = false }, net, 1));
        using var pixels = LineModel.Create(CharacterSet.Default, new FeatureConfig(LineHeight: 16, FrameStride: 2), new NetworkConfig(Hidden: 8), 1);
        Assert.Throws<ArgumentException>(() => pixels.Reshaped(pixels.Features, pixels.Header.Network with { Hidden = 12 }, 1));
    }
}
