using System.Text.Json;
using HandLine.Language;

namespace HandLine.Tests.Batch;

/// <summary>'lm', 'words', 'transcribe' with beam search, and 'calibrate', run as a user would.</summary>
public sealed class DecodingCommandLineTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-dec-cli-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static string DemoTsv => Path.Combine(TestPaths.Fixtures, "demo", "lines.tsv");

    private static (int Code, string Out, string Err) Run(params string[] args) => CommandLineTests.Run(args);

    /// <summary>An untrained model: the plumbing does not depend on accuracy.</summary>
    private string SmallModel() => BatchTestSupport.SmallModel(_dir);

    [Fact]
    public void LmThenBeamTranscriptionWithLexiconAndLmThenCalibrate()
    {
        var lm = Path.Combine(_dir, "demo.hlc");
        var words = Path.Combine(_dir, "words.txt");
        var run = Path.Combine(_dir, "run");

        var built = Run("lm", "--text", DemoTsv, "--order", "3", "--out", lm);
        Assert.True(built.Code == 0, built.Err);
        Assert.Equal(3, CharNgramFile.Load(lm).Order);
        var listed = Run("words", "--text", DemoTsv, "--out", words);
        Assert.True(listed.Code == 0, listed.Err);

        var t = Run("transcribe", DemoTsv, "--out", run, "--model", SmallModel(), "--beam", "4", "--alternatives", "3",
            "--lexicon", words, "--lm", lm, "--lm-weight", "0.5", "--char-bonus", "0.2");
        Assert.True(t.Code == 0, t.Err);
        var lexicon = Lexicon.Load(words);
        var records = File.ReadAllLines(Path.Combine(run, "lines.jsonl")).Select(l => JsonDocument.Parse(l).RootElement).ToArray();
        Assert.Equal(8, records.Length);
        foreach (var r in records)
        {
            var alternatives = r.GetProperty("alternatives").EnumerateArray().ToArray();
            Assert.InRange(alternatives.Length, 1, 3);
            Assert.Equal(r.GetProperty("text").GetString(), alternatives[0].GetProperty("text").GetString());
            var scores = alternatives.Select(a => a.GetProperty("score").GetDouble()).ToArray();
            Assert.Equal(scores.OrderByDescending(s => s), scores);
            Assert.All(alternatives, a => Assert.InRange(a.GetProperty("share").GetDouble(), 0, 1));
            // Strict lexicon: every word written is listed, even from an untrained model.
            Assert.All(Lexicon.WordsIn(r.GetProperty("text").GetString()!), w => Assert.True(lexicon.Accepts(w), w));
        }
        using (var summary = JsonDocument.Parse(File.ReadAllText(Path.Combine(run, "summary.json"))))
        {
            Assert.Equal("beam", summary.RootElement.GetProperty("decoder").GetString());
            Assert.Equal("strict", summary.RootElement.GetProperty("lexicon_mode").GetString());
        }

        var c = Run("calibrate", "--truth", DemoTsv, "--run", run, "--catch", "0.9");
        Assert.True(c.Code == 0, c.Err);
        Assert.Contains("Expected calibration error (characters):", c.Out);
        Assert.Contains("0.90-1.00", c.Out);
        Assert.Matches(@"To catch 90% of the \d+ character errors: --flag-below [0-9.]+", c.Out);
    }

    [Fact]
    public void TuneDecodeAndBenchDecodePrintTheirFigures()
    {
        var model = SmallModel();
        var tune = Run("tune-decode", DemoTsv, "--model", model, "--count", "1", "--beams", "1,2");
        Assert.True(tune.Code == 0, tune.Err);
        Assert.Matches(@"greedy +[0-9.]+ +[0-9.]+ +[0-9.]+", tune.Out);
        Assert.Matches(@"beam 2 +[0-9.]+ +[0-9.]+ +[0-9.]+", tune.Out);

        var bench = Run("bench-decode", DemoTsv, "--model", model, "--count", "1", "--beam", "2");
        Assert.True(bench.Code == 0, bench.Err);
        Assert.Matches(@"decode/model ratio: [0-9.]+", bench.Out);
    }

    [Fact]
    public void BadDecodingInputsFailWithTheFileAndLine()
    {
        var words = Path.Combine(_dir, "words.txt");
        File.WriteAllText(words, "barley\nbush.\n");
        var (code, _, err) = Run("transcribe", DemoTsv, "--out", Path.Combine(_dir, "o"), "--model", SmallModel(), "--lexicon", words);
        Assert.Equal(2, code);
        Assert.Contains("words.txt: line 2:", err);

        var greedyWithLm = Run("transcribe", DemoTsv, "--out", Path.Combine(_dir, "o"), "--beam", "1", "--lexicon", words);
        Assert.Equal(2, greedyWithLm.Code);
        Assert.Contains("beam", greedyWithLm.Err);
    }
}
