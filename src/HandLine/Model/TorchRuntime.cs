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

    public static void Seed(long seed) => torch.manual_seed(seed);
}
