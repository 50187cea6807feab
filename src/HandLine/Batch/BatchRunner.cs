using System.Diagnostics;
using System.Runtime.ExceptionServices;
using System.Security.Cryptography;
using System.Text;
using HandLine.Batch.Journal;
using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>
/// Runs a batch so that nothing stops it and nothing is lost. Sources are read and prepared ahead on worker
/// threads (<see cref="ImageQueue"/>, bounded), their lines run through the network in windows of several images
/// and decoded in parallel; then, strictly in input order, each source's text file is written and its results
/// appended to the journal (flushed to disk) before the next source's are; any failure of one source,
/// expected or not, becomes an entry in errors.jsonl. Sources already in the journal under the same image bytes,
/// model and options are reused instead of read again, so rerunning after a kill finishes the job. The reports
/// are streamed to temporary files in input order and renamed into place at the end, after the journal has been
/// rewritten to hold exactly this run's records and its summary.
/// </summary>
internal static class BatchRunner
{
    private const string InternalStage = "internal";

    /// <summary>
    /// Lines gathered for one network call: two groups of <see cref="Recogniser.Lanes"/>, so one group's shorter
    /// lines do not wait for the longest (a rule of thumb: common practice, no source).
    /// </summary>
    private const int WindowLines = 2 * Recogniser.Lanes;

    /// <summary>Sources read and prepared ahead of the network at most (bounds memory; a page can hold many lines).</summary>
    private const int LookAhead = 48;

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

            var mine = Enumerable.Range(0, job.Sources.Count).Where(i => mySources[i]);
            var workers = Math.Max(1, Environment.ProcessorCount);
            using (var queue = new ImageQueue(job, journal, mine, LookAhead, workers))
            {
                // Window k+1 goes through the network while window k is decoded; k is written once both are done.
                (List<PendingImage> Window, Task Decoding)? inFlight = null;
                while (!queue.IsEmpty)
                {
                    if (cancel.IsCancellationRequested)
                    {
                        cancelled = true;
                        break;
                    }
                    var window = TakeWindow(queue);
                    RunNetwork(job.Recogniser, window);
                    if (inFlight is { } previous) WriteWindow(previous.Window, previous.Decoding);
                    inFlight = (window, Task.Run(() => Decode(job.Recogniser, window, workers)));
                }
                if (inFlight is { } last) WriteWindow(last.Window, last.Decoding);
            }

            void WriteWindow(List<PendingImage> window, Task decoding)
            {
                decoding.Wait();
                foreach (var pending in window) Write(pending);
            }

            // In input order, exactly as when each source went through every stage before the next started.
            void Write(PendingImage pending)
            {
                var source = pending.Source;
                try
                {
                    var (raw, results, wasReused) = Finish(job, journal, pending);
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
                    compacted.Add(JournalRecord.ForError(pending.Index, e));
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

    /// <summary>
    /// The next sources for the network: at least <see cref="WindowLines"/> lines (or the last sources), at most
    /// <see cref="LookAhead"/> sources. Which sources share a window changes no result (see
    /// <see cref="IImageRecogniser.Run"/>), so the windows need not match between runs.
    /// </summary>
    private static List<PendingImage> TakeWindow(ImageQueue queue)
    {
        var window = new List<PendingImage>();
        var lineCount = 0;
        while (!queue.IsEmpty && window.Count < LookAhead && (window.Count == 0 || lineCount < WindowLines))
        {
            var next = queue.Take();
            window.Add(next);
            lineCount += next.Lines?.Count ?? 0;
        }
        return window;
    }

    /// <summary>The network over the lines of every prepared source of the window at once.</summary>
    private static void RunNetwork(IImageRecogniser recogniser, List<PendingImage> window)
    {
        var ready = window.Where(p => p.Lines is not null && p.Error is null).ToArray();
        if (ready.Length == 0) return;
        try
        {
            var posteriors = recogniser.Run(ready.SelectMany(p => p.Lines!).ToArray());
            var at = 0;
            foreach (var p in ready)
            {
                p.Posteriors = posteriors.Skip(at).Take(p.Lines!.Count).ToArray();
                at += p.Lines!.Count;
            }
        }
        catch (Exception)
        {
            // Find the source that failed: each alone (a line's results do not depend on its companions).
            foreach (var p in ready)
            {
                try { p.Posteriors = recogniser.Run(p.Lines!); }
                catch (Exception e) { p.Error = e; }
            }
        }
    }

    private static void Decode(IImageRecogniser recogniser, List<PendingImage> window, int workers) =>
        Parallel.ForEach(window.Where(p => p.Posteriors is not null && p.Error is null),
            new ParallelOptions { MaxDegreeOfParallelism = workers },
            p =>
            {
                try
                {
                    p.Results = recogniser.Decode(p.Source.Source, p.Lines!, p.Posteriors!);
                }
                catch (Exception e)
                {
                    p.Error = e;
                }
                p.Lines = null; // the ink and features are not needed any more
                p.Posteriors = null;
            });

    /// <summary>The source's journal record and results: reused from the journal, or the fresh results stored.</summary>
    private static (byte[] Raw, IReadOnlyList<LineResult> Lines, bool Reused) Finish(BatchJob job, RunJournal journal, PendingImage pending)
    {
        if (pending.Error is not null) ExceptionDispatchInfo.Throw(pending.Error);
        var source = pending.Source;
        var index = pending.Index;
        var sha = pending.Sha256!;
        if (pending.InJournal && journal.TryGet(pending.ReuseKey!, out var entry))
        {
            var raw = entry.Record.Order == index ? entry.Raw : JournalCodec.Encode(entry.Record with { Order = index });
            TranscriptFile.Write(job.OutDir, source.Source, entry.Record.Lines!, skipIfSame: true);
            return (raw, entry.Record.Lines!, true);
        }

        // A record the journal indexed but can no longer give back: read the image now, on its own. Fresh results get
        // their second look here, on the thread that runs the network, while no window is in it.
        var results = pending.Results is { } first
            ? job.Recogniser.Settle(pending.Bytes!, source.Source, source.FullPath, first)
            : job.Recogniser.Read(pending.Bytes!, source.Source, source.FullPath);
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
