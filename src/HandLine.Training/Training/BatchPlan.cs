namespace HandLine.Training;

/// <summary>Which lines go into which batch, in which order, for each epoch; seeded, so a resumed run repeats it.</summary>
internal static class BatchPlan
{
    /// <summary>
    /// The batches of one epoch: a stretch of the endless sequence of passes, each pass in its own shuffled
    /// order. Without EpochLines an epoch is exactly one pass.
    /// </summary>
    internal static List<LineSample[]> EpochBatches(IReadOnlyList<LineSample> train, TrainingOptions options, int epoch, int batchesPerEpoch, int batchesPerPass)
    {
        if (batchesPerEpoch == batchesPerPass && options.EpochLines <= 0)
            return BatchOrder(train, options.BatchSize, options.Seed, epoch);
        var result = new List<LineSample[]>(batchesPerEpoch);
        List<LineSample[]>? order = null;
        var orderPass = -1;
        for (var g = (long)epoch * batchesPerEpoch; g < (long)(epoch + 1) * batchesPerEpoch; g++)
        {
            var pass = (int)(g / batchesPerPass);
            if (pass != orderPass)
            {
                order = BatchOrder(train, options.BatchSize, options.Seed, pass);
                orderPass = pass;
            }
            result.Add(order![(int)(g % batchesPerPass)]);
        }
        return result;
    }

    /// <summary>Batches of similar width (less padding), in an order shuffled per pass from the seed.</summary>
    internal static List<LineSample[]> BatchOrder(IReadOnlyList<LineSample> train, int batchSize, int seed, int epoch)
    {
        // Not HashCode.Combine: it is randomised per process, and a resumed run is a new process.
        var rng = new Random(unchecked((seed * 1_000_003) + epoch));
        // Sort by width with a random tie-break so bucket membership varies between epochs.
        var order = train.Select((s, i) => (s, key: s.Frames + rng.NextDouble() * 8, i))
            .OrderBy(x => x.key).ThenBy(x => x.i).Select(x => x.s).ToArray();
        var batches = order.Chunk(batchSize).ToList();
        for (var i = batches.Count - 1; i > 0; i--)
        {
            var j = rng.Next(i + 1);
            (batches[i], batches[j]) = (batches[j], batches[i]);
        }
        return batches;
    }
}
