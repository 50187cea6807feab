namespace HandLine.Cli.Commands;

/// <summary>Process exit codes; the README lists them.</summary>
internal static class ExitCodes
{
    public const int Ok = 0;

    /// <summary>The run finished, but some inputs could not be processed (see errors.jsonl).</summary>
    public const int CompletedWithErrors = 1;

    /// <summary>Nothing could be done: bad arguments, unreadable model or truth file.</summary>
    public const int Failed = 2;

    /// <summary>Stopped by Ctrl+C after finishing the current item; reports are consistent.</summary>
    public const int Cancelled = 130;
}
