using System.Security.Cryptography;
using System.Text;
using System.Text.Json;

namespace HandLine.Language;

/// <summary>
/// One file per character model: magic "HLCHARLM", int32 header length, UTF-8 JSON header, then for each order
/// k = 1..N an int32 entry count and that many (uint64 key, int32 count) pairs, little-endian, then a SHA-256 of
/// every preceding byte. Written atomically; any truncation or edit is caught on load.
/// </summary>
public static class CharNgramFile
{
    public const int CurrentFormatVersion = 1;
    private static readonly byte[] Magic = "HLCHARLM"u8.ToArray();
    private const int HashLength = 32;
    private const string Stage = "language model";

    public static void Save(string path, CharNgramModel model, long lines, IEnumerable<string> sources)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(sources);
        var header = new CharNgramHeader(CurrentFormatVersion, model.Order, string.Concat(model.Symbols),
            model.Discounts.ToArray(), lines, sources.ToArray(), DateTime.UtcNow.ToString("O"));
        var json = JsonSerializer.SerializeToUtf8Bytes(header, new JsonSerializerOptions { WriteIndented = true });
        using var body = new MemoryStream();
        using (var w = new BinaryWriter(body, Encoding.UTF8, leaveOpen: true))
        {
            w.Write(Magic);
            w.Write(json.Length);
            w.Write(json);
            foreach (var level in model.Counts)
            {
                w.Write(level.Count);
                // Sorted so the same text always gives the same bytes.
                foreach (var (key, count) in level.OrderBy(p => p.Key))
                {
                    w.Write(key);
                    w.Write(count);
                }
            }
        }
        body.Write(SHA256.HashData(body.GetBuffer().AsSpan(0, (int)body.Length)));
        Directory.CreateDirectory(Path.GetDirectoryName(Path.GetFullPath(path))!);
        AtomicFile.WriteAllBytes(path, body.ToArray());
    }

    /// <summary>Reads and checks a model file; throws <see cref="InputException"/> naming the file and the problem.</summary>
    public static CharNgramModel Load(string path)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        var bytes = InputFile.ReadAllBytes(path, Stage, "language model");
        InputException Bad(string reason) => new(path, Stage, reason);

        if (bytes.Length < Magic.Length || !bytes.AsSpan(0, Magic.Length).SequenceEqual(Magic))
            throw Bad("not a HandLine character model (wrong leading bytes; build one with 'handline lm')");
        if (bytes.Length < Magic.Length + 4 + HashLength)
            throw Bad("language model file is truncated");
        var hashStart = bytes.Length - HashLength;
        if (!SHA256.HashData(bytes.AsSpan(0, hashStart)).AsSpan().SequenceEqual(bytes.AsSpan(hashStart)))
            throw Bad("language model file is damaged, truncated or was changed after it was written (checksum mismatch)");

        try
        {
            using var r = new BinaryReader(new MemoryStream(bytes, Magic.Length, hashStart - Magic.Length));
            var headerLength = r.ReadInt32();
            if (headerLength <= 0 || headerLength > hashStart) throw Bad("language model header length is invalid");
            var header = JsonSerializer.Deserialize<CharNgramHeader>(r.ReadBytes(headerLength)) ?? throw Bad("language model header is empty");
            if (header.FormatVersion != CurrentFormatVersion)
                throw Bad($"language model format version {header.FormatVersion} is not supported (this build reads {CurrentFormatVersion})");
            if (header.Order is < 1 or > CharNgramModel.MaxOrder || header.Discounts is null || header.Discounts.Length != header.Order
                || header.Symbols is null)
                throw Bad("language model header is inconsistent");
            var symbols = header.Symbols.EnumerateRunes().Select(x => x.ToString()).ToArray();
            var counts = new Dictionary<ulong, int>[header.Order];
            for (var k = 0; k < header.Order; k++)
            {
                var n = r.ReadInt32();
                if (n < 0) throw Bad("language model count table is invalid");
                counts[k] = new Dictionary<ulong, int>(n);
                for (var i = 0; i < n; i++) counts[k][r.ReadUInt64()] = r.ReadInt32();
            }
            if (r.BaseStream.Position != r.BaseStream.Length) throw Bad("language model has trailing bytes");
            return new CharNgramModel(header.Order, symbols, header.Discounts, counts) { Source = path };
        }
        catch (Exception e) when (e is EndOfStreamException or JsonException or ArgumentException)
        {
            throw new InputException(path, Stage, $"language model is malformed: {e.Message}", e);
        }
    }
}
