using HandLine.Features;
using HandLine.Model;

namespace HandLine.Tests.Model;

/// <summary>
/// The lane runner gives a line the same bits whichever lines share its batch (what lets the batch runner mix
/// images without changing a report), and agrees with libtorch's own LSTM to float rounding.
/// </summary>
public sealed class LaneRunnerTests
{
    private static LineModel Model(bool convolution) =>
        LineModel.Create(CharacterSet.FromString("abc £½"),
            new FeatureConfig(LineHeight: 16, FrameStride: 2, Geometric: !convolution),
            new NetworkConfig(Hidden: 24, Layers: 2, Convolution: convolution), 7);

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void ALineHasTheSameBitsAloneAndInAnyBatch(bool convolution)
    {
        using var model = Model(convolution);
        var dim = model.Features.FrameDimension;
        var lines = Enumerable.Range(0, 11).Select(i => ModelFileTests.RandomFeatures(3 + 7 * i % 40, dim, 100 + i)).ToArray();
        var alone = lines.Select(l => model.RunInLanes([l], 4)[0].LogProbs).ToArray();

        var together = model.RunInLanes(lines, 4);
        var shuffled = lines.Reverse().Take(6).ToArray(); // other companions, other order, a part-filled group
        var again = model.RunInLanes(shuffled, 4);
        for (var i = 0; i < lines.Length; i++) Assert.Equal(alone[i], together[i].LogProbs);
        for (var i = 0; i < shuffled.Length; i++) Assert.Equal(alone[lines.Length - 1 - i], again[i].LogProbs);
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void AgreesWithTheLstmModuleToFloatRounding(bool convolution)
    {
        using var model = Model(convolution);
        var dim = model.Features.FrameDimension;
        var lines = Enumerable.Range(0, 5).Select(i => ModelFileTests.RandomFeatures(5 + 9 * i, dim, 200 + i)).ToArray();
        var lanes = model.RunInLanes(lines, 3);
        for (var i = 0; i < lines.Length; i++)
        {
            var reference = model.Run(lines[i]).LogProbs;
            Assert.Equal(reference.Length, lanes[i].LogProbs.Length);
            for (var k = 0; k < reference.Length; k++) Assert.InRange(Math.Abs(reference[k] - lanes[i].LogProbs[k]), 0, 1e-4);
        }
    }
}
