namespace HandLine.Proof;

/// <summary>A drawn proof sample: its lines in source order and, per folder, the run's lines and the lines drawn.</summary>
public sealed record ProofSample(IReadOnlyList<SampledLine> Lines, IReadOnlyList<(string Folder, int RunLines, int Drawn)> Strata);
