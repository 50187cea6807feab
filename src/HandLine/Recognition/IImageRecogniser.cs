using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;

namespace HandLine.Recognition;

/// <summary>
/// What the batch runner needs of a recogniser: the limits it reads files under, and image bytes to line results
/// in three stages, so the runner can prepare images in parallel, run the network over lines of many images at
/// once and decode images in parallel. <see cref="Recogniser"/> is the one implementation; tests give the runner
/// failures of their own through it.
/// </summary>
public interface IImageRecogniser
{
    InputLimits Limits { get; }

    /// <summary>All stages for one image: <see cref="Prepare"/>, <see cref="Run"/>, <see cref="Decode"/>, <see cref="Settle"/>.</summary>
    /// <param name="source">The source's name in the reports.</param>
    /// <param name="nameForErrors">Named in any <see cref="InputException"/> (normally the file's path).</param>
    IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors);

    /// <summary>Image bytes to the image's prepared lines; safe to call from several threads at once.</summary>
    IReadOnlyList<PreparedLine> Prepare(byte[] imageBytes, string nameForErrors);

    /// <summary>
    /// The network on prepared lines of one image or many; each line's posteriors must not depend on which other
    /// lines were given with it (the runner's reports rely on it). One thread at a time.
    /// </summary>
    IReadOnlyList<Posteriors> Run(IReadOnlyList<PreparedLine> lines);

    /// <summary>One image's lines and their posteriors to its results; safe to call from several threads at once.</summary>
    IReadOnlyList<LineResult> Decode(string source, IReadOnlyList<PreparedLine> lines, IReadOnlyList<Posteriors> posteriors);

    /// <summary>
    /// The image's final results given its first reading: the same, or another way up read again when the first
    /// was unsure (see <see cref="Recogniser.Settle"/>). Uses the network: one thread at a time, as <see cref="Run"/>.
    /// </summary>
    IReadOnlyList<LineResult> Settle(byte[] imageBytes, string source, string nameForErrors, IReadOnlyList<LineResult> first);
}
