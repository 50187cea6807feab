using TorchSharp;

namespace HandLine.Model;

/// <summary>Process-wide TorchSharp settings: CPU only, thread count, seeding.</summary>
public static class TorchRuntime
{
    /// <summary>Sets libtorch's intra-op threads (0 leaves its default).</summary>
    public static void SetThreads(int threads)
    {
        if (threads > 0) torch.set_num_threads(threads);
    }

    /// <summary>
    /// Held while seeding libtorch's global generator and drawing from it, so that two models built or trained
    /// at the same time in one process (parallel tests, a host application) cannot take each other's numbers.
    /// </summary>
    internal static readonly Lock RandomLock = new();

    public static void Seed(long seed)
    {
        lock (RandomLock) torch.manual_seed(seed);
    }
}
