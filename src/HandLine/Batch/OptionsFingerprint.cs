using System.Security.Cryptography;
using System.Text.Json;
using System.Text.Json.Serialization;
using HandLine.Decoding;
using HandLine.Layout;
using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>
/// A short hash of every setting that can change a source's results, so resume reuses a journalled result only
/// under the same settings: the flag threshold, the decoding options and how the rotation is settled (`--rotation`). The model counts by its id (its
/// content), which also fixes how lines are prepared; the input limits decide whether an image is read at all
/// but never change what is read from it, so they are not settings of the results.
/// </summary>
public static class OptionsFingerprint
{
    /// <param name="options">The run's settings, with the flag threshold it resolved (<see cref="TranscribeOptions.FlagBelowFor"/>).</param>
    public static string Of(TranscribeOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        if (options.FlagBelow is not { } flagBelow)
            throw new ArgumentException("the flag threshold must be resolved before hashing the settings", nameof(options));
        // Auto layout adds nothing, so runs made before layouts existed keep their hash and resume.
        var json = JsonSerializer.SerializeToUtf8Bytes(new ResultSettings(flagBelow, options.Decoding,
            options.Orientation ?? OrientationOptions.Auto, options.Layout == LayoutMode.Auto ? null : options.Layout.ToString()));
        return Convert.ToHexStringLower(SHA256.HashData(json))[..16];
    }

    /// <summary>What is hashed; a setting of a run's results added later belongs here.</summary>
    private sealed record ResultSettings(double FlagBelow, DecodingOptions? Decoding, OrientationOptions Orientation,
        [property: JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] string? Layout);
}
