namespace HandLine.Formats;

/// <summary>
/// The usable lines of a manifest and one error per unusable line. <see cref="Columns"/> are the names of
/// the extra columns its <c>#columns</c> header declares, in file order (empty without a header).
/// </summary>
public sealed record ManifestReadResult(IReadOnlyList<ManifestEntry> Entries, IReadOnlyList<InputException> Errors)
{
    public IReadOnlyList<string> Columns { get; init; } = [];
}
