using System.Security.Cryptography;
using System.Text.Json;
using System.Text.Json.Serialization;
using HandLine.Formats;

namespace HandLine.Model;

/// <summary>
/// One file per model, a <see cref="ContainerFile"/> of kind "HANDLINE": its JSON header is the
/// <see cref="ModelHeader"/>, its payload an int64 weights length and the TorchSharp weights. The header repeats
/// the weights' own SHA-256. Any truncation, corruption or edit is caught on load with a message naming the file.
/// The model's id is the start of the container's checksum.
/// </summary>
public static class ModelFile
{
    internal static readonly ContainerKind Kind = new("HANDLINE", "model", "model", "not a HandLine model file (wrong leading bytes)");

    internal static readonly JsonSerializerOptions Json = new()
    {
        WriteIndented = true,
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        UnmappedMemberHandling = JsonUnmappedMemberHandling.Skip,
    };

    /// <summary>Writes the model atomically (temporary file, then rename). Returns the model id.</summary>
    public static string Save(string path, ModelHeader header, LineNetwork network)
    {
        ArgumentNullException.ThrowIfNull(header);
        ArgumentNullException.ThrowIfNull(network);
        byte[] weights;
        using (var ms = new MemoryStream())
        {
            network.save(ms);
            weights = ms.ToArray();
        }
        var stamped = header with
        {
            FormatVersion = ModelHeader.CurrentFormatVersion,
            WeightsSha256 = Convert.ToHexStringLower(SHA256.HashData(weights)),
        };
        var json = JsonSerializer.SerializeToUtf8Bytes(stamped, Json);
        var hash = ContainerFile.Write(path, Kind, json, w =>
        {
            w.Write((long)weights.Length);
            w.Write(weights);
        });
        return IdOf(hash);
    }

    /// <summary>Reads and checks a model file; throws <see cref="InputException"/> naming the problem.</summary>
    public static LineModel Load(string path)
    {
        return Load(InputFile.ReadAllBytes(path, "model", "model file"), path);
    }

    public static LineModel Load(byte[] bytes, string nameForErrors)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        InputException Bad(string reason) => new(nameForErrors, "model", reason);
        var (header, weights) = ContainerFile.Read(bytes, nameForErrors, Kind, c =>
        {
            ModelHeader header;
            try
            {
                header = JsonSerializer.Deserialize<ModelHeader>(c.Header, Json) ?? throw Bad("model header is empty");
            }
            catch (JsonException e)
            {
                throw new InputException(nameForErrors, "model", $"model header is not valid JSON: {e.Message}", e);
            }
            if (header.FormatVersion != ModelHeader.CurrentFormatVersion)
                throw Bad($"model format version {header.FormatVersion} is not supported (this build reads {ModelHeader.CurrentFormatVersion})");
            var weightsLength = c.PayloadLength >= 8 ? c.Payload.ReadInt64() : -1;
            if (weightsLength <= 0 || weightsLength != c.PayloadLength - 8)
                throw Bad("model weights length is invalid");
            return (header, c.Payload.ReadBytes((int)weightsLength));
        });
        if (!string.Equals(Convert.ToHexStringLower(SHA256.HashData(weights)), header.WeightsSha256, StringComparison.Ordinal))
            throw Bad("model weights do not match the checksum in the header");

        CharacterSet charset;
        try
        {
            header.Features.Validate();
            header.Network.Validate(header.Features);
            if (header.Temperature is { } t && (!(t > 0) || double.IsInfinity(t)))
                throw new ArgumentException($"temperature {header.Temperature} is not a positive finite number");
            charset = CharacterSet.FromString(header.Charset);
        }
        catch (ArgumentException e)
        {
            throw new InputException(nameForErrors, "model", $"model header is inconsistent: {e.Message}", e);
        }

        var network = new LineNetwork(header.Features, header.Network, charset.ClassCount);
        try
        {
            using var ms = new MemoryStream(weights);
            network.load(ms, strict: true);
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            network.Dispose();
            throw new InputException(nameForErrors, "model", $"model weights do not fit the network the header describes: {e.Message}", e);
        }
        return new LineModel(header, charset, network, IdOf(bytes.AsSpan(bytes.Length - 32)));
    }

    private static string IdOf(ReadOnlySpan<byte> fileHash) => Convert.ToHexStringLower(fileHash)[..12];
}
