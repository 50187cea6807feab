namespace HandLine.Proof;

/// <summary>
/// One line of a proof sample: where its crop was written (relative to the sample folder), the run's source and
/// line it came from, its stratum (the source's folder), the machine's text and confidence, and whether the crop
/// is the line alone or the whole source image (<see cref="WholeImage"/>, when the line could not be cut out).
/// </summary>
public sealed record SampledLine(
    string CropPath, string Source, int Line, string Folder, string MachineText, double? Confidence, bool WholeImage);
