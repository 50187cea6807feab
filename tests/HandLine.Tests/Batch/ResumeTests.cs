using System.Text.Json;
using HandLine.Batch;
using HandLine.Batch.Journal;
using HandLine.Recognition;

namespace HandLine.Tests.Batch;

/// <summary>A run killed at any moment and run again ends with exactly the output of an uninterrupted run.</summary>
public sealed class ResumeTests : IDisposable
{
    private const int Images = 24;
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-resume-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private string[] Transcribe(string scans, string outDir, string model) =>
        ["transcribe", scans, "--out", outDir, "--model", model, "--threads", "1"];

    [Fact]
    public void KilledAtSeveralPointsThenResumedEqualsAnUninterruptedRun()
    {
        var scans = BatchTestSupport.DemoCopies(_dir, Images);
        var model = BatchTestSupport.SmallModel(_dir);
        var reference = Path.Combine(_dir, "reference");
        using (var whole = BatchTestSupport.Start(Transcribe(scans, reference, model)))
            Assert.Equal(0, whole.WaitForExit().Code);

        // SIGKILL once the journal holds this many records: early, middle, and after the last one (while the
        // reports are being rebuilt and renamed, or just after). Each kill hits the run the previous one left.
        var outDir = Path.Combine(_dir, "resumed");
        foreach (var records in new[] { 1, Images / 2, Images })
        {
            using var run = BatchTestSupport.Start(Transcribe(scans, outDir, model));
            var deadline = DateTime.UtcNow.AddSeconds(60);
            while (!run.HasExited && BatchTestSupport.JournalLines(outDir) < records && DateTime.UtcNow < deadline)
                Thread.Sleep(5);
            run.Signal(9);
            run.WaitForExit();
        }
        using (var last = BatchTestSupport.Start(Transcribe(scans, outDir, model)))
        {
            var (code, _, err) = last.WaitForExit();
            Assert.True(code == 0, err);
        }

        Assert.Equal(BatchTestSupport.Snapshot(reference), BatchTestSupport.Snapshot(outDir));
        Assert.Empty(BatchTestSupport.TempFiles(outDir));
        // The journal was rewritten to hold each source once, then the summary.
        Assert.Equal(Images + 1, BatchTestSupport.JournalLines(outDir));
    }

    [Fact]
    public void StoppedInsideANetworkBatchThenResumedEqualsAnUninterruptedRun()
    {
        // Enough images for several network windows (32 lines each); each stop lands inside one, so the
        // resumed run puts the rest of that window's images with other companions than the whole run did.
        const int images = 90;
        var scans = BatchTestSupport.DemoCopies(_dir, images);
        var model = BatchTestSupport.SmallModel(_dir);
        var reference = Path.Combine(_dir, "reference");
        using (var whole = BatchTestSupport.Start(Transcribe(scans, reference, model)))
            Assert.Equal(0, whole.WaitForExit().Code);

        var outDir = Path.Combine(_dir, "resumed");
        foreach (var (records, signal) in new[] { (5, 2), (45, 9) }) // Ctrl+C, then a kill
        {
            using var run = BatchTestSupport.Start(Transcribe(scans, outDir, model));
            var deadline = DateTime.UtcNow.AddSeconds(60);
            while (!run.HasExited && BatchTestSupport.JournalLines(outDir) < records && DateTime.UtcNow < deadline)
                Thread.Sleep(2);
            run.Signal(signal);
            run.WaitForExit();
        }
        using (var last = BatchTestSupport.Start(Transcribe(scans, outDir, model)))
        {
            var (code, _, err) = last.WaitForExit();
            Assert.True(code == 0, err);
        }

        Assert.Equal(BatchTestSupport.Snapshot(reference), BatchTestSupport.Snapshot(outDir));
        Assert.Equal(images + 1, BatchTestSupport.JournalLines(outDir));
    }

    [Fact]
    public void CtrlCFinishesTheCurrentImageWritesAConsistentSummaryAndExits130()
    {
        // Many more images than the run reads before the signal lands, so a loaded machine that delays the
        // signal cannot let the run finish first (it did once with 24).
        const int many = 200;
        var scans = BatchTestSupport.DemoCopies(_dir, many);
        var model = BatchTestSupport.SmallModel(_dir);
        var outDir = Path.Combine(_dir, "out");
        using var run = BatchTestSupport.Start(Transcribe(scans, outDir, model));
        var deadline = DateTime.UtcNow.AddSeconds(60);
        while (!run.HasExited && BatchTestSupport.JournalLines(outDir) < 2 && DateTime.UtcNow < deadline)
            Thread.Sleep(5);
        run.Signal(2);
        var (code, _, err) = run.WaitForExit();

        // 130 is also what a process killed by SIGINT reports; the closing message shows the command handled it.
        Assert.True(code == 130, $"exit code {code}\n{err}");
        Assert.Contains("stopped on request", err);
        using var summary = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "summary.json")));
        var s = summary.RootElement;
        Assert.True(s.GetProperty("cancelled").GetBoolean());
        var done = s.GetProperty("sources_done").GetInt32();
        Assert.InRange(done, 2, many - 1);
        Assert.Equal(done, File.ReadAllLines(Path.Combine(outDir, "lines.jsonl")).Length);
        Assert.Equal(done, Directory.EnumerateFiles(outDir, "*.txt", SearchOption.AllDirectories).Count());
        Assert.Empty(BatchTestSupport.TempFiles(outDir));
    }

    [Fact]
    public void ATornLastRecordIsIgnoredWhereverTheCutFalls()
    {
        var scans = BatchTestSupport.DemoCopies(_dir, 3);
        var options = new TranscribeOptions(Path.Combine(_dir, "out"), BatchTestSupport.SmallModel(_dir));
        var quiet = new BatchOptions { Progress = ProgressStyle.None };
        TranscribeRun.Run([scans], options, quiet, null, default);
        var expected = BatchTestSupport.Snapshot(options.OutDir);
        var journal = Path.Combine(options.OutDir, RunJournal.FileName);
        var whole = File.ReadAllBytes(journal);
        // The journal of a finished run: three source records, then the summary.
        var ends = whole.Select((b, i) => (b, i)).Where(x => x.b == '\n').Select(x => x.i + 1).ToArray();
        Assert.Equal(4, ends.Length);

        // Cut inside the third source record at a spread of offsets (every byte would be slow: each cut is a run).
        var start = ends[1];
        var cuts = new[] { start + 1, start + 5, start + 21, start + 22, (start + ends[2]) / 2, ends[2] - 1 };
        foreach (var cut in cuts)
        {
            File.WriteAllBytes(journal, whole[..cut]);
            var result = TranscribeRun.Run([scans], options, quiet, null, default);
            Assert.Equal(2, result.Reused);
            Assert.Equal(expected, BatchTestSupport.Snapshot(options.OutDir));
        }
    }

    [Fact]
    public void ADamagedRecordIsReadAgainAndOnlyMatchingResultsAreReused()
    {
        var scans = BatchTestSupport.DemoCopies(_dir, 4);
        var modelA = BatchTestSupport.SmallModel(_dir, seed: 1);
        var options = new TranscribeOptions(Path.Combine(_dir, "out"), modelA);
        var quiet = new BatchOptions { Progress = ProgressStyle.None };
        TranscribeRun.Run([scans], options, quiet, null, default);
        var expected = BatchTestSupport.Snapshot(options.OutDir);

        // One flipped byte inside the second record: its check fails, so that source alone is read again.
        var journal = Path.Combine(options.OutDir, RunJournal.FileName);
        var bytes = File.ReadAllBytes(journal);
        var second = Array.IndexOf(bytes, (byte)'\n') + 1;
        bytes[second + 40] ^= 0x20;
        File.WriteAllBytes(journal, bytes);
        Assert.Equal(3, TranscribeRun.Run([scans], options, quiet, null, default).Reused);
        Assert.Equal(expected, BatchTestSupport.Snapshot(options.OutDir));

        // A changed image is read again; the others are reused.
        var changed = Directory.EnumerateFiles(scans, "*.png", SearchOption.AllDirectories).Order(StringComparer.Ordinal).First();
        File.Copy(Path.Combine(BatchTestSupport.Demo, "register-02.png"), changed, overwrite: true);
        Assert.Equal(3, TranscribeRun.Run([scans], options, quiet, null, default).Reused);

        // Another model or another setting: nothing can be reused.
        Assert.Equal(0, TranscribeRun.Run([scans], options with { ModelPath = BatchTestSupport.SmallModel(_dir, seed: 2) }, quiet, null, default).Reused);
        Assert.Equal(0, TranscribeRun.Run([scans], options with { FlagBelow = 0.5 }, quiet, null, default).Reused);
        var forced = options with { FlagBelow = 0.5, Orientation = new OrientationOptions { Fixed = 0 } };
        Assert.Equal(0, TranscribeRun.Run([scans], forced, quiet, null, default).Reused);
        Assert.Equal(4, TranscribeRun.Run([scans], forced, quiet, null, default).Reused);
    }
}
