using System.Text.Json.Nodes;
using HandLine.Batch;
using HandLine.Batch.Journal;
using HandLine.Features;
using HandLine.Model;

namespace HandLine.Tests.Batch;

/// <summary>Shared pieces of the batch tests: a fast model, demo copies, the CLI as a child process, output snapshots.</summary>
internal static class BatchTestSupport
{
    public static string Demo => Path.Combine(TestPaths.Fixtures, "demo");

    public static readonly string[] DemoLines = Directory.GetFiles(Demo, "*.png").Select(Path.GetFileName).OfType<string>().Order(StringComparer.Ordinal).ToArray();

    /// <summary>A small untrained model with the default character set: the batch mechanics do not depend on accuracy.</summary>
    public static string SmallModel(string dir, int seed = 1)
    {
        var path = Path.Combine(dir, $"small-{seed}.hlm");
        using var model = LineModel.Create(CharacterSet.Default, new FeatureConfig(LineHeight: 24, FrameStride: 3), new NetworkConfig(8, 1), seed);
        model.Save(path, null, null);
        return path;
    }

    /// <summary><paramref name="count"/> copies of the demo lines, in two subfolders so relative paths carry folders too.</summary>
    public static string DemoCopies(string dir, int count)
    {
        var root = Path.Combine(dir, "scans");
        for (var i = 0; i < count; i++)
        {
            var folder = Path.Combine(root, i % 2 == 0 ? "merrowby-ledger" : "fennick-register");
            Directory.CreateDirectory(folder);
            File.Copy(Path.Combine(Demo, DemoLines[i % DemoLines.Length]), Path.Combine(folder, $"folio-{i:D3}.png"));
        }
        return root;
    }

    /// <summary>Starts <c>handline ARGS</c> with its output captured; the caller waits or kills.</summary>
    public static CliProcess Start(params string[] args) => new(args);

    /// <summary>The files a run promises, as bytes, with summary.json stripped of its measurement fields.</summary>
    public static SortedDictionary<string, string> Snapshot(string outDir)
    {
        var files = new SortedDictionary<string, string>(StringComparer.Ordinal);
        foreach (var name in new[] { "lines.jsonl", "lines.csv", "errors.jsonl" })
            files[name] = File.ReadAllText(Path.Combine(outDir, name));
        foreach (var txt in Directory.EnumerateFiles(outDir, "*.txt", SearchOption.AllDirectories))
            files[Path.GetRelativePath(outDir, txt).Replace('\\', '/')] = File.ReadAllText(txt);
        var summary = JsonNode.Parse(File.ReadAllText(Path.Combine(outDir, "summary.json")))!.AsObject();
        foreach (var field in RunSummary.Measurements) summary.Remove(field);
        summary.Remove("model_path");
        files["summary.json (measurements removed)"] = summary.ToJsonString();
        return files;
    }

    public static int JournalLines(string outDir)
    {
        var path = Path.Combine(outDir, RunJournal.FileName);
        try
        {
            using var s = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite | FileShare.Delete);
            var count = 0;
            int b;
            while ((b = s.ReadByte()) >= 0) if (b == '\n') count++;
            return count;
        }
        catch (Exception e) when (e is FileNotFoundException or DirectoryNotFoundException)
        {
            return 0;
        }
    }

    /// <summary>Leftovers that must never survive a run: temporary files.</summary>
    public static string[] TempFiles(string outDir) =>
        Directory.EnumerateFiles(outDir, "*", SearchOption.AllDirectories).Where(f => AtomicFile.IsTempName(Path.GetFileName(f))).ToArray();
}
