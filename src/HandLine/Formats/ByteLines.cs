namespace HandLine.Formats;

/// <summary>
/// Splits a file's bytes into lines before decoding, so each line can be checked on its own and one
/// bad line does not spoil the rest.
/// </summary>
internal static class ByteLines
{
    /// <summary>Splits on LF; drops a UTF-8 byte-order mark at the start and a CR at each line end.</summary>
    public static IEnumerable<ReadOnlyMemory<byte>> Split(byte[] bytes)
    {
        var start = bytes.AsSpan().StartsWith("\uFEFF"u8) ? 3 : 0;
        while (start < bytes.Length)
        {
            var lf = Array.IndexOf(bytes, (byte)'\n', start);
            var end = lf >= 0 ? lf : bytes.Length;
            var length = end - start;
            if (length > 0 && bytes[end - 1] == (byte)'\r')
                length--;
            yield return bytes.AsMemory(start, length);
            start = end + 1;
        }
    }
}
