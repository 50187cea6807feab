using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>
/// Everything <see cref="BatchRunner"/> needs for one run: the listed inputs (all of them; the runner takes its
/// shard), the recogniser it hands each image's bytes to, and the identity under which results are journalled
/// and reused.
/// </summary>
internal sealed record BatchJob(
    string OutDir,
    IReadOnlyList<SourceImage> Sources,
    IReadOnlyList<InputException> InputErrors,
    IImageRecogniser Recogniser,
    string ModelId,
    string OptionsHash,
    BatchOptions Options);
