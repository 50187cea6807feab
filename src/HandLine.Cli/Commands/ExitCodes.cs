namespace HandLine.Cli.Commands;

/// <summary>Process exit codes; the README lists them.</summary>
internal static class ExitCodes
{
    public const int Ok = 0;

    /// <summary>The run finished, but some inputs could not be processed (see errors.jsonl).</summary>
    public const int CompletedWithErrors = 1;

    /// <summary>Nothing could be done: bad arguments, unreadable model or truth file.</summary>
    public const int Failed = 2;

    /// <summary><c>score --max-cer</c>: the whole 95 % interval of the CER is above the threshold.</summary>
    public const int ProofFailed = 3;

    /// <summary><c>score --max-cer</c>: the 95 % interval contains the threshold; the sample cannot tell.</summary>
    public const int ProofInconclusive = 4;

    /// <summary><c>adapt</c>: the adapted model read the held-back corrections worse than the model did before; nothing written.</summary>
    public const int AdaptRefused = 5;

    /// <summary>Stopped by Ctrl+C after finishing the current item; reports are consistent.</summary>
    public const int Cancelled = 130;
}
