namespace HandLine.Proof;

/// <summary>
/// Splits a sample size over strata in proportion to their sizes by largest remainders: each stratum gets the
/// whole part of its exact share, and the lines left over go to the largest fractional parts (ties to the
/// earlier stratum). So every stratum gets its exact share rounded down or up, never further off than one line,
/// and the parts add up to the whole.
/// </summary>
public static class StratifiedAllocation
{
    /// <exception cref="ArgumentException">A size is negative, or <paramref name="total"/> is negative or more than their sum.</exception>
    public static int[] Allocate(IReadOnlyList<int> sizes, int total)
    {
        ArgumentNullException.ThrowIfNull(sizes);
        ArgumentOutOfRangeException.ThrowIfNegative(total);
        long population = 0;
        foreach (var size in sizes)
        {
            ArgumentOutOfRangeException.ThrowIfNegative(size, nameof(sizes));
            population += size;
        }
        if (total > population)
            throw new ArgumentException($"Cannot draw {total} from {population}.", nameof(total));
        var result = new int[sizes.Count];
        if (total == 0)
            return result;

        var remainders = new (long Numerator, int Index)[sizes.Count];
        var given = 0;
        for (var i = 0; i < sizes.Count; i++)
        {
            // Exact share total * size / population, kept in integers so the ranking of remainders is exact.
            var scaled = (long)total * sizes[i];
            result[i] = (int)(scaled / population);
            remainders[i] = (scaled % population, i);
            given += result[i];
        }
        foreach (var (_, index) in remainders.OrderByDescending(r => r.Numerator).ThenBy(r => r.Index).Take(total - given))
            result[index]++;
        return result;
    }
}
