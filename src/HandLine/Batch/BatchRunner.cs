using System.Diagnostics;
using System.Security.Cryptography;
using System.Text;
using HandLine.Batch.Journal;
using HandLine.Imaging;
using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>
/// Runs a batch so that nothing stops it and nothing is lost. Each source is read, its text file written, and
/// its results appended to the journal (flushed to disk) before the next starts; any failure of one source,
/// expected or not, becomes an entry in errors.jsonl. Sources already in the journal under the same image bytes,
/// model and options are reused instead of read again, so rerunning after a kill finishes the job. The reports
/// are streamed to temporary files in input order and renamed into place at the end, after the journal has been
/// rewritten to hold exactly this run's records and its summary.
/// </summary>
internal static class BatchRunner
{
    private const string InternalStage = "internal";

    public static BatchCounts Run(BatchJob job, BatchProgress progress, CancellationToken cancel)
    {
        ArgumentNullException.ThrowIfNull(job);
        ArgumentNullException.ThrowIfNull(progress);
        job.Options.Validate();
        var outDir = job.OutDir;
        Directory.CreateDirectory(outDir);
        using var runLock = RunLock.Acquire(outDir);
        AtomicFile.DeleteStaleTemps(outDir);

        var shard = job.Options.Shard;
        var inputErrorCount = job.InputErrors.Count;
        var mySources = job.Sources.Select(s => shard?.Contains(s.Source) ?? true).ToArray();
        var myInputErrors = job.InputErrors.Select(e => shard?.Contains(ErrorShardKey(e)) ?? true).ToArray();
        int total = mySources.Count(m => m), done = 0, reused = 0, lines = 0, flagged = 0, errors = 0;
        var cancelled = false;

        var journal = RunJournal.Open(outDir, job.Options.MaxJournalRecordBytes);
        try
        {
            using var compacted = new JournalWriter(outDir);
            using var reports = new RunReports(outDir);
            progress.Start(total, job.InputErrors.Where((_, i) => myInputErrors[i]).ToArray());

            for (var i = 0; i < inputErrorCount; i++)
            {
                if (!myInputErrors[i]) continue;
                reports.AddError(job.InputErrors[i]);
                compacted.Add(JournalRecord.ForError(i - inputErrorCount, job.InputErrors[i]));
                errors++;
            }

            for (var index = 0; index < job.Sources.Count; index++)
            {
                if (!mySources[index]) continue;
                if (cancel.IsCancellationRequested)
                {
                    cancelled = true;
                    break;
                }
                var source = job.Sources[index];
                try
                {
                    var (raw, results, wasReused) = ReadOrReuse(job, journal, source, index);
                    compacted.Add(raw);
                    reports.Add(results);
                    done++;
                    lines += results.Count;
                    flagged += results.Count(r => r.Flagged);
                    if (wasReused) { reused++; progress.Reused(results.Count); }
                    else progress.Read(results.Count);
                }
                catch (Exception ex)
                {
                    // Whatever went wrong, it went wrong for this source only: record it and go on.
                    var e = ex as InputException ?? new InputException(source.FullPath, InternalStage,
                        $"unexpected failure while reading this image ({ex.GetType().Name}: {ex.Message})", ex);
                    reports.AddError(e);
                    compacted.Add(JournalRecord.ForError(index, e));
                    errors++;
                    progress.Failed(e);
                    DeleteTranscript(outDir, source.Source);
                }
            }
            progress.Finish();

            var counts = new BatchCounts(total, done, reused, lines, flagged, errors, cancelled);
            var summary = RunSummary.Of(counts, job.Settings, job.StartedUtc, job.Clock.Elapsed.TotalSeconds,
                shard?.ToString(), job.OptionsHash, InputsHash(job.Sources), PeakMemoryMb());

            if (!cancelled)
            {
                // The journal becomes this run's record: its sources and errors in report order, then the summary.
                compacted.Add(new JournalRecord { Kind = JournalRecord.End, Summary = summary.ToJsonObject() });
                journal.Dispose();
                compacted.Commit();
            }
            reports.Complete(summary);
            return counts;
        }
        finally
        {
            journal.Dispose();
        }
    }

    private static (byte[] Raw, IReadOnlyList<LineResult> Lines, bool Reused) ReadOrReuse(
        BatchJob job, RunJournal journal, SourceImage source, int index)
    {
        var bytes = ImageLoader.ReadFile(source.FullPath, job.Recogniser.Limits);
        var sha = Convert.ToHexStringLower(SHA256.HashData(bytes));
        if (journal.TryGet(JournalRecord.ReuseKey(source.Source, sha, job.ModelId, job.OptionsHash), out var entry))
        {
            var raw = entry.Record.Order == index ? entry.Raw : JournalCodec.Encode(entry.Record with { Order = index });
            TranscriptFile.Write(job.OutDir, source.Source, entry.Record.Lines!, skipIfSame: true);
            return (raw, entry.Record.Lines!, true);
        }

        var results = job.Recogniser.Read(bytes, source.Source, source.FullPath);
        var fresh = JournalCodec.Encode(new JournalRecord
        {
            Kind = JournalRecord.Done, Order = index, Source = source.Source, ImageSha256 = sha,
            ModelId = job.ModelId, OptionsHash = job.OptionsHash, Lines = results,
        });
        // Report what the journal holds, not the in-memory objects, so a fresh run and a resumed one agree byte for byte.
        var stored = JournalCodec.TryDecode(fresh.AsSpan(0, fresh.Length - 1))
                     ?? throw new InvalidOperationException("the results could not be stored in the journal");
        // Text file first, then the journal: a kill between the two only means the source is read again.
        TranscriptFile.Write(job.OutDir, source.Source, stored.Lines!, skipIfSame: false);
        journal.Append(fresh);
        return (fresh, stored.Lines!, false);
    }

    /// <summary>Input errors have no source path of their own; shard them by what they say, so each lands in one shard.</summary>
    internal static string ErrorShardKey(InputException e) => e.Path + "\n" + e.Reason;

    /// <summary>Fingerprint of the full input list, so a merge can tell that its shards listed the same inputs.</summary>
    private static string InputsHash(IReadOnlyList<SourceImage> sources)
    {
        using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        foreach (var s in sources) hash.AppendData(Encoding.UTF8.GetBytes(s.Source + "\n"));
        return Convert.ToHexStringLower(hash.GetHashAndReset())[..16];
    }

    /// <summary>An earlier run's text for a source that now fails would not match this run's reports.</summary>
    private static void DeleteTranscript(string outDir, string source)
    {
        try
        {
            var path = TranscriptFile.FullPathFor(outDir, source);
            if (File.Exists(path)) File.Delete(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            // Best effort: the error entry already says the source failed.
        }
    }

    private static double PeakMemoryMb()
    {
        using var self = Process.GetCurrentProcess();
        return Math.Round(self.PeakWorkingSet64 / (1024.0 * 1024.0), 1);
    }
}
