namespace HandLine.Features;

/// <summary>A line as a sequence of frames, row-major [Frames, Dimension], ready for the network.</summary>
public sealed class FeatureSequence
{
    public FeatureSequence(int frames, int dimension, float[] values)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(frames);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(dimension);
        ArgumentNullException.ThrowIfNull(values);
        if (values.Length != frames * dimension)
            throw new ArgumentException($"Expected {frames}x{dimension} values, got {values.Length}.", nameof(values));
        Frames = frames;
        Dimension = dimension;
        Values = values;
    }

    public int Frames { get; }
    public int Dimension { get; }

    /// <summary>Row-major frame values; do not modify after construction.</summary>
    public float[] Values { get; }
}
