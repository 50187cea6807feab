using System.Buffers.Binary;
using System.Globalization;
using System.Security.Cryptography;
using System.Text;

namespace HandLine.Batch;

/// <summary>
/// Share K of N of a batch (K counted from 0), so N processes on a cluster can split one set of inputs with no
/// coordination. A source belongs to the shard its path hashes to. The hash is SHA-256 of the UTF-8 path — not
/// <see cref="string.GetHashCode()"/>, which is randomised per process — so every machine, run and .NET version
/// assigns the same sources to the same shard.
/// </summary>
public sealed record ShardSpec
{
    /// <summary>More shards than this is almost certainly a typing error (an array index given as the count).</summary>
    public const int MaxCount = 100_000;

    public ShardSpec(int index, int count)
    {
        if (count is < 1 or > MaxCount)
            throw new ArgumentOutOfRangeException(nameof(count), count, $"shard count must be between 1 and {MaxCount}");
        if (index < 0 || index >= count)
            throw new ArgumentOutOfRangeException(nameof(index), index, $"shard index must be between 0 and {count - 1} (shards are counted from 0)");
        Index = index;
        Count = count;
    }

    public int Index { get; }
    public int Count { get; }

    /// <summary>Parses "K/N", e.g. "0/8" … "7/8".</summary>
    /// <exception cref="ArgumentException">The text is not K/N with 0 ≤ K &lt; N.</exception>
    public static ShardSpec Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var parts = text.Split('/');
        if (parts.Length != 2
            || !int.TryParse(parts[0].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var index)
            || !int.TryParse(parts[1].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var count))
            throw new ArgumentException($"shard '{text}' is not of the form K/N, e.g. 0/8 (K counted from 0)");
        if (count is < 1 or > MaxCount)
            throw new ArgumentException($"shard '{text}': N must be between 1 and {MaxCount}");
        if (index >= count)
            throw new ArgumentException($"shard '{text}': K must be between 0 and {count - 1} (shards are counted from 0)");
        return new ShardSpec(index, count);
    }

    /// <summary>The shard, 0 … count-1, that <paramref name="key"/> belongs to.</summary>
    public static int ShardOf(string key, int count)
    {
        ArgumentNullException.ThrowIfNull(key);
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 1);
        Span<byte> hash = stackalloc byte[SHA256.HashSizeInBytes];
        SHA256.HashData(Encoding.UTF8.GetBytes(key), hash);
        return (int)(BinaryPrimitives.ReadUInt64BigEndian(hash) % (ulong)count);
    }

    public bool Contains(string key) => ShardOf(key, Count) == Index;

    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{Index}/{Count}");
}
