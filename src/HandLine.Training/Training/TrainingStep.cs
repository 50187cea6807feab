using HandLine.Features;
using HandLine.Model;
using static TorchSharp.torch;

namespace HandLine.Training;

/// <summary>
/// One training step: the batch's features (distorted afresh when augmentation is on), CTC loss (Graves et al.
/// 2006), backward pass, gradient clipping and an Adam step, every random draw seeded from the line's place in the run.
/// </summary>
internal static class TrainingStep
{
    internal static Tensor CtcLoss(LineNetwork network, IReadOnlyList<LineSample> batch, IReadOnlyList<FeatureSequence>? features = null)
    {
        var (frames, lengths) = Batching.Stack(features ?? batch.Select(s => s.Features).ToArray());
        var logProbs = network.call(frames, lengths);
        var targets = tensor(batch.SelectMany(s => s.Target.Select(c => (long)c)).ToArray());
        var targetLengths = tensor(batch.Select(s => (long)s.Target.Length).ToArray());
        // zero_infinity: a line whose label cannot fit its frames contributes nothing instead of NaN.
        return nn.functional.ctc_loss(logProbs, targets, lengths, targetLengths, blank: 0, zero_infinity: true);
    }

    /// <summary>One optimiser step on a batch whose features (<see cref="Features"/>) are already made.</summary>
    internal static float Step(LineNetwork network, AdamOptimiser optimizer, IReadOnlyList<LineSample> batch, IReadOnlyList<FeatureSequence> features, TrainingOptions options, int epoch, int index)
    {
        using var scope = NewDisposeScope();
        optimizer.ZeroGrad();
        network.train();
        Tensor loss;
        // Dropout draws from torch's generator: seed it per batch so a resumed run repeats the same masks.
        lock (TorchRuntime.RandomLock)
        {
            TorchRuntime.Seed(((long)options.Seed * 1_000_003L) + (epoch * 100_003L) + index);
            loss = CtcLoss(network, batch, features);
        }
        loss.backward();
        nn.utils.clip_grad_norm_(network.parameters(), options.ClipNorm);
        optimizer.Step();
        return loss.item<float>();
    }

    /// <summary>
    /// The batch's features, each line distorted afresh when augmentation is on. The distortion's generator is
    /// seeded from (seed, epoch, batch, line), so a resumed run draws exactly what an uninterrupted one did.
    /// </summary>
    internal static FeatureSequence[] Features(IReadOnlyList<LineSample> batch, TrainingOptions options, int epoch, int index)
    {
        var result = new FeatureSequence[batch.Count];
        for (var i = 0; i < batch.Count; i++)
        {
            var s = batch[i];
            result[i] = options.Augmentation is null
                ? s.Features
                : s.FeaturesOf(options.Augmentation.Apply(s.Ink(), new Random(LineSeed(options.Seed, epoch, index, i))));
        }
        return result;
    }

    /// <summary>
    /// A fixed mix (SplitMix64 finaliser) of the run seed and a line's place in the run. Not HashCode.Combine:
    /// that is randomised per process, and a resumed run is a new process.
    /// </summary>
    internal static int LineSeed(int seed, int epoch, int batch, int line)
    {
        var z = unchecked((ulong)seed * 0x9E3779B97F4A7C15UL + (ulong)epoch * 0xBF58476D1CE4E5B9UL
                          + (ulong)batch * 0x94D049BB133111EBUL + (ulong)line);
        z = unchecked((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL);
        z = unchecked((z ^ (z >> 27)) * 0x94D049BB133111EBUL);
        return (int)((z ^ (z >> 31)) & int.MaxValue);
    }
}
