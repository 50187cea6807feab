using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace HandLine.Model;

/// <summary>
/// One file per model: magic "HANDLINE", int32 header length, UTF-8 JSON header, int64 weights length,
/// TorchSharp weights, then a SHA-256 of every preceding byte. The header repeats the weights' own SHA-256.
/// Any truncation, corruption or edit is caught on load with a message naming the file.
/// </summary>
public static class ModelFile
{
    private static readonly byte[] Magic = "HANDLINE"u8.ToArray();
    private const int HashLength = 32;
    private const int MaxHeaderBytes = 1 << 20;

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

        using var body = new MemoryStream();
        using (var w = new BinaryWriter(body, Encoding.UTF8, leaveOpen: true))
        {
            w.Write(Magic);
            w.Write(json.Length);
            w.Write(json);
            w.Write((long)weights.Length);
            w.Write(weights);
        }
        var hash = SHA256.HashData(body.GetBuffer().AsSpan(0, (int)body.Length));
        body.Write(hash);

        var dir = Path.GetDirectoryName(Path.GetFullPath(path))!;
        Directory.CreateDirectory(dir);
        AtomicFile.WriteAllBytes(path, body.ToArray());
        return IdOf(hash);
    }

    /// <summary>Reads and checks a model file; throws <see cref="InputException"/> naming the problem.</summary>
    public static LineModel Load(string path)
    {
        return Load(InputFile.ReadAllBytes(path, "model", "model file"), path);
    }

    public static LineModel Load(byte[] bytes, string nameForErrors)
    {
        InputException Bad(string reason) => new(nameForErrors, "model", reason);

        if (bytes.Length < Magic.Length || !bytes.AsSpan(0, Magic.Length).SequenceEqual(Magic))
            throw Bad("not a HandLine model file (wrong leading bytes)");
        if (bytes.Length < Magic.Length + 4 + 8 + HashLength)
            throw Bad("model file is truncated");
        var hashStart = bytes.Length - HashLength;
        if (!SHA256.HashData(bytes.AsSpan(0, hashStart)).AsSpan().SequenceEqual(bytes.AsSpan(hashStart)))
            throw Bad("model file is damaged, truncated or was changed after it was written (checksum mismatch)");

        var pos = Magic.Length;
        var headerLength = BitConverter.ToInt32(bytes, pos);
        pos += 4;
        if (headerLength <= 0 || headerLength > MaxHeaderBytes || pos + headerLength + 8 > hashStart)
            throw Bad("model header length is invalid");
        ModelHeader header;
        try
        {
            header = JsonSerializer.Deserialize<ModelHeader>(bytes.AsSpan(pos, headerLength), Json)
                     ?? throw Bad("model header is empty");
        }
        catch (JsonException e)
        {
            throw new InputException(nameForErrors, "model", $"model header is not valid JSON: {e.Message}", e);
        }
        pos += headerLength;
        if (header.FormatVersion != ModelHeader.CurrentFormatVersion)
            throw Bad($"model format version {header.FormatVersion} is not supported (this build reads {ModelHeader.CurrentFormatVersion})");

        var weightsLength = BitConverter.ToInt64(bytes, pos);
        pos += 8;
        if (weightsLength <= 0 || pos + weightsLength != hashStart)
            throw Bad("model weights length is invalid");
        var weights = bytes.AsSpan(pos, (int)weightsLength);
        if (!string.Equals(Convert.ToHexStringLower(SHA256.HashData(weights)), header.WeightsSha256, StringComparison.Ordinal))
            throw Bad("model weights do not match the checksum in the header");

        CharacterSet charset;
        try
        {
            header.Features.Validate();
            header.Network.Validate(header.Features);
            charset = CharacterSet.FromString(header.Charset);
        }
        catch (ArgumentException e)
        {
            throw new InputException(nameForErrors, "model", $"model header is inconsistent: {e.Message}", e);
        }

        var network = new LineNetwork(header.Features, header.Network, charset.ClassCount);
        try
        {
            using var ms = new MemoryStream(weights.ToArray());
            network.load(ms, strict: true);
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            network.Dispose();
            throw new InputException(nameForErrors, "model", $"model weights do not fit the network the header describes: {e.Message}", e);
        }
        return new LineModel(header, charset, network, IdOf(bytes.AsSpan(hashStart)));
    }

    private static string IdOf(ReadOnlySpan<byte> fileHash) => Convert.ToHexStringLower(fileHash)[..12];
}
