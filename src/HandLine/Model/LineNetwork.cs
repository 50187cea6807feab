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
    /// Makes this network a warm start from <paramref name="source"/> of another input height or LSTM width (same
    /// layers, character set and convolutional front end), for comparing input sizes and capacities without
    /// training each from new weights. The front end's 3×3 filters do not depend on the line height and are copied.
    /// The first LSTM layer's input weights are resampled along the front end's rows (linear interpolation, scaled
    /// by the row ratio, so a feature that is the same on every row adds up to the same pre-activation); the weights
    /// then need fine-tuning, since the strokes the filters see are thicker or thinner in pixels. A wider LSTM keeps
    /// every old weight and gives the new units no say: their outgoing weights (to the old units, the next layer and
    /// the output layer) start at zero, so the wider network computes exactly what the source did until training
    /// moves them (function-preserving widening as in Chen, Goodfellow and Shlens, "Net2Net", 2016, here with zero
    /// outgoing weights instead of copied units). Weights into the new units keep this network's random initialisation.
    /// </summary>
    /// <param name="source">The trained network.</param>
    /// <param name="sourceRows">Rows of the source's front-end output (its line height / 4).</param>
    /// <param name="rows">Rows of this network's front-end output.</param>
    /// <param name="sourceHidden">The source's LSTM units per direction.</param>
    /// <param name="hidden">This network's LSTM units per direction (at least the source's).</param>
    internal void CopyReshaped(LineNetwork source, int sourceRows, int rows, int sourceHidden, int hidden)
    {
        if (front is null || source.front is null) throw new ArgumentException("reshaping needs the convolutional front end in both networks");
        if (hidden < sourceHidden) throw new ArgumentException($"the LSTM can only grow ({sourceHidden} -> {hidden} units)");
        var sourceParameters = source.named_parameters().ToDictionary(p => p.name, p => p.parameter);
        using var noGrad = no_grad();
        foreach (var (name, target) in named_parameters())
        {
            var from = sourceParameters[name];
            if (!name.StartsWith("lstm.", StringComparison.Ordinal) && !name.StartsWith("output.", StringComparison.Ordinal))
            {
                target.copy_(from);
                continue;
            }
            var old = from.data<float>().ToArray();
            var values = target.data<float>().ToArray();
            var shape = target.shape;
            var oldColumns = from.dim() == 2 ? (int)from.shape[1] : 1;
            var columns = target.dim() == 2 ? (int)shape[1] : 1;
            // Rows: the LSTM's four gates stack their units; the output layer's rows are the classes.
            int[] rowMap = name.StartsWith("lstm.", StringComparison.Ordinal)
                ? GateRows((int)shape[0] / 4, hidden, sourceHidden)
                : Enumerable.Range(0, (int)shape[0]).ToArray();
            var isFirstInput = name.StartsWith("lstm.weight_ih_l0", StringComparison.Ordinal);
            var isRecurrent = name.StartsWith("lstm.weight_hh_", StringComparison.Ordinal);
            for (var r = 0; r < rowMap.Length; r++)
            {
                var sourceRow = rowMap[r];
                if (sourceRow < 0) continue; // a new unit: its own initialisation
                if (target.dim() == 1)
                {
                    values[r] = old[sourceRow];
                    continue;
                }
                var oldRow = old.AsSpan(sourceRow * oldColumns, oldColumns);
                var row = values.AsSpan(r * columns, columns);
                if (isFirstInput) ResampleChannelRows(oldRow, row, sourceRows, rows);
                else if (isRecurrent) WidenUnits(oldRow, row, sourceHidden, hidden, directions: 1);
                else WidenUnits(oldRow, row, sourceHidden, hidden, directions: 2); // a deeper layer or the output layer
            }
            target.copy_(tensor(values, shape));
        }
    }

    /// <summary>For each of this LSTM's gate rows, the source row it comes from, or -1 for a new unit's row.</summary>
    private static int[] GateRows(int units, int hidden, int sourceHidden)
    {
        var map = new int[4 * units];
        for (var gate = 0; gate < 4; gate++)
            for (var j = 0; j < hidden; j++)
                map[(gate * hidden) + j] = j < sourceHidden ? (gate * sourceHidden) + j : -1;
        return map;
    }

    /// <summary>Inputs from old units copied; inputs from new units zero (they have no say yet).</summary>
    private static void WidenUnits(ReadOnlySpan<float> oldRow, Span<float> row, int sourceHidden, int hidden, int directions)
    {
        row.Clear();
        for (var d = 0; d < directions; d++)
            oldRow.Slice(d * sourceHidden, sourceHidden).CopyTo(row.Slice(d * hidden, sourceHidden));
    }

    /// <summary>
    /// One weight row over the front end's output (channel-major, then rows), its rows resampled from
    /// <paramref name="sourceRows"/> to <paramref name="rows"/> by linear interpolation between row centres.
    /// </summary>
    internal static void ResampleChannelRows(ReadOnlySpan<float> oldRow, Span<float> row, int sourceRows, int rows)
    {
        var channels = oldRow.Length / sourceRows;
        var scale = (float)sourceRows / rows;
        for (var c = 0; c < channels; c++)
            for (var r = 0; r < rows; r++)
            {
                var at = Math.Clamp(((r + 0.5) * sourceRows / rows) - 0.5, 0, sourceRows - 1);
                var below = (int)Math.Floor(at);
                var above = Math.Min(below + 1, sourceRows - 1);
                var t = (float)(at - below);
                row[(c * rows) + r] = scale * (((1 - t) * oldRow[(c * sourceRows) + below]) + (t * oldRow[(c * sourceRows) + above]));
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
