namespace HandLine.Synthesis;

/// <summary>The outcome of <see cref="LineSynthesiser.Generate"/>.</summary>
public sealed record SynthesisSummary(
    int LinesWritten,
    IReadOnlyList<SkippedLine> Skipped,
    IReadOnlyDictionary<string, int> SymbolCounts,
    IReadOnlyDictionary<string, int> FontsUsed,
    string ManifestPath,
    string DegradationsPath)
{
    public int LinesSkipped => Skipped.Count;
}
