namespace HandLine.Batch;

/// <summary>
/// One image to transcribe. <see cref="Source"/> is its path relative to its input root with '/' separators
/// (for a manifest, the path as written in it); outputs are named after it.
/// </summary>
public sealed record SourceImage(string Source, string FullPath, string? Truth = null);
