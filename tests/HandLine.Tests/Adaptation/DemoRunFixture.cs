using System.Text.Json.Nodes;
using HandLine.Batch;
using HandLine.Review;

namespace HandLine.Tests.Adaptation;

/// <summary>
/// The demo lines (fixtures/demo) read by the bundled model into a temp run, and a corrections file giving the true
/// text of every line but ledger-06, as an editor's export would; deleted on dispose.
/// </summary>
internal sealed class DemoRunFixture : IDisposable
{
    public const string Uncorrected = "ledger-06.png";

    public DemoRunFixture()
    {
        Root = Directory.CreateTempSubdirectory("hl-adapt-").FullName;
        Run = Path.Combine(Root, "run");
        TranscribeRun.Run([Path.Combine(Images, "lines.tsv")], new TranscribeOptions(Run, ModelPath), new BatchOptions { Progress = ProgressStyle.None }, null, default);
        var truth = HandLine.Formats.Manifest.Read(Path.Combine(Images, "lines.tsv")).Entries.ToDictionary(e => e.RelativePath, e => e.Text);
        var corrections = RunLines().Where(r => (string)r["source"]! != Uncorrected)
            .Select(r => new Correction((string)r["source"]!, 0, truth[(string)r["source"]!], (string)r["text"]!, false))
            .ToArray();
        Corrections = Path.Combine(Root, "corrections.tsv");
        File.WriteAllText(Corrections, CorrectionsFile.Write(corrections));
    }

    public static string Images => Path.Combine(TestPaths.Fixtures, "demo");

    public static string ModelPath => Path.Combine(TestPaths.RepoRoot, "models", "default.hlm");

    public static string Fonts => Path.Combine(TestPaths.Fixtures, "fonts");

    public string Root { get; }

    public string Run { get; }

    public string Corrections { get; }

    public string Out => Path.Combine(Root, "adapted");

    public IReadOnlyList<JsonObject> RunLines(string? dir = null) =>
        File.ReadAllLines(Path.Combine(dir ?? Run, "lines.jsonl")).Select(l => (JsonObject)JsonNode.Parse(l)!).ToArray();

    public void Dispose()
    {
        try
        {
            Directory.Delete(Root, recursive: true);
        }
        catch (IOException)
        {
            // A leftover temp folder is harmless.
        }
    }
}
