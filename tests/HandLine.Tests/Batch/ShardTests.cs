using System.Text.Json;
using HandLine.Batch;

namespace HandLine.Tests.Batch;

/// <summary>Shards split the inputs with no overlap, and merging them gives the unsharded run's output.</summary>
public sealed class ShardTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-shard-").FullName;
    private static readonly BatchOptions Quiet = new() { Progress = ProgressStyle.None };

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void EverySourceFallsInExactlyOneShardAndTheSharesAreRoughlyEven()
    {
        const int n = 5;
        var names = Enumerable.Range(0, 2000).Select(i => $"merrowby/vol-{i / 100}/folio-{i:D4}.png").ToArray();
        var counts = new int[n];
        foreach (var name in names)
        {
            var owners = Enumerable.Range(0, n).Where(k => new ShardSpec(k, n).Contains(name)).ToArray();
            Assert.Single(owners);
            Assert.Equal(owners[0], ShardSpec.ShardOf(name, n));
            counts[owners[0]]++;
        }
        // 2000 items into 5 bins: each expects 400, standard deviation about 18; 100 away is over five of them.
        Assert.All(counts, c => Assert.InRange(c, 300, 500));
    }

    [Theory]
    [InlineData("3/8", 3, 8)]
    [InlineData("0/1", 0, 1)]
    [InlineData(" 7 / 8 ", 7, 8)]
    public void ShardTextParses(string text, int index, int count)
    {
        var s = ShardSpec.Parse(text);
        Assert.Equal((index, count), (s.Index, s.Count));
    }

    [Theory]
    [InlineData("8/8")]
    [InlineData("1/0")]
    [InlineData("-1/4")]
    [InlineData("2")]
    [InlineData("a/b")]
    [InlineData("1/2/3")]
    public void BadShardTextIsRefusedWithItsText(string text) =>
        Assert.Contains(text, Assert.Throws<ArgumentException>(() => ShardSpec.Parse(text)).Message);

    [Fact]
    public void MergedShardRunsEqualTheUnshardedRun()
    {
        const int n = 3;
        var scans = BatchTestSupport.DemoCopies(_dir, 9);
        File.WriteAllBytes(Path.Combine(scans, "merrowby-ledger", "torn.png"), File.ReadAllBytes(Path.Combine(BatchTestSupport.Demo, "ledger-01.png"))[..500]);
        var manifest = Path.Combine(_dir, "extra.tsv");
        File.WriteAllText(manifest, "# Fennick Green\nmissing-1.png\tHannah Cressley\nno tab here\nmissing-2.png\tEliza Bunning\n");
        var inputs = new[] { scans, manifest, Path.Combine(_dir, "not-there") };
        var model = BatchTestSupport.SmallModel(_dir);
        var whole = Path.Combine(_dir, "whole");
        TranscribeRun.Run(inputs, new TranscribeOptions(whole, model), Quiet, null, default);

        var shardDirs = new List<string>();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        for (var k = 0; k < n; k++)
        {
            var dir = Path.Combine(_dir, $"shard-{k}");
            TranscribeRun.Run(inputs, new TranscribeOptions(dir, model), Quiet with { Shard = new ShardSpec(k, n) }, null, default);
            foreach (var source in Sources(dir))
                Assert.True(seen.Add(source), $"{source} is in two shards");
            shardDirs.Add(dir);
        }
        Assert.Equal(Sources(whole).Order(StringComparer.Ordinal), seen.Order(StringComparer.Ordinal));

        var merged = Path.Combine(_dir, "merged");
        shardDirs.Reverse(); // the order the folders are given in must not matter
        var result = RunMerge.Merge(shardDirs, merged);

        Assert.Empty(result.Conflicts);
        Assert.Equal(BatchTestSupport.Snapshot(whole), BatchTestSupport.Snapshot(merged));
        Assert.Empty(BatchTestSupport.TempFiles(merged));
        // Errors came out of every shard once: the torn image, the two missing images, the line without a tab and the missing input.
        Assert.Equal(5, File.ReadAllLines(Path.Combine(merged, "errors.jsonl")).Length);
    }

    [Fact]
    public void MergeReportsConflictsAndWritesNothing()
    {
        var scans = BatchTestSupport.DemoCopies(_dir, 6);
        var model = BatchTestSupport.SmallModel(_dir);
        string Shard(string name, int k, int n, string? modelPath = null, double flag = 0.8)
        {
            var dir = Path.Combine(_dir, name);
            TranscribeRun.Run([scans], new TranscribeOptions(dir, modelPath ?? model, flag), Quiet with { Shard = new ShardSpec(k, n) }, null, default);
            return dir;
        }
        var a0 = Shard("a0", 0, 2);
        var a1 = Shard("a1", 1, 2);
        var otherModel = Shard("b1", 1, 2, BatchTestSupport.SmallModel(_dir, seed: 9));
        var otherSetting = Shard("c1", 1, 2, flag: 0.5);
        var ofThree = Shard("d1", 1, 3);
        var unfinished = Path.Combine(_dir, "e1");
        Directory.CreateDirectory(unfinished);
        File.Copy(Path.Combine(a1, "run.journal"), Path.Combine(unfinished, "run.journal"));
        File.AppendAllText(Path.Combine(unfinished, "run.journal"), "hl1 0123"); // a later run was killed mid-record
        var outDir = Path.Combine(_dir, "merged");

        Assert.Contains(RunMerge.Merge([a0], outDir).Conflicts, c => c.Contains("missing shard 1/2"));
        Assert.Contains(RunMerge.Merge([a0, a1, a1], outDir).Conflicts, c => c.Contains("shard 1/2 is given twice"));
        Assert.Contains(RunMerge.Merge([a0, otherModel], outDir).Conflicts, c => c.Contains("'model_id'"));
        Assert.Contains(RunMerge.Merge([a0, otherSetting], outDir).Conflicts, c => c.Contains("'flag_below'"));
        Assert.Contains(RunMerge.Merge([a0, ofThree], outDir).Conflicts, c => c.Contains("split into 3"));
        Assert.Contains(RunMerge.Merge([a0, unfinished], outDir).Conflicts, c => c.Contains("did not finish"));
        Assert.Contains(RunMerge.Merge([a0, Path.Combine(_dir, "nowhere")], outDir).Conflicts, c => c.Contains("no such folder"));
        Assert.False(Directory.Exists(outDir));

        Assert.Empty(RunMerge.Merge([a1, a0], outDir).Conflicts);
        Assert.Throws<ArgumentException>(() => RunMerge.Merge([a0, a1], a0));
    }

    [Fact]
    public void ShardsFromSeparateProcessesAgreeWithTheInProcessHash()
    {
        // string.GetHashCode is randomised per process; a shard must not depend on which process computes it.
        var scans = BatchTestSupport.DemoCopies(_dir, 12);
        var outDir = Path.Combine(_dir, "shard-1-of-3");
        using var cli = BatchTestSupport.Start("transcribe", scans, "--out", outDir, "--model", BatchTestSupport.SmallModel(_dir),
            "--shard", "1/3", "--threads", "1", "--quiet");
        var (code, _, err) = cli.WaitForExit();

        Assert.True(code == 0, err);
        Assert.Equal("", err); // --quiet
        var (sources, _) = InputSet.Expand([scans]);
        Assert.Equal(sources.Select(s => s.Source).Where(s => ShardSpec.ShardOf(s, 3) == 1), Sources(outDir));
        using var summary = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "summary.json")));
        Assert.Equal("1/3", summary.RootElement.GetProperty("shard").GetString());
    }

    private static string[] Sources(string runDir) =>
        File.ReadAllLines(Path.Combine(runDir, "lines.jsonl"))
            .Select(l => JsonDocument.Parse(l).RootElement.GetProperty("source").GetString()!).Distinct().ToArray();
}
