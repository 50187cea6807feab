using System.Security.Cryptography;
using System.Text.Json;
using HandLine.Imaging;

namespace HandLine.Batch;

/// <summary>
/// A short hash of every setting that can change a source's results, so resume reuses a journalled result only
/// under the same settings. It hashes the whole <see cref="TranscribeOptions"/> record as JSON, so a setting
/// added to that record later is covered without touching this class. Left out: the output folder, the model
/// path (the model counts by its id, i.e. its content) and the size limits, which decide whether an image is
/// read at all but never change what is read from it.
/// </summary>
public static class OptionsFingerprint
{
    public static string Of(TranscribeOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        var imaging = (options.Imaging ?? new ImagingOptions()) with { MaxFileBytes = 1, MaxPixels = 1 };
        var normalised = options with { OutDir = "", ModelPath = "", Imaging = imaging };
        var json = JsonSerializer.SerializeToUtf8Bytes(normalised);
        return Convert.ToHexStringLower(SHA256.HashData(json))[..16];
    }
}
