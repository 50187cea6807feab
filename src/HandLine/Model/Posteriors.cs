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
}
