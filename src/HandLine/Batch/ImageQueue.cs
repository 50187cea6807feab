using System.Security.Cryptography;
using HandLine.Batch.Journal;
using HandLine.Imaging;

namespace HandLine.Batch;

/// <summary>
/// The runner's look-ahead: reads, hashes and prepares the next sources on a few worker threads while the
/// network runs, and hands them back strictly in input order. At most <c>depth</c> sources are in flight, so
/// memory does not grow with the size of the batch. Sources the journal already holds are read and hashed but
/// not prepared. Nothing here throws: a failure is kept in the source's <see cref="PendingImage.Error"/>.
/// </summary>
internal sealed class ImageQueue : IDisposable
{
    private readonly Queue<Task<PendingImage>> _ahead = new();
    private readonly IEnumerator<int> _next;
    private readonly BatchJob _job;
    private readonly RunJournal _journal;
    private readonly TaskFactory _workers;
    private readonly int _depth;
    private volatile bool _stopping;

    public ImageQueue(BatchJob job, RunJournal journal, IEnumerable<int> indices, int depth, int workers)
    {
        _job = job;
        _journal = journal;
        _next = indices.GetEnumerator();
        _depth = depth;
        // Tasks start in input order and at most `workers` run at once; the rest wait their turn.
        _workers = new TaskFactory(new ConcurrentExclusiveSchedulerPair(TaskScheduler.Default, workers).ConcurrentScheduler);
        Fill();
    }

    public bool IsEmpty => _ahead.Count == 0;

    /// <summary>The next source in input order, waiting for it if it is not ready.</summary>
    public PendingImage Take()
    {
        var next = _ahead.Dequeue().Result;
        Fill();
        return next;
    }

    private void Fill()
    {
        while (_ahead.Count < _depth && _next.MoveNext())
        {
            var index = _next.Current;
            _ahead.Enqueue(_workers.StartNew(() => Prepare(index)));
        }
    }

    private PendingImage Prepare(int index)
    {
        var pending = new PendingImage(index, _job.Sources[index]);
        if (_stopping) return pending; // the run stopped: nobody will take this source
        try
        {
            var bytes = ImageLoader.ReadFile(pending.Source.FullPath, _job.Recogniser.Limits);
            pending.Sha256 = Convert.ToHexStringLower(SHA256.HashData(bytes));
            pending.ReuseKey = JournalRecord.ReuseKey(pending.Source.Source, pending.Sha256, _job.ModelId, _job.OptionsHash);
            // Kept for a record the journal cannot give back, and for a second look at an unsure reading.
            pending.Bytes = bytes;
            if (_journal.Holds(pending.ReuseKey))
            {
                pending.InJournal = true;
            }
            else
            {
                pending.Lines = _job.Recogniser.Prepare(bytes, pending.Source.FullPath);
            }
        }
        catch (Exception e)
        {
            pending.Error = e;
        }
        return pending;
    }

    /// <summary>
    /// After a stop: sources not started are skipped, and the ones being prepared are waited for, so no worker
    /// outlives the run.
    /// </summary>
    public void Dispose()
    {
        _stopping = true;
        while (_ahead.Count > 0) _ahead.Dequeue().Wait();
        _next.Dispose();
    }
}
