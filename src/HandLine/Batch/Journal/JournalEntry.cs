namespace HandLine.Batch.Journal;

/// <summary>A valid journal record, its bytes as stored (line feed included) and where it starts in the file.</summary>
internal sealed record JournalEntry(long Offset, byte[] Raw, JournalRecord Record);
