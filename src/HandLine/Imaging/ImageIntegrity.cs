using System.Buffers.Binary;

namespace HandLine.Imaging;

/// <summary>
/// Checks that an image file is whole before it is decoded. The decoders fill in whatever a cut-short file
/// lacks and raise no error (a PNG cut to a third still "loads"), and a partly blank line would be transcribed
/// as if it were real. So each format's structure is walked to its end marker: PNG chunks with their CRCs up to
/// IEND, JPEG segments and entropy-coded data up to EOI, GIF blocks up to the trailer, the BMP pixel array's
/// size, and the TIFF directory with its strip or tile extents. Structures follow the published specifications
/// (PNG: ISO/IEC 15948; JPEG: ITU-T T.81 annex B; GIF89a; BMP: Windows BITMAPINFOHEADER; TIFF 6.0).
/// Every read is bounds-checked, so hostile bytes give a reason, never an exception.
/// </summary>
public static class ImageIntegrity
{
    private const string CutShort = "the file is cut short";

    /// <summary>Null when the file is whole (or its format is not one checked here), else the problem in plain words.</summary>
    public static string? Problem(ReadOnlySpan<byte> b)
    {
        if (b.StartsWith((ReadOnlySpan<byte>)[0x89, (byte)'P', (byte)'N', (byte)'G', 0x0D, 0x0A, 0x1A, 0x0A])) return Png(b);
        if (b.Length >= 3 && b[0] == 0xFF && b[1] == 0xD8 && b[2] == 0xFF) return Jpeg(b);
        if (b.StartsWith("GIF87a"u8) || b.StartsWith("GIF89a"u8)) return Gif(b);
        if (b.StartsWith("BM"u8)) return Bmp(b);
        if (b.StartsWith("II*\0"u8)) return Tiff(b, littleEndian: true);
        if (b.StartsWith("MM\0*"u8)) return Tiff(b, littleEndian: false);
        return null;
    }

    private static string? Png(ReadOnlySpan<byte> b)
    {
        long pos = 8;
        while (pos < b.Length)
        {
            if (b.Length - pos < 12) return $"{CutShort} inside a PNG chunk";
            long n = BinaryPrimitives.ReadUInt32BigEndian(b[(int)pos..]);
            var type = System.Text.Encoding.ASCII.GetString(b.Slice((int)pos + 4, 4));
            if (n > b.Length - pos - 12) return $"{CutShort}: PNG chunk {Printable(type)} runs past the end of the file";
            var stored = BinaryPrimitives.ReadUInt32BigEndian(b[(int)(pos + 8 + n)..]);
            if (Crc32(b.Slice((int)pos + 4, (int)n + 4)) != stored)
                return $"the file is damaged: PNG chunk {Printable(type)} fails its checksum";
            pos += 12 + n;
            if (type == "IEND") return null;
        }
        return $"{CutShort}: the PNG ends before its end marker (IEND)";
    }

    private static string? Jpeg(ReadOnlySpan<byte> b)
    {
        var pos = 2;
        while (true)
        {
            if (pos >= b.Length) return $"{CutShort}: the JPEG ends before its end marker (EOI)";
            if (b[pos] != 0xFF) return $"the file is damaged: no JPEG marker where one should be (byte {pos})";
            while (pos < b.Length && b[pos] == 0xFF) pos++; // fill bytes
            if (pos >= b.Length) return $"{CutShort}: the JPEG ends before its end marker (EOI)";
            var marker = b[pos++];
            if (marker == 0xD9) return null;
            if (marker is 0xD8 or 0x01 or (>= 0xD0 and <= 0xD7)) continue; // markers without a length
            if (pos + 2 > b.Length) return $"{CutShort} inside a JPEG segment";
            int length = BinaryPrimitives.ReadUInt16BigEndian(b[pos..]);
            if (length < 2) return $"the file is damaged: a JPEG segment has an impossible length ({length})";
            if (pos + length > b.Length) return $"{CutShort} inside a JPEG segment";
            pos += length;
            if (marker != 0xDA) continue;
            // Entropy-coded data: 0xFF is followed by 0x00 (a stuffed byte) or a restart marker; anything else ends it.
            while (true)
            {
                if (pos + 1 >= b.Length) return $"{CutShort}: the JPEG ends inside its image data";
                if (b[pos] == 0xFF && b[pos + 1] != 0x00 && b[pos + 1] is not (>= 0xD0 and <= 0xD7)) break;
                pos += b[pos] == 0xFF ? 2 : 1;
            }
        }
    }

    private static string? Gif(ReadOnlySpan<byte> b)
    {
        if (b.Length < 13) return $"{CutShort} inside the GIF header";
        long pos = 13 + ColourTableBytes(b[10]);
        var images = 0;
        while (true)
        {
            if (pos >= b.Length)
                // Some encoders leave out the trailer; a file that stops cleanly after a whole image is accepted.
                return pos == b.Length && images > 0 ? null : $"{CutShort}: the GIF ends before its trailer";
            var block = b[(int)pos++];
            if (block == 0x3B) return null;
            if (block == 0x21)
            {
                pos++; // extension label
            }
            else if (block == 0x2C)
            {
                if (pos + 10 > b.Length) return $"{CutShort} inside a GIF image descriptor";
                pos += 9 + ColourTableBytes(b[(int)pos + 8]);
                pos++; // LZW minimum code size
                images++;
            }
            else
            {
                return $"the file is damaged: unexpected byte 0x{block:X2} where a GIF block should start";
            }
            while (true) // data sub-blocks, ended by an empty one
            {
                if (pos >= b.Length) return $"{CutShort} inside GIF data";
                var size = b[(int)pos++];
                if (size == 0) break;
                pos += size;
            }
        }
    }

    private static long ColourTableBytes(byte packed) => (packed & 0x80) != 0 ? 3L << ((packed & 7) + 1) : 0;

    private static string? Bmp(ReadOnlySpan<byte> b)
    {
        if (b.Length < 26) return $"{CutShort} inside the BMP header";
        long offBits = BinaryPrimitives.ReadUInt32LittleEndian(b[10..]);
        var dibSize = BinaryPrimitives.ReadUInt32LittleEndian(b[14..]);
        long width, height, bpp, compression = 0, sizeImage = 0;
        if (dibSize == 12)
        {
            width = BinaryPrimitives.ReadUInt16LittleEndian(b[18..]);
            height = BinaryPrimitives.ReadUInt16LittleEndian(b[20..]);
            bpp = BinaryPrimitives.ReadUInt16LittleEndian(b[24..]);
        }
        else
        {
            if (b.Length < 38) return $"{CutShort} inside the BMP header";
            width = Math.Abs((long)BinaryPrimitives.ReadInt32LittleEndian(b[18..]));
            height = Math.Abs((long)BinaryPrimitives.ReadInt32LittleEndian(b[22..]));
            bpp = BinaryPrimitives.ReadUInt16LittleEndian(b[28..]);
            compression = BinaryPrimitives.ReadUInt32LittleEndian(b[30..]);
            sizeImage = BinaryPrimitives.ReadUInt32LittleEndian(b[34..]);
        }
        // Uncompressed rows are padded to 4 bytes; compressed data has its size in the header.
        long need = compression is 0 or 3 or 6 ? offBits + (width * bpp + 31) / 32 * 4 * height : offBits + sizeImage;
        return need > b.Length ? $"{CutShort}: the BMP needs {need} bytes, the file has {b.Length}" : null;
    }

    private static string? Tiff(ReadOnlySpan<byte> b, bool littleEndian)
    {
        uint U32(ReadOnlySpan<byte> s) => littleEndian ? BinaryPrimitives.ReadUInt32LittleEndian(s) : BinaryPrimitives.ReadUInt32BigEndian(s);
        ushort U16(ReadOnlySpan<byte> s) => littleEndian ? BinaryPrimitives.ReadUInt16LittleEndian(s) : BinaryPrimitives.ReadUInt16BigEndian(s);

        if (b.Length < 8) return $"{CutShort} inside the TIFF header";
        long ifd = U32(b[4..]);
        if (ifd < 8 || ifd + 2 > b.Length) return $"{CutShort} or damaged: the TIFF's directory lies outside the file";
        long entries = U16(b[(int)ifd..]);
        if (ifd + 2 + 12 * entries + 4 > b.Length) return $"{CutShort} inside the TIFF's directory";

        long[]? offsets = null, counts = null;
        for (var i = 0; i < entries; i++)
        {
            var e = b.Slice((int)(ifd + 2 + 12 * i), 12);
            var tag = U16(e);
            if (tag is not (273 or 279 or 324 or 325)) continue; // strip / tile offsets and byte counts
            var type = U16(e[2..]);
            long count = U32(e[4..]);
            int size = type switch { 3 => 2, 4 => 4, _ => 0 };
            if (size == 0) return $"the file is damaged: TIFF tag {tag} has an unexpected type ({type})";
            long at = count * size <= 4 ? ifd + 2 + 12 * i + 8 : U32(e[8..]);
            if (at + count * size > b.Length) return $"{CutShort}: a TIFF table runs past the end of the file";
            var values = new long[count];
            for (var k = 0; k < count; k++)
                values[k] = size == 2 ? U16(b[(int)(at + 2 * k)..]) : U32(b[(int)(at + 4 * k)..]);
            if (tag is 273 or 324) offsets = values; else counts = values;
        }
        if (offsets is null || counts is null) return "the file is damaged: the TIFF does not say where its image data is";
        for (var k = 0; k < Math.Min(offsets.Length, counts.Length); k++)
            if (offsets[k] + counts[k] > b.Length) return $"{CutShort}: TIFF image data runs past the end of the file";
        return null;
    }

    private static string Printable(string type) => type.All(char.IsAsciiLetter) ? type : "with a garbled name";

    private static readonly uint[] CrcTable = MakeCrcTable();

    // CRC-32 of PNG chunks: polynomial 0xEDB88320, reflected, as in the PNG specification's sample code (annex D).
    private static uint Crc32(ReadOnlySpan<byte> data)
    {
        var crc = 0xFFFFFFFFu;
        foreach (var x in data) crc = CrcTable[(crc ^ x) & 0xFF] ^ (crc >> 8);
        return ~crc;
    }

    private static uint[] MakeCrcTable()
    {
        var table = new uint[256];
        for (uint n = 0; n < 256; n++)
        {
            var c = n;
            for (var k = 0; k < 8; k++) c = (c & 1) != 0 ? 0xEDB88320 ^ (c >> 1) : c >> 1;
            table[n] = c;
        }
        return table;
    }
}
