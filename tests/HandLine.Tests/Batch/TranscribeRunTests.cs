using System.Globalization;
using System.Text.Json;
using HandLine.Batch;
using HandLine.Formats;
using HandLine.Imaging;

namespace HandLine.Tests.Batch;

public sealed class TranscribeRunTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-run-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static string Demo => Path.Combine(TestPaths.Fixtures, "demo");

    /// <summary>A small untrained model with the default character set: the batch mechanics do not depend on accuracy.</summary>
    private string SmallModel() => BatchTestSupport.SmallModel(_dir);

    [Fact]
    public void WithoutAFlagThresholdTheModelsOwnIsUsed_AndAGivenOneWins()
    {
        // A model whose fit chose 0.2 (and one with no fit, which falls back to the default): each line is flagged
        // by the threshold the run reports in summary.json.
        var plain = SmallModel();
        var fitted = Path.Combine(_dir, "fitted.hlm");
        using (var model = HandLine.Model.ModelFile.Load(plain))
            model.SaveWithTemperature(fitted, 1.0, new HandLine.Model.TemperatureRecord("v.tsv", 10, 100, "beam 8", 0.1, 0.02,
                "2026-01-01T00:00:00Z", FlagBelow: 0.2, FlagCatches: 0.9, FlagFlags: 0.5));
        using (var loaded = HandLine.Model.ModelFile.Load(fitted))
            Assert.Equal(0.2, loaded.FittedFlagBelow);

        foreach (var (name, model, given, expected) in new[]
                 {
                     ("own", fitted, (double?)null, 0.2), ("given", fitted, 0.9, 0.9), ("none", plain, null, TranscribeOptions.DefaultFlagBelow),
                 })
        {
            var outDir = Path.Combine(_dir, name);
            TranscribeRun.Run([Path.Combine(Demo, "lines.tsv")], new TranscribeOptions(outDir, model, given));
            using var s = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "summary.json")));
            Assert.Equal(expected, s.RootElement.GetProperty("flag_below").GetDouble());
            foreach (var line in File.ReadAllLines(Path.Combine(outDir, "lines.jsonl")).Select(l => JsonDocument.Parse(l).RootElement))
                Assert.Equal(line.GetProperty("confidence").GetDouble() < expected, line.GetProperty("flagged").GetBoolean());
        }
    }

    [Fact]
    public void TranscribingTheDemoManifestWritesEveryOutput()
    {
        var outDir = Path.Combine(_dir, "out");
        var summary = TranscribeRun.Run([Path.Combine(Demo, "lines.tsv")], new TranscribeOptions(outDir, SmallModel()));

        var truth = Manifest.Read(Path.Combine(Demo, "lines.tsv")).Entries;
        Assert.Equal(truth.Count, summary.Sources);
        Assert.Equal(0, summary.Errors);
        foreach (var e in truth)
            Assert.True(File.Exists(Path.Combine(outDir, Path.ChangeExtension(e.RelativePath, ".txt"))), e.RelativePath);

        var lines = File.ReadAllLines(Path.Combine(outDir, "lines.jsonl")).Select(l => JsonDocument.Parse(l).RootElement).ToArray();
        Assert.Equal(truth.Select(e => e.RelativePath), lines.Select(l => l.GetProperty("source").GetString()));
        foreach (var l in lines)
        {
            Assert.Equal(0, l.GetProperty("line").GetInt32());
            var confidence = l.GetProperty("confidence").GetDouble();
            Assert.InRange(confidence, 0, 1);
            Assert.Equal(confidence < TranscribeOptions.DefaultFlagBelow, l.GetProperty("flagged").GetBoolean());
            var text = l.GetProperty("text").GetString()!;
            Assert.Equal(text, string.Concat(l.GetProperty("chars").EnumerateArray().Select(c => c.GetProperty("char").GetString())));
            Assert.True(l.TryGetProperty("deskew_deg", out _));
            // An untrained test model: any of the four readings may seem the best to it.
            Assert.Contains(l.GetProperty("rotation_deg").GetInt32(), QuarterTurn.Rotations);
        }

        var csv = File.ReadAllLines(Path.Combine(outDir, "lines.csv"));
        Assert.Equal("source,line,text,confidence,flagged,deskew_deg,slant_deg,rotation_deg", csv[0]);
        Assert.Equal(lines.Select(l => l.GetProperty("rotation_deg").GetInt32().ToString(CultureInfo.InvariantCulture)),
            csv.Skip(1).Select(row => row[(row.LastIndexOf(',') + 1)..]));
        Assert.Equal(truth.Count + 1, csv.Length);

        using var s = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "summary.json")));
        Assert.Equal(truth.Count, s.RootElement.GetProperty("sources").GetInt32());
        Assert.Equal(summary.ModelId, s.RootElement.GetProperty("model_id").GetString());
        Assert.True(s.RootElement.GetProperty("elapsed_seconds").GetDouble() > 0);
        Assert.Empty(File.ReadAllText(Path.Combine(outDir, "errors.jsonl")));
        Assert.Empty(Directory.EnumerateFiles(outDir, "*.tmp", SearchOption.AllDirectories));
    }

    [Fact]
    public void ABadImageIsReportedAndTheRestOfTheFolderIsTranscribed()
    {
        var input = Path.Combine(_dir, "in", "book");
        Directory.CreateDirectory(Path.Combine(input, "vol2"));
        File.Copy(Path.Combine(Demo, "ledger-01.png"), Path.Combine(input, "a.png"));
        File.Copy(Path.Combine(Demo, "register-01.png"), Path.Combine(input, "vol2", "b.png"));
        File.WriteAllBytes(Path.Combine(input, "broken.png"), [0x89, 0x50, 0x4e, 0x47, 1, 2, 3]);
        File.WriteAllBytes(Path.Combine(input, "empty.jpg"), []);
        var outDir = Path.Combine(_dir, "out");

        var summary = TranscribeRun.Run([input, Path.Combine(_dir, "missing.png")], new TranscribeOptions(outDir, SmallModel()));

        Assert.Equal(4, summary.Sources);
        Assert.Equal(3, summary.Errors);
        Assert.True(File.Exists(Path.Combine(outDir, "a.txt")));
        Assert.True(File.Exists(Path.Combine(outDir, "vol2", "b.txt")));
        var errors = File.ReadAllLines(Path.Combine(outDir, "errors.jsonl")).Select(l => JsonDocument.Parse(l).RootElement).ToArray();
        Assert.Equal(["missing.png", "broken.png", "empty.jpg"], errors.Select(e => Path.GetFileName(e.GetProperty("path").GetString())));
        Assert.All(errors, e => Assert.False(string.IsNullOrWhiteSpace(e.GetProperty("reason").GetString())));
        Assert.Equal(["a.png", "vol2/b.png"],
            File.ReadAllLines(Path.Combine(outDir, "lines.jsonl")).Select(l => JsonDocument.Parse(l).RootElement.GetProperty("source").GetString()));
    }

    [Fact]
    public void ABadModelFileFailsWithItsName()
    {
        var bad = Path.Combine(_dir, "bad.hlm");
        File.WriteAllText(bad, "not a model");
        var e = Assert.Throws<InputException>(() => TranscribeRun.Run([Demo], new TranscribeOptions(Path.Combine(_dir, "o"), bad)));
        Assert.Equal(bad, e.Path);
    }

    [Fact]
    public void CsvFieldsAreQuotedAndFormulasDefused()
    {
        Assert.Equal("\"a, b\"", RunReports.CsvField("a, b"));
        Assert.Equal("\"say \"\"hi\"\"\"", RunReports.CsvField("say \"hi\""));
        Assert.Equal("'=SUM(A1)", RunReports.CsvField("=SUM(A1)"));
        Assert.Equal("-3", RunReports.CsvField("-3"));
    }
}
