using HandLine.Imaging;

namespace HandLine.Batch;

/// <summary>
/// Everything <see cref="BatchRunner"/> needs for one run: the listed inputs (all of them; the runner takes its
/// shard), how to read one image, and the identity under which results are journalled and reused.
/// </summary>
internal sealed record BatchJob(
    string OutDir,
    IReadOnlyList<SourceImage> Sources,
    IReadOnlyList<InputException> InputErrors,
    ImagingOptions Limits,
    Func<SourceImage, byte[], IReadOnlyList<LineResult>> Read,
    string ModelId,
    string OptionsHash,
    BatchOptions Options);
