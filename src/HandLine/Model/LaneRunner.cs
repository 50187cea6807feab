using HandLine.Features;
using TorchSharp;
using static TorchSharp.torch;

namespace HandLine.Model;

/// <summary>
/// Inference over many lines at once whose results do not depend on which lines share a batch, so that a batch
/// of several images' lines gives every line exactly the bits it gets alone, and resumed, sharded and merged runs
/// stay byte-identical whatever their batches held. libtorch's matrix product gives a row different low bits for
/// a different number of rows (measured on this project's machine: a row of [M, 256] × [256, 768] differs between
/// M = 1, 2, 4, 8…), while at a fixed shape a row's bits do not depend on its position or on the other rows. So
/// every product here either covers one line alone (the convolution, each layer's input projection, the output
/// layer: their row count is the line's own frame count) or has a fixed shape: the recurrent step runs on
/// <c>lanes</c> rows always, one line per lane, lanes without a line fed zeros. Lines are sorted longest first and
/// taken <c>lanes</c> at a time, so a batch's lines are of similar width and few steps are spent on finished lines.
/// The backward direction reads each line reversed from its own end, so no lane ever reads another line's padding.
/// The weights and gate order are the LSTM module's (PyTorch's i, f, g, o); the sums are grouped differently from
/// libtorch's own LSTM, so results agree with <see cref="LineModel.Run(IReadOnlyList{FeatureSequence})"/> to float
/// rounding, not bit for bit.
/// </summary>
internal sealed class LaneRunner : IDisposable
{
    private readonly LineNetwork _network;
    private readonly int _hidden;
    private readonly Layer[] _layers;
    private readonly Tensor _outputWeight;
    private readonly Tensor _outputBias;
    private readonly Scalar _one = 1.0.ToScalar();

    /// <summary>One layer's weights: both directions' input weights stacked, the summed biases, the recurrent weights.</summary>
    private sealed record Layer(Tensor InputWeight, Tensor InputBias, Tensor Recurrent);

    public LaneRunner(LineNetwork network, int hidden, int layers)
    {
        _network = network;
        _hidden = hidden;
        var p = network.named_parameters().ToDictionary(x => x.name, x => x.parameter);
        using var noGrad = no_grad();
        _layers = new Layer[layers];
        for (var l = 0; l < layers; l++)
        {
            Tensor P(string name) => p[$"lstm.{name}_l{l}"];
            Tensor R(string name) => p[$"lstm.{name}_l{l}_reverse"];
            using var fBias = P("bias_ih").add(P("bias_hh"), _one);
            using var bBias = R("bias_ih").add(R("bias_hh"), _one);
            using var fT = P("weight_hh").t();
            using var bT = R("weight_hh").t();
            _layers[l] = new Layer(
                cat([P("weight_ih"), R("weight_ih")], 0).detach(),
                cat([fBias, bBias], 0).detach(),
                stack([fT, bT], 0).contiguous().detach());
        }
        _outputWeight = p["output.weight"].detach();
        _outputBias = p["output.bias"].detach();
    }

    /// <summary>Posteriors for each line, in the order given.</summary>
    public Posteriors[] Run(IReadOnlyList<FeatureSequence> lines, int lanes)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(lanes);
        _network.eval();
        using var noGrad = no_grad();
        var result = new Posteriors[lines.Count];
        // Longest first, ties by position, so the same lines always meet in the same order (for readability of
        // the schedule only: a line's result does not depend on its batch).
        var order = Enumerable.Range(0, lines.Count).OrderByDescending(i => lines[i].Frames).ThenBy(i => i).ToArray();
        foreach (var group in order.Chunk(lanes))
        {
            using var scope = NewDisposeScope();
            var outputs = RunGroup(group.Select(i => lines[i]).ToArray(), lanes);
            for (var k = 0; k < group.Length; k++) result[group[k]] = outputs[k];
        }
        return result;
    }

    private Posteriors[] RunGroup(FeatureSequence[] lines, int lanes)
    {
        var lengths = lines.Select(l => l.Frames).ToArray();
        var steps = lengths.Max();
        var inputs = new Tensor[lines.Length];
        for (var i = 0; i < lines.Length; i++)
        {
            // A copy in libtorch's own (aligned) memory: a tensor made from a C# array may sit on the array's
            // memory, and the matrix products' low bits depend on where their operands start.
            using var wrapped = tensor(lines[i].Values, [lengths[i], 1, lines[i].Dimension]);
            var x = wrapped.clone();
            if (_network.Front is { } front)
            {
                using var len = tensor(new long[] { lengths[i] });
                x = front.call(x, len);
            }
            inputs[i] = x.reshape(lengths[i], -1);
        }

        foreach (var layer in _layers)
            inputs = RunLayer(layer, inputs, lengths, steps, lanes);

        var result = new Posteriors[lines.Length];
        for (var i = 0; i < lines.Length; i++)
        {
            using var logits = nn.functional.linear(inputs[i], _outputWeight, _outputBias);
            using var logProbs = logits.log_softmax(1);
            result[i] = new Posteriors(lengths[i], (int)logProbs.shape[1], logProbs.data<float>().ToArray());
        }
        return result;
    }

    /// <summary>One bidirectional layer over a group of lines; returns each line's [frames, 2·hidden] output.</summary>
    private Tensor[] RunLayer(Layer layer, Tensor[] inputs, int[] lengths, int steps, int lanes)
    {
        var h4 = 4 * _hidden;
        // Each line's gate inputs for both directions, [frames, 8·hidden], computed on the line alone; then one
        // table of all of them with a zero row at the end for lanes without a line at a step.
        var projections = new Tensor[inputs.Length + 1];
        for (var i = 0; i < inputs.Length; i++)
            projections[i] = nn.functional.linear(inputs[i], layer.InputWeight, layer.InputBias);
        projections[^1] = zeros(1, 2 * h4);
        using var table = cat(projections, 0);
        foreach (var p in projections) p.Dispose();
        var zeroRow = table.shape[0] - 1;

        // Row of the table each lane reads at each step: forward from the line's start, backward from its end.
        var forwardRows = new long[steps * lanes];
        var backwardRows = new long[steps * lanes];
        Array.Fill(forwardRows, zeroRow);
        Array.Fill(backwardRows, zeroRow);
        var offsets = new long[lengths.Length];
        for (var i = 1; i < lengths.Length; i++) offsets[i] = offsets[i - 1] + lengths[i - 1];
        for (var i = 0; i < lengths.Length; i++)
            for (var t = 0; t < lengths[i]; t++)
            {
                forwardRows[t * lanes + i] = offsets[i] + t;
                backwardRows[t * lanes + i] = offsets[i] + lengths[i] - 1 - t;
            }
        using var fIndex = tensor(forwardRows);
        using var bIndex = tensor(backwardRows);
        using var fTable = table.narrow(1, 0, h4);
        using var bTable = table.narrow(1, h4, h4);
        using var fGates = fTable.index_select(0, fIndex).view(steps, 1, lanes, h4);
        using var bGates = bTable.index_select(0, bIndex).view(steps, 1, lanes, h4);
        using var gates = cat([fGates, bGates], 1); // [steps, 2, lanes, 4·hidden]

        using var states = empty(steps, 2, lanes, _hidden);
        var h = zeros(2, lanes, _hidden);
        var c = zeros(2, lanes, _hidden);
        for (var t = 0; t < steps; t++)
        {
            using var stepScope = NewDisposeScope();
            using var z = gates[t].add(h.bmm(layer.Recurrent), _one); // [2, lanes, 4·hidden], fixed shape
            using var i = z.narrow(2, 0, _hidden).sigmoid();
            using var f = z.narrow(2, _hidden, _hidden).sigmoid();
            using var g = z.narrow(2, 2 * _hidden, _hidden).tanh();
            using var o = z.narrow(2, 3 * _hidden, _hidden).sigmoid();
            var nextC = f.mul(c).add(i.mul(g), _one);
            var nextH = o.mul(nextC.tanh());
            states[t].copy_(nextH);
            h.Dispose();
            c.Dispose();
            h = nextH.MoveToOuterDisposeScope();
            c = nextC.MoveToOuterDisposeScope();
        }
        h.Dispose();
        c.Dispose();

        // Each line's output at frame t: the forward state at step t and the backward state at step L-1-t.
        using var flat = states.view(steps * 2 * lanes, _hidden);
        var outputs = new Tensor[inputs.Length];
        for (var i = 0; i < inputs.Length; i++)
        {
            var fRows = new long[lengths[i]];
            var bRows = new long[lengths[i]];
            for (var t = 0; t < lengths[i]; t++)
            {
                fRows[t] = (long)t * 2 * lanes + i;
                bRows[t] = ((long)(lengths[i] - 1 - t) * 2 + 1) * lanes + i;
            }
            using var fi = tensor(fRows);
            using var bi = tensor(bRows);
            using var fOut = flat.index_select(0, fi);
            using var bOut = flat.index_select(0, bi);
            outputs[i] = cat([fOut, bOut], 1); // a fresh tensor of its own, so its alignment is the line's alone
            inputs[i].Dispose();
        }
        return outputs;
    }

    public void Dispose()
    {
        foreach (var l in _layers)
        {
            l.InputWeight.Dispose();
            l.InputBias.Dispose();
            l.Recurrent.Dispose();
        }
        _one.Dispose();
    }
}
