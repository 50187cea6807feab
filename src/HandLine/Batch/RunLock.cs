namespace HandLine.Batch;

/// <summary>
/// Holds an output folder for one process at a time: two runs writing one journal would corrupt it. The lock is
/// an exclusive open of a small file (an advisory flock on Linux), which the system releases when the process
/// dies however it dies, so a killed run never leaves a stale lock behind.
/// </summary>
internal sealed class RunLock : IDisposable
{
    public const string FileName = ".handline.lock";

    private readonly FileStream _file;

    private RunLock(FileStream file) => _file = file;

    /// <exception cref="InputException">Stage "output": another process holds the folder, or it cannot be written.</exception>
    public static RunLock Acquire(string outDir)
    {
        var path = Path.Combine(outDir, FileName);
        try
        {
            return new RunLock(new FileStream(path, FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None));
        }
        catch (UnauthorizedAccessException e)
        {
            throw new InputException(outDir, "output", "permission denied: cannot write to the output folder", e);
        }
        catch (IOException e)
        {
            throw new InputException(outDir, "output",
                $"cannot lock the output folder; another handline process is probably writing to it (give each run and each shard its own --out): {e.Message}", e);
        }
    }

    public void Dispose() => _file.Dispose();
}
