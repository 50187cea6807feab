using System.Text.Json.Serialization;
using HandLine.Features;

namespace HandLine.Model;

/// <summary>Shape of the recurrent network; stored in the model file.</summary>
public sealed record NetworkConfig(
    [property: JsonPropertyName("hidden")] int Hidden = 128,
    [property: JsonPropertyName("layers")] int Layers = 2,
    [property: JsonPropertyName("dropout")] double Dropout = 0.25,
    [property: JsonPropertyName("convolution")] bool Convolution = false)
{
    /// <summary>Checks this shape on its own and against the features it will read.</summary>
    public void Validate(FeatureConfig features)
    {
        Validate();
        // The front end rebuilds the line image from the frames, which only pixel columns allow.
        if (Convolution && features.Geometric)
            throw new ArgumentException("the convolutional front end reads pixel columns only (no geometric features)");
    }

    public void Validate()
    {
        if (Hidden is < 4 or > 2048) throw new ArgumentException($"hidden width {Hidden} is outside 4..2048");
        if (Layers is < 1 or > 8) throw new ArgumentException($"layer count {Layers} is outside 1..8");
        if (Dropout is < 0 or >= 1) throw new ArgumentException($"dropout {Dropout} is outside [0, 1)");
    }
}
