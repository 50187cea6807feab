namespace HandLine.Batch.Journal;

/// <summary>
/// Writes a whole journal — a completed run's records in report order, ending with its "end" record — to a
/// temporary file, and renames it over the run's journal on <see cref="Commit"/>. Until then the old journal
/// stays intact, so a kill during compaction loses nothing.
/// </summary>
internal sealed class JournalWriter : IDisposable
{
    private readonly string _target;
    private readonly string _temp;
    private readonly FileStream _file;
    private bool _committed;

    public JournalWriter(string outDir)
    {
        _target = Path.Combine(outDir, RunJournal.FileName);
        _temp = AtomicFile.TempPathFor(_target);
        _file = new FileStream(_temp, FileMode.CreateNew, FileAccess.Write, FileShare.None, 1 << 16);
    }

    public void Add(byte[] raw) => _file.Write(raw);

    public void Add(JournalRecord record) => Add(JournalCodec.Encode(record));

    /// <summary>Flushes to disk and renames into place. Close the live journal first.</summary>
    public void Commit()
    {
        _file.Flush(flushToDisk: true);
        _file.Dispose();
        File.Move(_temp, _target, overwrite: true);
        _committed = true;
    }

    public void Dispose()
    {
        _file.Dispose();
        if (!_committed && File.Exists(_temp)) File.Delete(_temp);
    }
}
