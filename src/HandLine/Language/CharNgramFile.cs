using System.Text.Json;
using HandLine.Formats;

namespace HandLine.Language;

/// <summary>
/// One file per character model, a <see cref="ContainerFile"/> of kind "HLCHARLM": its JSON header is the
/// <see cref="CharNgramHeader"/>, its payload for each order k = 1..N an int32 entry count and that many
/// (uint64 key, int32 count) pairs. Written atomically; any truncation or edit is caught on load.
/// </summary>
public static class CharNgramFile
{
    public const int CurrentFormatVersion = 1;
    private const string Stage = "language model";

    private static readonly ContainerKind Kind = new("HLCHARLM", Stage, "language model",
        "not a HandLine character model (wrong leading bytes; build one with 'handline lm')", MaxHeaderBytes: 1 << 24);

    public static void Save(string path, CharNgramModel model, long lines, IEnumerable<string> sources)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(sources);
        var header = new CharNgramHeader(CurrentFormatVersion, model.Order, string.Concat(model.Symbols),
            model.Discounts.ToArray(), lines, sources.ToArray(), DateTime.UtcNow.ToString("O"));
        var json = JsonSerializer.SerializeToUtf8Bytes(header, new JsonSerializerOptions { WriteIndented = true });
        ContainerFile.Write(path, Kind, json, w =>
        {
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
        });
    }

    /// <summary>Reads and checks a model file; throws <see cref="InputException"/> naming the file and the problem.</summary>
    public static CharNgramModel Load(string path)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        var bytes = InputFile.ReadAllBytes(path, Stage, "language model");
        InputException Bad(string reason) => new(path, Stage, reason);

        return ContainerFile.Read(bytes, path, Kind, c =>
        {
            var header = JsonSerializer.Deserialize<CharNgramHeader>(c.Header) ?? throw Bad("language model header is empty");
            if (header.FormatVersion != CurrentFormatVersion)
                throw Bad($"language model format version {header.FormatVersion} is not supported (this build reads {CurrentFormatVersion})");
            if (header.Order is < 1 or > CharNgramModel.MaxOrder || header.Discounts is null || header.Discounts.Length != header.Order
                || header.Symbols is null)
                throw Bad("language model header is inconsistent");
            var symbols = header.Symbols.EnumerateRunes().Select(x => x.ToString()).ToArray();
            var r = c.Payload;
            var counts = new Dictionary<ulong, int>[header.Order];
            for (var k = 0; k < header.Order; k++)
            {
                var n = r.ReadInt32();
                if (n < 0 || n > c.PayloadLength / 12) throw Bad("language model count table is invalid");
                counts[k] = new Dictionary<ulong, int>(n);
                for (var i = 0; i < n; i++) counts[k][r.ReadUInt64()] = r.ReadInt32();
            }
            return new CharNgramModel(header.Order, symbols, header.Discounts, counts) { Source = path };
        });
    }
}
