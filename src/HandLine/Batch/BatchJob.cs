using System.Diagnostics;
using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>
/// Everything <see cref="BatchRunner"/> needs for one run: the listed inputs (all of them; the runner takes its
/// shard), the recogniser it hands each image's bytes to, and the identity under which results are journalled
/// and reused, the settings its summary reports, and when the run began (the clock runs from before the model
/// was loaded, so the summary's time covers the whole run).
/// </summary>
internal sealed record BatchJob(
    string OutDir,
    IReadOnlyList<SourceImage> Sources,
    IReadOnlyList<InputException> InputErrors,
    IImageRecogniser Recogniser,
    RunSettings Settings,
    string OptionsHash,
    BatchOptions Options,
    DateTime StartedUtc,
    Stopwatch Clock)
{
    public string ModelId => Settings.ModelId;
}
