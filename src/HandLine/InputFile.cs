namespace HandLine;

/// <summary>Reads a whole user-supplied file, turning any failure into an <see cref="InputException"/> naming it.</summary>
public static class InputFile
{
    /// <param name="what">The kind of file, for the message: "cannot read the {what}: …".</param>
    public static byte[] ReadAllBytes(string path, string stage, string what)
    {
        try
        {
            return File.ReadAllBytes(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or NotSupportedException)
        {
            throw new InputException(path, stage, $"cannot read the {what}: {e.Message}", e);
        }
    }
}
