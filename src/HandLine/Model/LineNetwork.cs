using HandLine.Features;
using TorchSharp;
using TorchSharp.Modules;
using static TorchSharp.torch;

namespace HandLine.Model;

/// <summary>
/// Bidirectional LSTM over column frames (optionally after a <see cref="ColumnConvolution"/> front end), then a
/// linear layer and log-softmax over the character set plus the CTC blank (class 0). Input [T, B, D] with
/// per-item lengths; output log-probabilities [T, B, C].
/// </summary>
public sealed class LineNetwork : nn.Module<Tensor, Tensor, Tensor>
{
    private readonly ColumnConvolution? front;
    private readonly LSTM lstm;
    private readonly Dropout dropout;
    private readonly Linear output;

    public LineNetwork(FeatureConfig features, NetworkConfig config, int classCount) : base(nameof(LineNetwork))
    {
        config.Validate(features);
        var inputSize = features.FrameDimension;
        if (config.Convolution)
        {
            front = new ColumnConvolution(features.LineHeight, features.FrameStride);
            inputSize = ColumnConvolution.OutputSize(features.LineHeight);
        }
        lstm = nn.LSTM(inputSize, config.Hidden, numLayers: config.Layers, bidirectional: true,
            dropout: config.Layers > 1 ? config.Dropout : 0);
        dropout = nn.Dropout(config.Dropout);
        output = nn.Linear(2 * config.Hidden, classCount);
        RegisterComponents();
    }

    /// <summary>The convolutional front end, if the network has one (for <see cref="LaneRunner"/>).</summary>
    internal ColumnConvolution? Front => front;

    /// <param name="frames">[T, B, D] padded frames.</param>
    /// <param name="lengths">[B] int64 frame counts, on the CPU.</param>
    public override Tensor forward(Tensor frames, Tensor lengths)
    {
        // Packing keeps padding out of the backward direction, so a line reads the same alone or in a batch.
        using var convolved = front?.call(frames, lengths);
        using var packed = nn.utils.rnn.pack_padded_sequence(convolved ?? frames, lengths, batch_first: false, enforce_sorted: false);
        var (outPacked, h, c) = lstm.call(packed);
        using (outPacked) using (h) using (c)
        {
            var (padded, _) = nn.utils.rnn.pad_packed_sequence(outPacked, batch_first: false, total_length: frames.shape[0]);
            return output.call(dropout.call(padded)).log_softmax(2);
        }
    }

    /// <summary>
    /// Makes this network (same input size and shape, at least as many classes) a copy of <paramref name="source"/>
    /// for fine-tuning with a larger character set. Every weight is copied exactly; the output rows the source
    /// lacks keep this network's own random initialisation scaled by <paramref name="newRowScale"/>, with biases
    /// set to the smallest of the source's output biases.
    /// </summary>
    internal void CopyGrowingOutputs(LineNetwork source, double newRowScale)
    {
        var sourceParameters = source.named_parameters().ToDictionary(p => p.name, p => p.parameter);
        var oldClasses = source.output.weight!.shape[0];
        using var noGrad = no_grad();
        using var scope = NewDisposeScope(); // the views below
        foreach (var (name, target) in named_parameters())
        {
            var from = sourceParameters[name];
            // Scalars made and disposed here, not from C# numbers: see ColumnConvolution.InsideMask.
            if (ReferenceEquals(target, output.weight))
            {
                using var scale = newRowScale.ToScalar();
                target.narrow(0, oldClasses, target.shape[0] - oldClasses).mul_(scale);
                target.narrow(0, 0, oldClasses).copy_(from);
            }
            else if (ReferenceEquals(target, output.bias))
            {
                using var lowest = from.min().item<float>().ToScalar();
                target.narrow(0, oldClasses, target.shape[0] - oldClasses).fill_(lowest);
                target.narrow(0, 0, oldClasses).copy_(from);
            }
            else
            {
                target.copy_(from);
            }
        }
    }
}
