namespace HandLine.Batch.Journal;

/// <summary>
/// The live journal of a run folder: an append-only file of completed sources, each record flushed to disk
/// before the batch moves on, so a run killed at any moment can be resumed. Opening it indexes the records
/// that can be reused and cuts off a torn last record, so new records follow a whole one.
/// </summary>
internal sealed class RunJournal : IDisposable
{
    public const string FileName = "run.journal";

    private readonly FileStream _file;
    private readonly Dictionary<string, (long Offset, int Length)> _reusable = new(StringComparer.Ordinal);

    private RunJournal(FileStream file) => _file = file;

    public string FilePath => _file.Name;

    /// <summary>Records indexed for reuse.</summary>
    public int Reusable => _reusable.Count;

    /// <summary>Whole records that failed their check and were skipped.</summary>
    public int Damaged { get; private set; }

    /// <summary>Bytes of an unfinished last record that were cut off.</summary>
    public long TornBytes { get; private set; }

    public static RunJournal Open(string outDir, int maxRecordBytes)
    {
        var path = Path.Combine(outDir, FileName);
        var file = new FileStream(path, FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.Read);
        var journal = new RunJournal(file);
        try
        {
            var scanner = new JournalScanner(file, maxRecordBytes);
            foreach (var entry in scanner.Entries())
            {
                var r = entry.Record;
                if (r.Kind == JournalRecord.Done)
                    journal._reusable[JournalRecord.ReuseKey(r.Source!, r.ImageSha256!, r.ModelId!, r.OptionsHash!)] = (entry.Offset, entry.Raw.Length);
            }
            journal.Damaged = scanner.Damaged;
            journal.TornBytes = file.Length - scanner.ValidEnd;
            if (file.Length != scanner.ValidEnd)
            {
                file.SetLength(scanner.ValidEnd);
                file.Flush(flushToDisk: true);
            }
            file.Position = scanner.ValidEnd;
            return journal;
        }
        catch
        {
            file.Dispose();
            throw;
        }
    }

    /// <summary>
    /// Whether a record was indexed under this key when the journal was opened (it may still fail its check when
    /// read). The index does not change after opening, so this is safe from other threads, unlike <see cref="TryGet"/>.
    /// </summary>
    public bool Holds(string reuseKey) => _reusable.ContainsKey(reuseKey);

    /// <summary>The stored record for this key, with its bytes as stored; false when there is none or it no longer checks.</summary>
    public bool TryGet(string reuseKey, out JournalEntry entry)
    {
        entry = null!;
        if (!_reusable.TryGetValue(reuseKey, out var at))
            return false;
        var raw = new byte[at.Length];
        var end = _file.Position;
        _file.Position = at.Offset;
        _file.ReadExactly(raw);
        _file.Position = end;
        var record = raw.Length > 0 && raw[^1] == (byte)'\n' ? JournalCodec.TryDecode(raw.AsSpan(0, raw.Length - 1)) : null;
        if (record is null)
            return false;
        entry = new JournalEntry(at.Offset, raw, record);
        return true;
    }

    /// <summary>Appends one encoded record and forces it to disk before returning.</summary>
    public void Append(byte[] raw)
    {
        ArgumentNullException.ThrowIfNull(raw);
        _file.Write(raw);
        _file.Flush(flushToDisk: true);
    }

    public void Dispose() => _file.Dispose();
}
