using System.Text.Json;
using HandLine.Batch.Journal;

namespace HandLine.Batch;

/// <summary>
/// Joins the output folders of shard runs (<c>transcribe --shard K/N</c>) into one folder equal to what an
/// unsharded run writes: text files, reports in the unsharded input order, the combined summary, and a journal
/// (so the merged folder can be resumed or merged again). It reads only the runs' journals, which a completed
/// run leaves in report order and closes with its summary. Everything is checked before anything is written:
/// an unfinished run, a missing or repeated shard, runs with different models, options or inputs, and a source
/// claimed by two runs are conflicts, and a merge with conflicts writes nothing.
/// </summary>
public static class RunMerge
{
    public static MergeResult Merge(IReadOnlyList<string> runDirs, string outDir, BatchOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(runDirs);
        ArgumentException.ThrowIfNullOrWhiteSpace(outDir);
        if (runDirs.Count == 0) throw new ArgumentException("give at least one run folder to merge", nameof(runDirs));
        options ??= new BatchOptions();
        options.Validate();
        var outFull = Path.TrimEndingDirectorySeparator(Path.GetFullPath(outDir));
        foreach (var run in runDirs)
            if (string.Equals(Path.TrimEndingDirectorySeparator(Path.GetFullPath(run)), outFull, StringComparison.Ordinal))
                throw new ArgumentException($"--out {outDir} is also one of the runs to merge; write the merge to a new folder");

        var conflicts = new List<string>();
        var runs = runDirs.Select(dir => Inspect(dir, options.MaxJournalRecordBytes, conflicts)).ToArray();
        if (conflicts.Count > 0)
            return new MergeResult(runDirs.Count, 0, 0, 0, conflicts);

        CheckShards(runs, conflicts);
        var merged = SummaryMerge.Combine(runs.Select(r => (r.Dir, r.Summary!)).ToArray(), conflicts);
        CheckNoSourceTwice(runs, options.MaxJournalRecordBytes, conflicts);
        if (conflicts.Count > 0)
            return new MergeResult(runDirs.Count, 0, 0, 0, conflicts);

        return Write(runs, outDir, merged, options.MaxJournalRecordBytes);
    }

    private sealed record RunInfo(string Dir, string JournalPath, RunSummary? Summary);

    /// <summary>A merge input must be a finished run: its journal's last valid record is the summary.</summary>
    private static RunInfo Inspect(string dir, int maxRecordBytes, List<string> conflicts)
    {
        var path = Path.Combine(dir, RunJournal.FileName);
        if (!Directory.Exists(dir))
        {
            conflicts.Add($"{dir}: no such folder");
            return new RunInfo(dir, path, null);
        }
        if (!File.Exists(path))
        {
            conflicts.Add($"{dir}: no {RunJournal.FileName}, so not a folder written by 'handline transcribe'");
            return new RunInfo(dir, path, null);
        }
        JournalRecord? last = null;
        using (var file = OpenRead(path))
        {
            var scanner = new JournalScanner(file, maxRecordBytes);
            foreach (var entry in scanner.Entries()) last = entry.Record;
            if (scanner.Damaged > 0 || scanner.TornBytes > 0)
                last = null;
        }
        if (last is not { Kind: JournalRecord.End })
        {
            conflicts.Add($"{dir}: the run did not finish (interrupted or cancelled); rerun the same transcribe command with the same --out to complete it");
            return new RunInfo(dir, path, null);
        }
        try
        {
            return new RunInfo(dir, path, RunSummary.FromJson(last.Summary!));
        }
        catch (JsonException e)
        {
            conflicts.Add($"{dir}: the run's summary is not one this build writes (made by a different build?): {e.Message}");
            return new RunInfo(dir, path, null);
        }
    }

    private static void CheckShards(IReadOnlyList<RunInfo> runs, List<string> conflicts)
    {
        var shards = runs.Select(r => (r.Dir, Shard: SummaryMerge.ShardOf(r.Summary!))).ToArray();
        foreach (var (dir, shard) in shards.Where(s => s.Shard is null))
            conflicts.Add($"{dir}: the summary's shard field is not of the form K/N");
        var valid = shards.Where(s => s.Shard is not null).Select(s => (s.Dir, Shard: s.Shard!.Value)).ToArray();
        if (valid.Length == 0) return;
        var count = valid[0].Shard.Count;
        foreach (var (dir, shard) in valid.Where(s => s.Shard.Count != count))
            conflicts.Add($"{dir}: shard {SummaryMerge.Format(shard.Index, shard.Count)} is from a split into {shard.Count}, but {valid[0].Dir} is from a split into {count}");
        var byIndex = valid.Where(s => s.Shard.Count == count).GroupBy(s => s.Shard.Index).ToDictionary(g => g.Key, g => g.ToArray());
        foreach (var (index, group) in byIndex.Where(g => g.Value.Length > 1))
            conflicts.Add($"shard {SummaryMerge.Format(index, count)} is given twice: {string.Join(", ", group.Select(g => g.Dir))}");
        var missing = Enumerable.Range(0, count).Where(i => !byIndex.ContainsKey(i)).ToArray();
        if (missing.Length > 0)
            conflicts.Add($"missing shard{(missing.Length == 1 ? "" : "s")} {string.Join(", ", missing.Select(i => SummaryMerge.Format(i, count)))}: run {(missing.Length == 1 ? "it" : "them")} (or rerun a failed one) before merging");
    }

    /// <summary>Each report position may come from one run only, and each run's records must be in report order.</summary>
    private static void CheckNoSourceTwice(IReadOnlyList<RunInfo> runs, int maxRecordBytes, List<string> conflicts)
    {
        var owner = new Dictionary<long, string>();
        foreach (var run in runs)
        {
            var previous = long.MinValue;
            foreach (var record in Records(run, maxRecordBytes))
            {
                if (record.Order <= previous)
                {
                    conflicts.Add($"{run.Dir}: journal records are out of order; rerun this shard");
                    break;
                }
                previous = record.Order;
                if (!owner.TryAdd(record.Order, run.Dir))
                    conflicts.Add($"{run.Dir}: '{record.Source ?? record.Path}' is also in {owner[record.Order]}");
            }
        }
    }

    private static MergeResult Write(IReadOnlyList<RunInfo> runs, string outDir, RunSummary summary, int maxRecordBytes)
    {
        Directory.CreateDirectory(outDir);
        using var runLock = RunLock.Acquire(outDir);
        AtomicFile.DeleteStaleTemps(outDir);
        int sources = 0, lines = 0, errors = 0;
        using (var compacted = new JournalWriter(outDir))
        using (var reports = new RunReports(outDir))
        {
            foreach (var (raw, record) in InOrder(runs, maxRecordBytes))
            {
                compacted.Add(raw);
                if (record.Kind == JournalRecord.Done)
                {
                    TranscriptFile.Write(outDir, record.Source!, record.Lines!, skipIfSame: true);
                    reports.Add(record.Lines!);
                    sources++;
                    lines += record.Lines!.Count;
                }
                else
                {
                    reports.AddError(record.ToInputException());
                    errors++;
                }
            }
            compacted.Add(new JournalRecord { Kind = JournalRecord.End, Summary = summary.ToJsonObject() });
            compacted.Commit();
            reports.Complete(summary);
        }
        return new MergeResult(runs.Count, sources, lines, errors, []);
    }

    /// <summary>All runs' records in report order: a k-way merge of journals that are each already in order.</summary>
    private static IEnumerable<(byte[] Raw, JournalRecord Record)> InOrder(IReadOnlyList<RunInfo> runs, int maxRecordBytes)
    {
        var streams = runs.Select(r => Entries(r, maxRecordBytes).GetEnumerator()).ToArray();
        try
        {
            var queue = new PriorityQueue<int, long>();
            for (var i = 0; i < streams.Length; i++)
                if (streams[i].MoveNext()) queue.Enqueue(i, streams[i].Current.Record.Order);
            while (queue.TryDequeue(out var i, out _))
            {
                var entry = streams[i].Current;
                yield return (entry.Raw, entry.Record);
                if (streams[i].MoveNext()) queue.Enqueue(i, streams[i].Current.Record.Order);
            }
        }
        finally
        {
            foreach (var s in streams) s.Dispose();
        }
    }

    private static IEnumerable<JournalRecord> Records(RunInfo run, int maxRecordBytes) =>
        Entries(run, maxRecordBytes).Select(e => e.Record);

    /// <summary>A run's source and error records (its closing summary left out).</summary>
    private static IEnumerable<JournalEntry> Entries(RunInfo run, int maxRecordBytes)
    {
        using var file = OpenRead(run.JournalPath);
        foreach (var entry in new JournalScanner(file, maxRecordBytes).Entries())
            if (entry.Record.Kind != JournalRecord.End)
                yield return entry;
    }

    private static FileStream OpenRead(string path)
    {
        try
        {
            return new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite, 1 << 16);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(path, "read", $"cannot read the run journal: {e.Message}", e);
        }
    }
}
