using HandLine.Batch;
using HandLine.Batch.Journal;
using HandLine.Model;
using HandLine.Recognition;

namespace HandLine.Tests.Batch;

/// <summary>
/// Batching lines of several images through the network changes no result: a run (several images' lines per
/// network call) gives exactly what reading each image alone gives, and agrees with the path before batching
/// (libtorch's own LSTM, one image at a time) in every text and to float rounding in every confidence.
/// </summary>
public sealed class BatchedTranscriptionTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-batched-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void BatchedAndOneAtATimeTranscriptionAgree()
    {
        var modelPath = Path.Combine(TestPaths.RepoRoot, "models", "default.hlm");
        var scans = BatchTestSupport.DemoCopies(_dir, 6);
        var outDir = Path.Combine(_dir, "out");
        var run = TranscribeRun.Run([scans], new TranscribeOptions(outDir, modelPath));
        Assert.Equal(6, run.Sources);

        using var model = ModelFile.Load(modelPath);
        var recogniser = new Recogniser(model);
        var checkedLines = 0;
        // The journal keeps every figure at full precision (the reports round them to four places).
        foreach (var line in File.ReadLines(Path.Combine(outDir, RunJournal.FileName)))
        {
            var record = JournalCodec.TryDecode(System.Text.Encoding.UTF8.GetBytes(line));
            if (record is not { Kind: JournalRecord.Done }) continue;
            var bytes = File.ReadAllBytes(Path.Combine(scans, record.Source!));
            var alone = recogniser.Read(bytes, record.Source!, record.Source!);
            var prepared = recogniser.Prepare(bytes, record.Source!);
            var before = recogniser.Decode(record.Source!, prepared, model.Run(prepared.Select(p => p.Features).ToArray()));
            Assert.Equal(alone.Count, record.Lines!.Count);
            for (var i = 0; i < alone.Count; i++)
            {
                // One image alone through the same stages: the same bits.
                var batched = record.Lines[i];
                Assert.Equal(alone[i].Text, batched.Text);
                Assert.Equal(alone[i].Confidence, batched.Confidence);
                Assert.Equal(alone[i].Chars.Select(c => c.Confidence), batched.Chars.Select(c => c.Confidence));

                // The path before batching: the same text, confidences to float rounding (sums grouped differently).
                Assert.Equal(before[i].Text, batched.Text);
                Assert.InRange(Math.Abs(before[i].Confidence - batched.Confidence), 0, 1e-4);
                checkedLines++;
            }
        }
        Assert.Equal(6, checkedLines);
    }
}
