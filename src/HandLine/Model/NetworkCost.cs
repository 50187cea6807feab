using HandLine.Features;

namespace HandLine.Model;

/// <summary>
/// Floating-point operations the network spends on one frame, counted from its layer shapes: a multiply-add is two
/// operations; activations, pooling, log-softmax and padding are left out (they are element-wise and small beside
/// the matrix products). Used by `handline bench` to put a measured speed against the machine's matrix-multiply
/// ceiling.
/// </summary>
public static class NetworkCost
{
    /// <summary>Operations per frame of a network of this shape reading these features into this many classes.</summary>
    public static double FlopsPerFrame(FeatureConfig features, NetworkConfig network, int classes)
    {
        ArgumentNullException.ThrowIfNull(features);
        ArgumentNullException.ThrowIfNull(network);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(classes);
        double flops = 0;
        var input = features.FrameDimension;
        if (network.Convolution)
        {
            // A frame is S columns of H pixels. First 3×3 convolution, 1 → 16 channels at every pixel; second,
            // 16 → 32 channels on the half-height map (the first pool halves the height only).
            var h = features.LineHeight;
            var s = features.FrameStride;
            flops += 2.0 * 1 * 16 * 9 * h * s;
            flops += 2.0 * 16 * 32 * 9 * (h / 2) * s;
            input = ColumnConvolution.OutputSize(h);
        }
        // Each LSTM layer and direction: the four gates are [input + hidden] × [4 hidden] per frame.
        var hidden = network.Hidden;
        for (var layer = 0; layer < network.Layers; layer++)
        {
            var layerInput = layer == 0 ? input : 2 * hidden;
            flops += 2 * 2.0 * (layerInput + hidden) * 4 * hidden;
        }
        flops += 2.0 * 2 * hidden * classes; // output layer over both directions
        return flops;
    }

    /// <summary>Operations per frame of this model.</summary>
    public static double FlopsPerFrame(LineModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        return FlopsPerFrame(model.Features, model.Header.Network, model.Charset.ClassCount);
    }
}
