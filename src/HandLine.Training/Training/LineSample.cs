using HandLine.Features;
using HandLine.Imaging;

namespace HandLine.Training;

/// <summary>
/// A prepared training or validation line: its normalised ink, its transcript and the transcript's classes.
/// The ink is kept at 8 bits (a quarter of the memory of float features, which matters at 200,000 lines) and
/// features are extracted when needed, so training can distort the ink afresh every time it sees the line.
/// </summary>
public sealed class LineSample
{
    private readonly byte[] _ink; // row-major, 0 paper .. 255 full ink

    public LineSample(string id, string text, GrayImage ink, FeatureConfig features, int[] target)
    {
        ArgumentNullException.ThrowIfNull(id);
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(ink);
        ArgumentNullException.ThrowIfNull(features);
        ArgumentNullException.ThrowIfNull(target);
        if (ink.Height != features.LineHeight)
            throw new ArgumentException($"Ink height {ink.Height} does not match the feature configuration's {features.LineHeight}.", nameof(ink));
        Id = id;
        Text = text;
        Target = target;
        Config = features;
        Width = ink.Width;
        _ink = ToBytes(ink.Pixels);
    }

    /// <summary>A line from ink already stored at 8 bits (prepared lines read back from a file).</summary>
    internal LineSample(string id, string text, byte[] ink, int width, FeatureConfig features, int[] target)
    {
        if (width < 1 || ink.Length != width * features.LineHeight)
            throw new ArgumentException($"{ink.Length} ink values do not make a {width} x {features.LineHeight} line.", nameof(ink));
        Id = id;
        Text = text;
        Target = target;
        Config = features;
        Width = width;
        _ink = ink;
    }

    internal static byte[] ToBytes(float[] pixels)
    {
        var bytes = new byte[pixels.Length];
        for (var i = 0; i < bytes.Length; i++)
            bytes[i] = (byte)Math.Round(Math.Clamp(pixels[i], 0f, 1f) * 255f);
        return bytes;
    }

    public string Id { get; }
    public string Text { get; }

    /// <summary>The line's style family from its manifest's <c>family</c> column; null without one.</summary>
    public string? Family { get; init; }

    /// <summary>The line's style group from its manifest's <c>group</c> column; null without one.</summary>
    public string? Group { get; init; }

    public int[] Target { get; }
    public FeatureConfig Config { get; }
    public int Width { get; }

    /// <summary>Frames the network sees for this line (without augmentation).</summary>
    public int Frames => Math.Max(1, (Width + Config.FrameStride - 1) / Config.FrameStride);

    /// <summary>The stored ink as a fresh image (0 paper .. 1 ink).</summary>
    public GrayImage Ink()
    {
        var p = new float[_ink.Length];
        for (var i = 0; i < p.Length; i++)
            p[i] = _ink[i] / 255f;
        return new GrayImage(Width, Config.LineHeight, p);
    }

    /// <summary>Features of the stored ink, as transcription would compute them.</summary>
    public FeatureSequence Features => FeaturesOf(Ink());

    /// <summary>Features of another ink image of this line (an augmented copy).</summary>
    public FeatureSequence FeaturesOf(GrayImage ink) =>
        ColumnFeatures.Extract(new NormalisedLine(ink, 0, 0, HasInk: true), Config);
}
