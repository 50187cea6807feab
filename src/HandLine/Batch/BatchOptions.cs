namespace HandLine.Batch;

/// <summary>
/// How a batch runs, as opposed to what it computes (<see cref="TranscribeOptions"/>): which share of the inputs,
/// how progress is shown, and the limits of the resume journal. None of these change a source's results, so none
/// are part of the options hash that decides whether journalled results can be reused.
/// </summary>
public sealed record BatchOptions
{
    /// <summary>Only this share of the inputs; null for all of them.</summary>
    public ShardSpec? Shard { get; init; }

    public ProgressStyle Progress { get; init; } = ProgressStyle.Plain;

    /// <summary>Time between status lines in <see cref="ProgressStyle.Plain"/> (common practice, no source: often enough for a log, rare enough to read).</summary>
    public TimeSpan PlainInterval { get; init; } = TimeSpan.FromSeconds(10);

    /// <summary>Shortest time between redraws in <see cref="ProgressStyle.Terminal"/>; faster only flickers.</summary>
    public TimeSpan TerminalInterval { get; init; } = TimeSpan.FromMilliseconds(250);

    /// <summary>
    /// Longest journal record accepted when reading a journal back. A record holds one image's lines with
    /// per-character detail, normally a few kilobytes; anything longer is damage, not data.
    /// </summary>
    public int MaxJournalRecordBytes { get; init; } = 16 * 1024 * 1024;

    /// <summary>Throws <see cref="ArgumentException"/> when a setting is out of range.</summary>
    public void Validate()
    {
        if (!Enum.IsDefined(Progress))
            throw new ArgumentException("BatchOptions.Progress is not a known style.", nameof(Progress));
        if (PlainInterval <= TimeSpan.Zero)
            throw new ArgumentException("BatchOptions.PlainInterval must be positive.", nameof(PlainInterval));
        if (TerminalInterval <= TimeSpan.Zero)
            throw new ArgumentException("BatchOptions.TerminalInterval must be positive.", nameof(TerminalInterval));
        if (MaxJournalRecordBytes < 1024)
            throw new ArgumentException("BatchOptions.MaxJournalRecordBytes must be at least 1024.", nameof(MaxJournalRecordBytes));
    }
}
