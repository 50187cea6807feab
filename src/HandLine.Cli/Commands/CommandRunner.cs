namespace HandLine.Cli.Commands;

/// <summary>Turns the library's input errors into one clear line on stderr and the documented exit code.</summary>
internal static class CommandRunner
{
    public static int Guard(Func<int> action)
    {
        try
        {
            return action();
        }
        catch (InputException e)
        {
            Console.Error.WriteLine($"error: {e.Message}");
            return ExitCodes.Failed;
        }
        catch (ArgumentException e)
        {
            Console.Error.WriteLine($"error: {e.Message}");
            return ExitCodes.Failed;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            // The output side failed (folder not writable, disk full): the whole command cannot go on.
            Console.Error.WriteLine($"error: {e.Message}");
            return ExitCodes.Failed;
        }
    }
}
