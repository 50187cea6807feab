using HandLine.Features;
using static TorchSharp.torch;

namespace HandLine.Model;

/// <summary>Turns feature sequences of different lengths into one padded [T, B, D] tensor and lengths.</summary>
internal static class Batching
{
    public static (Tensor Frames, Tensor Lengths) Stack(IReadOnlyList<FeatureSequence> lines)
    {
        var maxT = lines.Max(l => l.Frames);
        var dim = lines[0].Dimension;
        var buffer = new float[maxT * lines.Count * dim]; // [T, B, D], zero = background padding
        var lengths = new long[lines.Count];
        for (var b = 0; b < lines.Count; b++)
        {
            var l = lines[b];
            lengths[b] = l.Frames;
            for (var t = 0; t < l.Frames; t++)
                Array.Copy(l.Values, t * dim, buffer, (t * lines.Count + b) * dim, dim);
        }
        return (tensor(buffer, [maxT, lines.Count, dim]), tensor(lengths));
    }
}
