using System.Text;

namespace HandLine.Formats;

/// <summary>
/// The one layout of every file HandLine writes with a header and a checksum (model, language model, training
/// checkpoint, prepared-ink cache): eight magic bytes naming the kind, int32 header length, UTF-8 JSON header, the
/// kind's payload, then a SHA-256 of every preceding byte. Integers are little-endian. Models and language models
/// have always had this layout, so files written before this class existed read unchanged; the version of a
/// kind's contents is a field of its header. Files are written atomically and streamed both ways (a prepared-ink
/// cache can be gigabytes); the checksum is checked on every read, and a file whose checksum fails is reported as
/// damaged, whatever else is wrong with it.
/// </summary>
public static class ContainerFile
{
    private const int HashLength = 32;

    /// <summary>Writes a container atomically (temporary sibling, then rename). Returns its SHA-256.</summary>
    /// <param name="payload">Writes the kind's payload; may be null for none.</param>
    public static byte[] Write(string path, ContainerKind kind, ReadOnlySpan<byte> header, Action<BinaryWriter>? payload)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        ArgumentNullException.ThrowIfNull(kind);
        Directory.CreateDirectory(Path.GetDirectoryName(Path.GetFullPath(path))!);
        var tmp = AtomicFile.TempPathFor(path);
        try
        {
            byte[] hash;
            using (var file = new FileStream(tmp, FileMode.CreateNew, FileAccess.Write, FileShare.None, 1 << 20))
            {
                using (var hashing = new HashingStream(file))
                {
                    using (var w = new BinaryWriter(hashing, Encoding.UTF8, leaveOpen: true))
                    {
                        w.Write(kind.MagicBytes);
                        w.Write(header.Length);
                        w.Write(header);
                        payload?.Invoke(w);
                    }
                    hash = hashing.Hash();
                }
                file.Write(hash);
                file.Flush(flushToDisk: true);
            }
            File.Move(tmp, path, overwrite: true);
            return hash;
        }
        finally
        {
            if (File.Exists(tmp)) File.Delete(tmp);
        }
    }

    /// <summary>
    /// Reads and checks a container held in memory (the file was read whole). The checksum is checked before the
    /// payload is parsed, so a parser never meets damaged data.
    /// </summary>
    public static T Read<T>(byte[] bytes, string nameForErrors, ContainerKind kind, Func<ContainerContents, T> parse)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        ArgumentNullException.ThrowIfNull(kind);
        var magic = kind.MagicBytes;
        if (bytes.Length >= magic.Length + 4 + HashLength && bytes.AsSpan(0, magic.Length).SequenceEqual(magic)
            && !System.Security.Cryptography.SHA256.HashData(bytes.AsSpan(0, bytes.Length - HashLength)).AsSpan()
                .SequenceEqual(bytes.AsSpan(bytes.Length - HashLength)))
            throw new InputException(nameForErrors, kind.Stage, ChecksumReason(kind));
        using var stream = new MemoryStream(bytes, writable: false);
        return Read(stream, bytes.Length, nameForErrors, kind, parse);
    }

    /// <summary>
    /// Reads and checks a container from a file, streaming it: the payload is parsed as it is read and the checksum
    /// checked at the end, so the parser must bound what it allocates by <see cref="ContainerContents.PayloadLength"/>.
    /// </summary>
    public static T Read<T>(string path, ContainerKind kind, Func<ContainerContents, T> parse)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        using var file = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 20);
        return Read(file, file.Length, path, kind, parse);
    }

    /// <summary>
    /// Reads the container in <paramref name="stream"/> (<paramref name="length"/> bytes from its position): checks
    /// the magic, hands the header and the payload to <paramref name="parse"/>, which must read the payload to its
    /// end, and checks the checksum. Every problem is an <see cref="InputException"/> naming the file.
    /// </summary>
    public static T Read<T>(Stream stream, long length, string nameForErrors, ContainerKind kind, Func<ContainerContents, T> parse)
    {
        ArgumentNullException.ThrowIfNull(stream);
        ArgumentNullException.ThrowIfNull(nameForErrors);
        ArgumentNullException.ThrowIfNull(kind);
        ArgumentNullException.ThrowIfNull(parse);
        InputException Bad(string reason, Exception? inner = null) => new(nameForErrors, kind.Stage, reason, inner);

        var magic = kind.MagicBytes;
        var bodyLength = length - HashLength;
        if (bodyLength < magic.Length + 4)
        {
            var head = new byte[magic.Length];
            if (stream.ReadAtLeast(head, head.Length, throwOnEndOfStream: false) < head.Length || !head.AsSpan().SequenceEqual(magic))
                throw Bad(kind.NotThisKind);
            throw Bad($"{kind.What} file is truncated");
        }

        using var hashing = new HashingStream(stream, bodyLength);
        using var reader = new BinaryReader(hashing, Encoding.UTF8, leaveOpen: true);
        if (!reader.ReadBytes(magic.Length).AsSpan().SequenceEqual(magic))
            throw Bad(kind.NotThisKind);
        T result;
        try
        {
            var headerLength = reader.ReadInt32();
            if (headerLength <= 0 || headerLength > kind.MaxHeaderBytes || magic.Length + 4L + headerLength > bodyLength)
                throw Bad($"{kind.What} header length is invalid");
            var header = reader.ReadBytes(headerLength);
            var payloadLength = bodyLength - magic.Length - 4 - headerLength;
            result = parse(new ContainerContents(header, reader, payloadLength));
            if (hashing.Passed != bodyLength)
                throw Bad($"{kind.What} has trailing bytes");
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            // Damage explains any other complaint: say so when the checksum fails.
            Drain(hashing);
            if (!ChecksumHolds(stream, hashing))
                throw Bad(ChecksumReason(kind), e);
            if (e is InputException) throw;
            if (e is EndOfStreamException or System.Text.Json.JsonException or ArgumentException or FormatException or InvalidDataException)
                throw Bad($"{kind.What} is malformed: {e.Message}", e);
            throw;
        }
        if (!ChecksumHolds(stream, hashing))
            throw Bad(ChecksumReason(kind));
        return result;
    }

    private static string ChecksumReason(ContainerKind kind) =>
        $"{kind.What} file is damaged, truncated or was changed after it was written (checksum mismatch)";

    private static void Drain(HashingStream hashing)
    {
        var buffer = new byte[1 << 16];
        while (hashing.Read(buffer) > 0) { }
    }

    /// <summary>Compares the SHA-256 of everything the reader passed with the file's last 32 bytes.</summary>
    private static bool ChecksumHolds(Stream stream, HashingStream hashing)
    {
        var stored = new byte[HashLength];
        if (stream.ReadAtLeast(stored, HashLength, throwOnEndOfStream: false) < HashLength) return false;
        return hashing.Hash().AsSpan().SequenceEqual(stored);
    }
}
