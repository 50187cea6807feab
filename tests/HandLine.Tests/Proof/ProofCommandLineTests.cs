using System.Text;
using System.Text.Json;
using HandLine.Tests.Batch;

namespace HandLine.Tests.Proof;

/// <summary>sample and score --max-cer / --plan / --html as a user runs them.</summary>
public sealed class ProofCommandLineTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-proof-cli-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private const string Truth = "Recd of Josiah Pelling for barley £1 4s 6d paid in"; // 50 characters

    /// <summary>A truth manifest and a run of <paramref name="errorsPerLine"/>.Length lines, line i with that many substitutions.</summary>
    private (string Truth, string Run) Case(string name, int[] errorsPerLine)
    {
        var folder = Directory.CreateDirectory(Path.Combine(_dir, name)).FullName;
        var run = Directory.CreateDirectory(Path.Combine(folder, "run")).FullName;
        var tsv = new StringBuilder();
        var jsonl = new StringBuilder();
        for (var i = 0; i < errorsPerLine.Length; i++)
        {
            var source = $"{(i % 2 == 0 ? "vol-a" : "vol-b")}/{i:000}.png";
            tsv.Append(source).Append('\t').Append(Truth).Append('\n');
            // Replace the first k characters with '#', which the truth never has: exactly k substitutions.
            var machine = new string('#', errorsPerLine[i]) + Truth[errorsPerLine[i]..];
            jsonl.Append(JsonSerializer.Serialize(new { source, line = 0, text = machine, confidence = 1 - errorsPerLine[i] / 50.0 })).Append('\n');
        }
        File.WriteAllText(Path.Combine(folder, "truth.tsv"), tsv.ToString());
        File.WriteAllText(Path.Combine(run, "lines.jsonl"), jsonl.ToString());
        return (Path.Combine(folder, "truth.tsv"), run);
    }

    [Fact]
    public void TheVerdictHasItsOwnExitCode()
    {
        // Pass: no errors at all, every resample's CER is 0 <= 5 %.
        var pass = Case("pass", new int[30]);
        Assert.Equal(0, CommandLineTests.Run("score", "--truth", pass.Truth, "--run", pass.Run, "--max-cer", "0.05").Code);
        // Fail: 10 of 50 characters wrong on every line, every resample's CER is 20 % > 5 %.
        var fail = Case("fail", Enumerable.Repeat(10, 30).ToArray());
        var failed = CommandLineTests.Run("score", "--truth", fail.Truth, "--run", fail.Run, "--max-cer", "0.05");
        Assert.Equal(3, failed.Code);
        Assert.Contains("Verdict: FAIL", failed.Out);
        // Inconclusive: half the lines with 5 errors in 50, the rest clean: CER 5 % and an interval around it.
        var unsure = Case("unsure", Enumerable.Range(0, 20).Select(i => i % 4 < 2 ? 5 : 0).ToArray());
        var inconclusive = CommandLineTests.Run("score", "--truth", unsure.Truth, "--run", unsure.Run, "--max-cer", "0.05", "--json");
        Assert.Equal(4, inconclusive.Code);
        using var json = JsonDocument.Parse(inconclusive.Out);
        var proof = json.RootElement.GetProperty("proof");
        Assert.Equal("inconclusive", proof.GetProperty("verdict").GetString());
        Assert.True(proof.GetProperty("cer_lower").GetDouble() < 0.05 && proof.GetProperty("cer_upper").GetDouble() > 0.05);
        // Without --max-cer the same scores exit 0, as before: the verdict codes only come with a threshold.
        Assert.Equal(0, CommandLineTests.Run("score", "--truth", fail.Truth, "--run", fail.Run).Code);
        // Bad arguments keep code 2.
        Assert.Equal(2, CommandLineTests.Run("score", "--truth", fail.Truth, "--run", fail.Run, "--max-cer", "-1").Code);
        Assert.Equal(2, CommandLineTests.Run("score", "--run", fail.Run).Code);
    }

    [Fact]
    public void PlanPrintsTheWorkedExample()
    {
        // 1.959964² × 0.05 × 0.95 / 0.01² = 1824.69 characters -> 1825; × 2.5 / 40 = 114.04 -> 115 lines (hand-computed).
        var (code, stdout, _) = CommandLineTests.Run("score", "--plan", "--half-width", "0.01", "--expected-cer", "0.05",
            "--line-chars", "40", "--design-effect", "2.5");
        Assert.Equal(0, code);
        Assert.Contains("1824.69 -> 1825", stdout);
        Assert.Contains("-> 115", stdout);
        Assert.Equal(2, CommandLineTests.Run("score", "--plan", "--half-width", "0.01").Code);
    }

    [Fact]
    public void SampleThenScoreTheKeyedSampleRoundTrips()
    {
        var run = Case("round", Enumerable.Range(0, 40).Select(i => i % 5).ToArray());
        var images = Path.GetDirectoryName(run.Truth)!;
        foreach (var line in File.ReadAllLines(run.Truth))
        {
            var path = Path.Combine(images, line.Split('\t')[0]);
            Directory.CreateDirectory(Path.GetDirectoryName(path)!);
            File.WriteAllBytes(path, [0x89, 0x50, 0x4E, 0x47]);
        }
        var proof = Path.Combine(_dir, "proof");
        var sampled = CommandLineTests.Run("sample", run.Run, "--count", "10", "--seed", "3", "--images", images, "--out", proof);
        Assert.Equal(0, sampled.Code);
        Assert.Contains("5 of     20 line(s)  vol-a", sampled.Out);
        // The keyer types the truth into the empty column.
        var keyed = File.ReadAllLines(Path.Combine(proof, "keying.tsv"))
            .Select(l => l.StartsWith('#') ? l : l.Split('\t')[0] + "\t" + Truth + "\t" + string.Join('\t', l.Split('\t')[2..]));
        File.WriteAllLines(Path.Combine(proof, "keyed.tsv"), keyed);
        var html = Path.Combine(proof, "report.html");
        var scored = CommandLineTests.Run("score", "--truth", Path.Combine(proof, "keyed.tsv"), "--run", Path.Combine(proof, "machine"),
            "--by", "folder", "--html", html, "--json");
        Assert.Equal(0, scored.Code);
        using var json = JsonDocument.Parse(scored.Out);
        Assert.Equal(10, json.RootElement.GetProperty("lines").GetInt32());
        var folders = json.RootElement.GetProperty("by")[0].GetProperty("groups").EnumerateArray().Select(g => g.GetProperty("value").GetString());
        Assert.Equal(["vol-a", "vol-b"], folders);
        Assert.True(File.Exists(html));
    }
}
