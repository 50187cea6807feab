namespace HandLine.Batch.Journal;

/// <summary>
/// Reads a journal front to back in fixed-size chunks (memory does not grow with the journal), yielding each
/// valid record. Lines that fail their check are counted and skipped; an unfinished last line — what a kill
/// during an append leaves — is a torn tail and is ignored.
/// </summary>
internal sealed class JournalScanner
{
    private const int ChunkBytes = 64 * 1024;
    private readonly Stream _stream;
    private readonly int _maxRecordBytes;

    public JournalScanner(Stream stream, int maxRecordBytes)
    {
        ArgumentNullException.ThrowIfNull(stream);
        ArgumentOutOfRangeException.ThrowIfLessThan(maxRecordBytes, 1);
        _stream = stream;
        _maxRecordBytes = maxRecordBytes;
    }

    /// <summary>Offset just past the last valid record: where the next append belongs. Set once enumeration ends.</summary>
    public long ValidEnd { get; private set; }

    /// <summary>Complete lines that failed their check (damage, not a torn tail).</summary>
    public int Damaged { get; private set; }

    /// <summary>Bytes after the last line feed: a record cut short by a kill.</summary>
    public long TornBytes { get; private set; }

    public IEnumerable<JournalEntry> Entries()
    {
        var chunk = new byte[ChunkBytes];
        var line = new MemoryStream();
        var overlong = false;
        long position = 0, lineStart = 0;
        int read;
        while ((read = _stream.Read(chunk, 0, chunk.Length)) > 0)
        {
            var start = 0;
            while (start < read)
            {
                var lf = Array.IndexOf(chunk, (byte)'\n', start, read - start);
                var end = lf >= 0 ? lf : read;
                if (!overlong)
                {
                    if (line.Length + (end - start) > _maxRecordBytes)
                    {
                        overlong = true;
                        line.SetLength(0);
                    }
                    else
                    {
                        line.Write(chunk, start, end - start);
                    }
                }
                if (lf < 0)
                    break;

                var next = position + lf + 1;
                var record = overlong ? null : JournalCodec.TryDecode(line.GetBuffer().AsSpan(0, (int)line.Length));
                if (record is null)
                {
                    Damaged++;
                }
                else
                {
                    var raw = new byte[line.Length + 1];
                    line.GetBuffer().AsSpan(0, (int)line.Length).CopyTo(raw);
                    raw[^1] = (byte)'\n';
                    ValidEnd = next;
                    yield return new JournalEntry(lineStart, raw, record);
                }
                line.SetLength(0);
                overlong = false;
                lineStart = next;
                start = lf + 1;
            }
            position += read;
        }
        TornBytes = position - lineStart;
    }
}
