using System.Text;
using System.Text.Json;
using HandLine.Batch;
using HandLine.Recognition;
using HandLine.Tests.Imaging;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace HandLine.Tests.Batch;

/// <summary>Every kind of bad input becomes one entry in errors.jsonl, and the rest of the batch completes.</summary>
[System.Runtime.Versioning.UnsupportedOSPlatform("windows")] // file permissions and links as on Linux, the supported system
public sealed class BadInputTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-bad-").FullName;

    public void Dispose()
    {
        var locked = Path.Combine(_dir, "scans", "locked.png");
        if (File.Exists(locked)) File.SetUnixFileMode(locked, UnixFileMode.UserRead | UnixFileMode.UserWrite);
        Directory.Delete(_dir, recursive: true);
    }

    [Fact]
    public void AFolderMixingGoodAndBadFilesIsTranscribedWithOneErrorPerBadFile()
    {
        var scans = Path.Combine(_dir, "scans");
        Directory.CreateDirectory(scans);
        string Put(string name, byte[] bytes)
        {
            var path = Path.Combine(scans, name);
            File.WriteAllBytes(path, bytes);
            return path;
        }
        var demo = BatchTestSupport.Demo;
        var goodPng = File.ReadAllBytes(Path.Combine(demo, "ledger-02.png"));
        Put("good-1.png", goodPng);
        Put("good-2.png", File.ReadAllBytes(Path.Combine(demo, "register-01.png")));
        Put("good-3.jpg", Encode(Image.Load<Rgba32>(goodPng), "jpeg"));

        // What each bad file is expected to give: (stage, words in the reason).
        var expected = new Dictionary<string, (string Stage, string Words)>(StringComparer.Ordinal)
        {
            [Put("empty.png", [])] = ("decode", "file is empty"),
            [Put("truncated.png", goodPng[..(goodPng.Length / 3)])] = ("decode", "cut short"),
            [Put("corrupt.jpg", CorruptJpeg(goodPng))] = ("decode", "the file is"),
            [Put("notes.png", Encoding.UTF8.GetBytes("Merrowby Hall rent roll, Lady Day 1851\n"))] = ("decode", "not a recognised image format"),
            [Put("bomb.png", PngBytes.WithClaimedSize(Encode(new Image<Rgba32>(1, 1), "png"), 30000, 30000))] = ("limits", "over the limit of 40000000"),
            [Put("blank.png", Encode(WhitePage(), "png"))] = ("normalise", "no ink"),
        };
        // Over the 64 MiB default byte limit without using the disk: a sparse file.
        var huge = Path.Combine(scans, "huge.tif");
        using (var f = File.Create(huge)) f.SetLength(65L * 1024 * 1024);
        expected[huge] = ("limits", "bytes, over the limit of");
        var dangling = Path.Combine(scans, "moved.png");
        File.CreateSymbolicLink(dangling, Path.Combine(_dir, "gone", "moved.png"));
        expected[dangling] = ("read", "file not found");

        // A file this account may not read. Root reads it anyway, so then it must simply be transcribed.
        var locked = Put("locked.png", goodPng);
        File.SetUnixFileMode(locked, UnixFileMode.None);
        var lockedIsReadable = CanRead(locked);
        if (!lockedIsReadable) expected[locked] = ("read", "permission denied");

        var manifestDir = Path.Combine(_dir, "register");
        Directory.CreateDirectory(manifestDir);
        File.Copy(Path.Combine(demo, "register-02.png"), Path.Combine(manifestDir, "entry-1.png"));
        var manifest = Path.Combine(manifestDir, "truth.tsv");
        var tsv = new MemoryStream();
        tsv.Write("entry-1.png\tBuried: Eliza Bunning, aged 74\n"u8);
        tsv.Write("entry-2.png\tBapt. "u8); tsv.Write([0xC3, 0x28]); tsv.Write("\n"u8); // line 2: bad UTF-8
        tsv.Write("entry-3.png Hannah Cressley\n"u8);                                   // line 3: no tab
        tsv.Write("../scans/good-1.png\tRecd of Josiah Pelling\n"u8);                   // line 4: escapes the folder
        tsv.Write(Encoding.UTF8.GetBytes($"{Path.Combine(scans, "good-2.png")}\tabsolute\n")); // line 5: absolute path
        File.WriteAllBytes(manifest, tsv.ToArray());
        var manifestErrors = new[] { ("line 2", "not valid UTF-8"), ("line 3", "no tab"), ("line 4", "outside the manifest's folder"), ("line 5", "absolute path") };

        var outDir = Path.Combine(_dir, "out");
        using var cli = BatchTestSupport.Start("transcribe", scans, manifest, "--out", outDir,
            "--model", BatchTestSupport.SmallModel(_dir), "--threads", "1");
        var (code, _, stderr) = cli.WaitForExit();

        Assert.True(code == 1, $"exit code {code} (documented: 1 = completed with errors)\n{stderr}");
        var errors = File.ReadAllLines(Path.Combine(outDir, "errors.jsonl")).Select(l => JsonDocument.Parse(l).RootElement).ToArray();
        var imageErrors = errors.Where(e => e.GetProperty("path").GetString() != manifest).ToArray();
        Assert.Equal(expected.Keys.Order(StringComparer.Ordinal), imageErrors.Select(e => e.GetProperty("path").GetString()!).Order(StringComparer.Ordinal));
        foreach (var e in imageErrors)
        {
            var (stage, words) = expected[e.GetProperty("path").GetString()!];
            Assert.True(stage == e.GetProperty("stage").GetString(), e.ToString());
            Assert.Contains(words, e.GetProperty("reason").GetString());
            Assert.Contains(Path.GetFileName(e.GetProperty("path").GetString()!), stderr); // also told on stderr
        }
        var fromManifest = errors.Where(e => e.GetProperty("path").GetString() == manifest)
            .Select(e => (Stage: e.GetProperty("stage").GetString(), Reason: e.GetProperty("reason").GetString()!)).ToArray();
        Assert.Equal(manifestErrors.Length, fromManifest.Length);
        foreach (var ((line, words), actual) in manifestErrors.Zip(fromManifest))
        {
            Assert.Equal("manifest", actual.Stage);
            Assert.StartsWith(line + ":", actual.Reason);
            Assert.Contains(words, actual.Reason);
            Assert.Contains($"{manifest}: {actual.Reason}", stderr); // also told on stderr
        }

        var good = new List<string> { "good-1.png", "good-2.png", "good-3.jpg", "entry-1.png" };
        if (lockedIsReadable) good.Add("locked.png");
        var transcribed = File.ReadAllLines(Path.Combine(outDir, "lines.jsonl"))
            .Select(l => JsonDocument.Parse(l).RootElement.GetProperty("source").GetString()!).Distinct().ToArray();
        Assert.Equal(good.Order(StringComparer.Ordinal), transcribed.Order(StringComparer.Ordinal));
        foreach (var source in good)
            Assert.True(File.Exists(TranscriptFile.FullPathFor(outDir, source)), source);
        Assert.False(File.Exists(Path.Combine(outDir, "truncated.txt")));
        using var summary = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "summary.json")));
        Assert.Equal(errors.Length, summary.RootElement.GetProperty("errors").GetInt32());
        Assert.Equal(good.Count, summary.RootElement.GetProperty("sources_done").GetInt32());
        Assert.Empty(BatchTestSupport.TempFiles(outDir));
    }

    [Fact]
    public void AnUnexpectedFailureOnOneSourceBecomesAnErrorEntryAndTheRestCompletes()
    {
        var scans = Path.Combine(_dir, "scans");
        Directory.CreateDirectory(scans);
        foreach (var name in new[] { "a.png", "b.png", "c.png" })
            File.Copy(Path.Combine(BatchTestSupport.Demo, "ledger-06.png"), Path.Combine(scans, name));
        var (sources, inputErrors) = InputSet.Expand([scans]);
        var outDir = Path.Combine(_dir, "out");
        var settings = new RunSettings(0.5, "model-x", "/models/x.hlm", "greedy", null, null, null, null, null, null, null);
        var job = new BatchJob(outDir, sources, inputErrors, new FailsOn("b.png"), settings, "options-y",
            new BatchOptions { Progress = ProgressStyle.None }, DateTime.UtcNow, System.Diagnostics.Stopwatch.StartNew());

        var counts = BatchRunner.Run(job, new BatchProgress(null, ProgressStyle.None, job.Options), default);

        Assert.Equal((3, 2, 1), (counts.Sources, counts.Done, counts.Errors));
        var error = JsonDocument.Parse(File.ReadAllLines(Path.Combine(outDir, "errors.jsonl")).Single()).RootElement;
        Assert.Equal(Path.Combine(scans, "b.png"), error.GetProperty("path").GetString());
        Assert.Equal("internal", error.GetProperty("stage").GetString());
        Assert.Contains("simulated fault", error.GetProperty("reason").GetString());
        Assert.Equal(["a.png", "c.png"], File.ReadAllLines(Path.Combine(outDir, "lines.jsonl"))
            .Select(l => JsonDocument.Parse(l).RootElement.GetProperty("source").GetString()));
    }

    [Fact]
    public void AFolderAnotherRunHoldsIsRefusedWithAClearError()
    {
        var outDir = Path.Combine(_dir, "out");
        Directory.CreateDirectory(outDir);
        using var held = new FileStream(Path.Combine(outDir, ".handline.lock"), FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);
        var e = Assert.Throws<InputException>(() => TranscribeRun.Run([BatchTestSupport.Demo], new TranscribeOptions(outDir, BatchTestSupport.SmallModel(_dir))));
        Assert.Equal("output", e.Stage);
        Assert.Contains("another handline process", e.Reason);
    }

    [Fact]
    public void TwoInputsThatWouldWriteTheSameTextFileAreReportedNotOverwritten()
    {
        var scans = Path.Combine(_dir, "scans");
        Directory.CreateDirectory(scans);
        var png = File.ReadAllBytes(Path.Combine(BatchTestSupport.Demo, "ledger-03.png"));
        File.WriteAllBytes(Path.Combine(scans, "folio-7.png"), png);
        File.WriteAllBytes(Path.Combine(scans, "folio-7.jpg"), Encode(Image.Load<Rgba32>(png), "jpeg"));

        var (sources, errors) = InputSet.Expand([scans]);

        Assert.Equal(["folio-7.jpg"], sources.Select(s => s.Source));
        Assert.Contains("folio-7.txt", Assert.Single(errors).Reason);
    }

    private static bool CanRead(string path)
    {
        try
        {
            using var _ = File.OpenRead(path);
            return true;
        }
        catch (UnauthorizedAccessException)
        {
            return false;
        }
    }

    /// <summary>A JPEG start-of-image marker and header followed by noise: a file cut and overwritten.</summary>
    private static byte[] CorruptJpeg(byte[] png)
    {
        var jpeg = Encode(Image.Load<Rgba32>(png), "jpeg");
        var rng = new Random(7);
        for (var i = jpeg.Length / 4; i < jpeg.Length; i++) jpeg[i] = (byte)rng.Next(256);
        return jpeg[..(jpeg.Length / 2)];
    }

    private static Image<Rgba32> WhitePage()
    {
        var image = new Image<Rgba32>(400, 60);
        image.ProcessPixelRows(a =>
        {
            for (var y = 0; y < a.Height; y++) a.GetRowSpan(y).Fill(new Rgba32(250, 248, 240, 255));
        });
        return image;
    }

    private static byte[] Encode(Image image, string format)
    {
        using var stream = new MemoryStream();
        if (format == "png") image.SaveAsPng(stream);
        else image.SaveAsJpeg(stream);
        image.Dispose();
        return stream.ToArray();
    }

    /// <summary>Reads every source as one fixed line, except one, where a later stage fails unexpectedly.</summary>
    private sealed class FailsOn(string failing) : IImageRecogniser
    {
        public global::HandLine.Imaging.InputLimits Limits => global::HandLine.Imaging.InputLimits.Default;

        public IReadOnlyList<LineResult> Read(byte[] imageBytes, string source, string nameForErrors) =>
            Decode(source, [], []);

        public IReadOnlyList<global::HandLine.Features.PreparedLine> Prepare(byte[] imageBytes, string nameForErrors) => [];

        public IReadOnlyList<global::HandLine.Model.Posteriors> Run(IReadOnlyList<global::HandLine.Features.PreparedLine> lines) => [];

        public IReadOnlyList<LineResult> Decode(string source, IReadOnlyList<global::HandLine.Features.PreparedLine> lines,
            IReadOnlyList<global::HandLine.Model.Posteriors> posteriors) =>
            source == failing
                ? throw new InvalidOperationException("simulated fault in a later stage")
                : [new LineResult(source, 0, "Folio 23", 0.9, false, [], 0, 0)];

        public IReadOnlyList<LineResult> Settle(byte[] imageBytes, string source, string nameForErrors, IReadOnlyList<LineResult> first) => first;
    }
}
