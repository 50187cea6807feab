namespace HandLine.Formats;

/// <summary>
/// One kind of <see cref="ContainerFile"/>: its eight leading bytes and the words its error messages use.
/// </summary>
/// <param name="Magic">Eight ASCII characters that open every file of the kind.</param>
/// <param name="Stage">The <see cref="InputException.Stage"/> of a problem with such a file.</param>
/// <param name="What">What the file is called in messages ("model", "language model").</param>
/// <param name="NotThisKind">The reason given when the leading bytes are another kind's.</param>
/// <param name="MaxHeaderBytes">Longest JSON header accepted; a longer length is damage, not data.</param>
public sealed record ContainerKind(string Magic, string Stage, string What, string NotThisKind, int MaxHeaderBytes = 1 << 20)
{
    internal byte[] MagicBytes { get; } = MagicOf(Magic);

    private static byte[] MagicOf(string magic)
    {
        ArgumentNullException.ThrowIfNull(magic);
        if (magic.Length != 8 || magic.Any(c => c is < ' ' or > '~' && c != '\n'))
            throw new ArgumentException("a container's magic is eight ASCII characters", nameof(magic));
        return System.Text.Encoding.ASCII.GetBytes(magic);
    }
}
