using HandLine.Imaging;

namespace HandLine.Recognition;

/// <summary>
/// What the batch runner needs of a recogniser: the limits it reads files under, and image bytes to line results.
/// <see cref="Recogniser"/> is the one implementation; tests give the runner failures of their own through it.
/// </summary>
public interface IImageRecogniser
{
    InputLimits Limits { get; }

    /// <param name="source">The source's name in the reports.</param>
    /// <param name="nameForErrors">Named in any <see cref="InputException"/> (normally the file's path).</param>
    IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors);
}
