namespace HandLine.Scoring;

/// <summary>
/// One manifest line: the image path in canonical form ('/' separators, relative to the manifest's
/// folder), its absolute path, its NFC transcript (may be empty) and the 1-based line it came from.
/// </summary>
public sealed record ManifestEntry(string RelativePath, string FullPath, string Text, int LineNumber);
