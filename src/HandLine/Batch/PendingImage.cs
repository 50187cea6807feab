using HandLine.Features;
using HandLine.Model;
using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>
/// One source on its way through <see cref="BatchRunner"/>: read and hashed, then either found in the journal or
/// prepared, run through the network with other images' lines, and decoded. Each stage fills its part; a failure
/// at any stage is kept in <see cref="Error"/> and reported in the source's place.
/// </summary>
internal sealed class PendingImage(int index, SourceImage source)
{
    public int Index { get; } = index;
    public SourceImage Source { get; } = source;

    /// <summary>The file's bytes, kept until the source is written: the journal may fail to give its record back, and an unsure reading is compared with the image turned (<see cref="IImageRecogniser.Settle"/>).</summary>
    public byte[]? Bytes { get; set; }

    public string? Sha256 { get; set; }
    public string? ReuseKey { get; set; }

    /// <summary>The journal held a record under this source's key when the run started.</summary>
    public bool InJournal { get; set; }

    public IReadOnlyList<PreparedLine>? Lines { get; set; }
    public IReadOnlyList<Posteriors>? Posteriors { get; set; }
    public IReadOnlyList<LineResult>? Results { get; set; }
    public Exception? Error { get; set; }
}
