namespace HandLine.Synthesis;

/// <summary>
/// The outcome of <see cref="LineSynthesiser.Generate"/>. <paramref name="SourceCounts"/>: lines written per
/// text source ("phrase", "words" ... as in <see cref="MixedText.SourceName"/>, "text" for the user's lines,
/// "digits" for MNIST digit lines).
/// </summary>
public sealed record SynthesisSummary(
    int LinesWritten,
    IReadOnlyList<SkippedLine> Skipped,
    IReadOnlyDictionary<string, int> SymbolCounts,
    IReadOnlyDictionary<string, int> FontsUsed,
    string ManifestPath,
    string DegradationsPath,
    IReadOnlyDictionary<string, int> SourceCounts)
{
    public int LinesSkipped => Skipped.Count;
}
