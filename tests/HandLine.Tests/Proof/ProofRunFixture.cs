using System.Text;
using System.Text.Json;

namespace HandLine.Tests.Proof;

/// <summary>
/// A finished run made up for tests: one line image per source in several folders (volumes), a lines.jsonl as
/// transcribe writes it, and the tiny PNG each source names, under a temp folder deleted on dispose.
/// </summary>
internal sealed class ProofRunFixture : IDisposable
{
    // A valid 1×1 grey PNG, so crops are real image files.
    private static readonly byte[] Png = Convert.FromBase64String(
        "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAAAAAA6fptVAAAACklEQVR4nGNgAAAAAgABSK+kcQAAAABJRU5ErkJggg==");

    public ProofRunFixture(IReadOnlyDictionary<string, int> linesPerFolder)
    {
        Root = Directory.CreateTempSubdirectory("hl-proof-").FullName;
        Images = Path.Combine(Root, "scans");
        Run = Path.Combine(Root, "run");
        Directory.CreateDirectory(Run);
        var jsonl = new StringBuilder();
        foreach (var (folder, count) in linesPerFolder)
        {
            Directory.CreateDirectory(Path.Combine(Images, folder));
            for (var i = 0; i < count; i++)
            {
                var source = $"{folder}/{i:000}.png";
                File.WriteAllBytes(Path.Combine(Images, source), Png);
                jsonl.Append(JsonSerializer.Serialize(new { source, line = 0, text = $"{folder} line {i}", confidence = 0.5 })).Append('\n');
            }
        }
        File.WriteAllText(Path.Combine(Run, "lines.jsonl"), jsonl.ToString());
    }

    public string Root { get; }

    public string Images { get; }

    public string Run { get; }

    public string Out(string name) => Path.Combine(Root, name);

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
