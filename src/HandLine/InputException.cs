namespace HandLine;

/// <summary>
/// A problem with one user-supplied file (image, manifest, word list, model). Carries the file,
/// the pipeline stage that found it and a plain-words reason, so a batch can report it and go on.
/// </summary>
public sealed class InputException : Exception
{
    public InputException(string path, string stage, string reason, Exception? inner = null)
        : base($"{path}: {reason}", inner)
    {
        Path = path;
        Stage = stage;
        Reason = reason;
    }

    public string Path { get; }

    /// <summary>Short stage name: "read", "decode", "limits", "manifest", "normalise", "model".</summary>
    public string Stage { get; }

    public string Reason { get; }
}
