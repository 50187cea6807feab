namespace HandLine.Tests.Imaging;

/// <summary>Byte-level PNG edits for tests that need malformed or hostile files.</summary>
internal static class PngBytes
{
    /// <summary>
    /// A copy of <paramref name="png"/> whose header claims <paramref name="width"/>×<paramref name="height"/>, with a
    /// correct header checksum: the shape of a decompression bomb. PNG layout (PNG specification, ISO/IEC 15948):
    /// 8-byte signature, then IHDR as length(4) type(4) data(13) CRC(4); width and height are the first 8 data bytes.
    /// </summary>
    public static byte[] WithClaimedSize(byte[] png, uint width, uint height)
    {
        var bytes = (byte[])png.Clone();
        if (System.Text.Encoding.ASCII.GetString(bytes, 12, 4) != "IHDR")
            throw new ArgumentException("not a PNG starting with IHDR", nameof(png));
        WriteBigEndian(bytes, 16, width);
        WriteBigEndian(bytes, 20, height);
        WriteBigEndian(bytes, 29, Crc32(bytes.AsSpan(12, 17)));
        return bytes;
    }

    public static void WriteBigEndian(byte[] b, int at, uint v)
    {
        b[at] = (byte)(v >> 24); b[at + 1] = (byte)(v >> 16); b[at + 2] = (byte)(v >> 8); b[at + 3] = (byte)v;
    }

    // CRC-32 as defined for PNG chunks (polynomial 0xEDB88320, reflected; PNG specification annex D).
    public static uint Crc32(ReadOnlySpan<byte> data)
    {
        uint crc = 0xFFFFFFFF;
        foreach (byte b in data)
        {
            crc ^= b;
            for (int k = 0; k < 8; k++)
                crc = (crc & 1) != 0 ? 0xEDB88320 ^ (crc >> 1) : crc >> 1;
        }
        return ~crc;
    }
}
