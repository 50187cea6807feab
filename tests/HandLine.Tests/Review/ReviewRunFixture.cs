using System.Text;
using System.Text.Json;

namespace HandLine.Tests.Review;

/// <summary>
/// A finished run made up for review and correction tests: four one-line images (one with a hostile file name, one
/// line with a hostile transcript), a lines.jsonl and lines.csv as transcribe writes them (confidences, flags,
/// per-character confidences, alternatives) and each source's .txt, under a temp folder deleted on dispose.
/// </summary>
internal sealed class ReviewRunFixture : IDisposable
{
    // A valid 1×1 grey PNG, so images are real image files.
    private static readonly byte[] Png = Convert.FromBase64String(
        "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAAAAAA6fptVAAAACklEQVR4nGNgAAAAAgABSK+kcQAAAABJRU5ErkJggg==");

    public const string HostileSource = "ledger/<img src=x onerror=\"window.hacked=1\">'q'.png";
    public const string HostileText = "</textarea><script>window.hacked=1</script> \"Rent\" & 'tithe'";

    /// <summary>The run's lines: source, text, confidence, alternatives; flagged below 0.64 as transcribe does.</summary>
    public static readonly (string Source, string Text, double Confidence, string[] Alternatives)[] Lines =
    [
        ("ledger/002.png", "Paid to Wm Okes for barley", 0.31, ["Paid to Wm Oakes for barley", "Paid to Wm Okes for barly"]),
        (HostileSource, HostileText, 0.12, []),
        ("register/014.png", "Baptised Ann daughter of", 0.52, ["Baptised Anne daughter of"]),
        ("register/015.png", "Buried the same day", 0.93, []),
    ];

    public ReviewRunFixture()
    {
        Root = Directory.CreateTempSubdirectory("hl-review-").FullName;
        Images = Path.Combine(Root, "scans");
        Run = Path.Combine(Root, "run");
        Directory.CreateDirectory(Run);
        var jsonl = new StringBuilder();
        var csv = new StringBuilder("source,line,text,confidence,flagged,deskew_deg,slant_deg\n");
        foreach (var (source, text, confidence, alternatives) in Lines)
        {
            var image = Path.Combine(Images, source);
            Directory.CreateDirectory(Path.GetDirectoryName(image)!);
            File.WriteAllBytes(image, Png);
            var record = new Dictionary<string, object>
            {
                ["source"] = source,
                ["line"] = 0,
                ["text"] = text,
                ["confidence"] = confidence,
                ["flagged"] = confidence < 0.64,
                // Every third character doubtful, so the page has marks to show.
                ["chars"] = text.Select((c, i) => new Dictionary<string, object> { ["char"] = c.ToString(), ["confidence"] = i % 3 == 0 ? 0.4 : 0.99 }).ToArray(),
                ["deskew_deg"] = 0.5,
                ["slant_deg"] = -1.25,
            };
            if (alternatives.Length > 0)
                record["alternatives"] = new[] { text }.Concat(alternatives)
                    .Select((a, i) => new Dictionary<string, object> { ["text"] = a, ["score"] = -1.0 - i, ["share"] = 0.5 / (i + 1) }).ToArray();
            jsonl.Append(JsonSerializer.Serialize(record, RelaxedJson)).Append('\n');
            csv.Append(CsvField(source)).Append(",0,").Append(CsvField(text)).Append(',')
                .Append(confidence.ToString(System.Globalization.CultureInfo.InvariantCulture)).Append(',')
                .Append(confidence < 0.64 ? "true" : "false").Append(",0.5,-1.25\n");
            var txt = Path.Combine(Run, Path.ChangeExtension(source, ".txt"));
            Directory.CreateDirectory(Path.GetDirectoryName(txt)!);
            File.WriteAllText(txt, text + "\n");
        }
        File.WriteAllText(Path.Combine(Run, "lines.jsonl"), jsonl.ToString());
        File.WriteAllText(Path.Combine(Run, "lines.csv"), csv.ToString());
    }

    private static readonly JsonSerializerOptions RelaxedJson = new() { Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    private static string CsvField(string value) =>
        value.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + value.Replace("\"", "\"\"") + "\"" : value;

    public string Root { get; }

    public string Images { get; }

    public string Run { get; }

    public string File_(string name) => Path.Combine(Root, name);

    /// <summary>Every file of the run folder with its bytes, to show that nothing changed.</summary>
    public IReadOnlyDictionary<string, byte[]> Snapshot() =>
        Directory.EnumerateFiles(Run, "*", SearchOption.AllDirectories)
            .Where(f => Path.GetFileName(f) != ".handline.lock")
            .ToDictionary(f => Path.GetRelativePath(Run, f), File.ReadAllBytes);

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
