namespace HandLine.Formats;

/// <summary>
/// One manifest line: the image path in canonical form ('/' separators, relative to the manifest's
/// folder), its absolute path, its NFC transcript (may be empty) and the 1-based line it came from.
/// <see cref="Columns"/> holds the values of the extra columns a <c>#columns</c> header names (empty
/// without one).
/// </summary>
public sealed record ManifestEntry(string RelativePath, string FullPath, string Text, int LineNumber)
{
    private static readonly IReadOnlyDictionary<string, string> NoColumns =
        new Dictionary<string, string>(StringComparer.Ordinal).AsReadOnly();

    /// <summary>Extra column values by column name (NFC; may be empty strings).</summary>
    public IReadOnlyDictionary<string, string> Columns { get; init; } = NoColumns;

    /// <summary>The value of an extra column, or null when the manifest has no such column.</summary>
    public string? Column(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        return Columns.GetValueOrDefault(name);
    }
}
