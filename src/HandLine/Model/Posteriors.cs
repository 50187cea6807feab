namespace HandLine.Model;

/// <summary>Per-frame log-probabilities [Frames, Classes] for one line; class 0 is the CTC blank.</summary>
public sealed class Posteriors
{
    public Posteriors(int frames, int classes, float[] logProbs)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(frames);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(classes);
        ArgumentNullException.ThrowIfNull(logProbs);
        if (logProbs.Length != frames * classes)
            throw new ArgumentException($"Expected {frames}x{classes} values, got {logProbs.Length}.", nameof(logProbs));
        Frames = frames;
        Classes = classes;
        LogProbs = logProbs;
    }

    public int Frames { get; }
    public int Classes { get; }

    /// <summary>Row-major natural-log probabilities; do not modify.</summary>
    public float[] LogProbs { get; }

    public float this[int frame, int cls] => LogProbs[frame * Classes + cls];

    /// <summary>
    /// Temperature scaling (Guo et al. 2017, "On Calibration of Modern Neural Networks", section 4.2): each frame's
    /// distribution becomes softmax(z / T). Log-probabilities differ from the logits z only by a per-frame constant,
    /// so dividing them by T and normalising again gives exactly that. T above 1 softens over-confident outputs; the
    /// most likely class of every frame stays the same, so greedy decoding reads the same text.
    /// </summary>
    public Posteriors Tempered(double temperature)
    {
        if (!(temperature > 0) || double.IsInfinity(temperature))
            throw new ArgumentOutOfRangeException(nameof(temperature), "must be a positive finite number");
        if (temperature == 1) return this;
        var result = new float[LogProbs.Length];
        for (var t = 0; t < Frames; t++)
        {
            var row = LogProbs.AsSpan(t * Classes, Classes);
            var max = double.NegativeInfinity;
            foreach (var v in row) max = Math.Max(max, v / temperature);
            double sum = 0;
            foreach (var v in row) sum += Math.Exp(v / temperature - max);
            var logSum = max + Math.Log(sum);
            for (var c = 0; c < Classes; c++) result[t * Classes + c] = (float)(row[c] / temperature - logSum);
        }
        return new Posteriors(Frames, Classes, result);
    }
}
