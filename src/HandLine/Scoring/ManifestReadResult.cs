namespace HandLine.Scoring;

/// <summary>The usable lines of a manifest and one error per unusable line.</summary>
public sealed record ManifestReadResult(IReadOnlyList<ManifestEntry> Entries, IReadOnlyList<InputException> Errors);
