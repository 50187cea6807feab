using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using System.Reflection;
using HandLine.Batch;
using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;
using HandLine.Synthesis;

namespace HandLine.Cli.Commands;

/// <summary>
/// Measures how a batch's memory grows with its size: transcribes a small and a large folder of line images,
/// each in a fresh process, and prints each run's peak resident memory (from its summary.json) and their ratio.
/// The images are tiles cut from one line image and copied, so only the number of files changes.
/// </summary>
internal static class BenchBatchCommand
{
    /// <summary>Largest accepted peak-memory ratio, large run over small run (the project's target).</summary>
    private const double TargetRatio = 1.2;

    public static Command Create()
    {
        var small = new Option<int>("--small") { Description = "Images in the small run", DefaultValueFactory = _ => 100 };
        var large = new Option<int>("--large") { Description = "Images in the large run", DefaultValueFactory = _ => 10_000 };
        var image = new Option<string?>("--image") { Description = "Line image to cut tiles from (default: fixtures/demo/ledger-02.png if found, else a drawn line)" };
        var model = new Option<string?>("--model") { Description = "Model file (default: the bundled model; without one, an untrained network of the bundled model's shape)" };
        var work = new Option<string?>("--work") { Description = "Folder for the generated images and run outputs (default: a new temporary folder)" };
        var keep = new Option<bool>("--keep") { Description = "Keep the generated images and outputs" };
        var threads = new Option<int>("--threads") { Description = "CPU threads for the network in each run (0 = all cores)", DefaultValueFactory = _ => 1 };
        var command = new Command("bench-batch", "Peak memory of a small and a large transcription batch, and their ratio")
        {
            small, large, image, model, work, keep, threads,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var sizes = new[] { parse.GetValue(small), parse.GetValue(large) };
            if (sizes[0] < 1 || sizes[1] < sizes[0]) throw new ArgumentException("need 1 <= --small <= --large");
            var workDir = parse.GetValue(work) ?? Path.Combine(Path.GetTempPath(), "handline-bench-" + Guid.NewGuid().ToString("N")[..8]);
            Directory.CreateDirectory(workDir);
            try
            {
                var modelPath = ResolveModel(parse.GetValue(model), workDir, out var modelNote);
                var (tiles, imageNote) = Tiles(parse.GetValue(image));
                Console.WriteLine($"bench-batch: {modelNote}; {imageNote}; {parse.GetValue(threads)} network thread(s) of {Environment.ProcessorCount} cores; work folder {workDir}");

                var results = new List<(int Count, double Seconds, double PeakMb, long Lines)>();
                foreach (var count in sizes)
                {
                    var input = Path.Combine(workDir, $"in-{count}");
                    var outDir = Path.Combine(workDir, $"out-{count}");
                    WriteCopies(tiles, input, count);
                    if (Directory.Exists(outDir)) Directory.Delete(outDir, recursive: true);
                    var clock = Stopwatch.StartNew();
                    var code = RunSelf(["transcribe", input, "--out", outDir, "--model", modelPath, "--quiet",
                        "--threads", parse.GetValue(threads).ToString(CultureInfo.InvariantCulture)]);
                    var seconds = clock.Elapsed.TotalSeconds;
                    if (code is not (ExitCodes.Ok or ExitCodes.CompletedWithErrors))
                        throw new InvalidOperationException($"the {count}-image run failed with exit code {code}");
                    var summary = RunSummary.Read(Path.Combine(outDir, "summary.json"));
                    var (peak, lines) = (summary.PeakMemoryMb, summary.Lines);
                    results.Add((count, seconds, peak, lines));
                    Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"  {count,6} images: {lines,6} lines in {seconds,7:F1} s ({count / seconds,6:F1} images/s), peak RSS {peak,7:F1} MB"));
                }
                var ratio = results[1].PeakMb / results[0].PeakMb;
                var ok = ratio <= TargetRatio;
                Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"  peak RSS ratio {sizes[1]}/{sizes[0]} images: {ratio:F3} (target <= {TargetRatio:F1}): {(ok ? "within target" : "OVER TARGET")}"));
                return ok ? ExitCodes.Ok : ExitCodes.CompletedWithErrors;
            }
            finally
            {
                if (!parse.GetValue(keep) && parse.GetValue(work) is null) Directory.Delete(workDir, recursive: true);
            }
        }));
        return command;
    }

    private static string ResolveModel(string? given, string workDir, out string note)
    {
        if (given is not null)
        {
            note = $"model {given}";
            return given;
        }
        if (File.Exists(DefaultModel.PathBesideExecutable))
        {
            note = "bundled model";
            return DefaultModel.PathBesideExecutable;
        }
        // Same cost per line as the bundled model: the shape tools/train-default.sh trains.
        var path = Path.Combine(workDir, "untrained.hlm");
        using var model = LineModel.Create(CharacterSet.Default, new FeatureConfig(LineHeight: 32, FrameStride: 3),
            new NetworkConfig(Hidden: 192, Layers: 2, Convolution: true), 1);
        model.Save(path, null, null);
        note = "untrained network of the bundled model's shape (no bundled model in this build)";
        return path;
    }

    /// <summary>Up to 16 different tiles, each about four line-heights wide, cut from one line image.</summary>
    private static (IReadOnlyList<byte[]> Tiles, string Note) Tiles(string? imagePath)
    {
        imagePath ??= FindDemoLine();
        var line = imagePath is null ? DrawnLine() : ImageLoader.Load(imagePath, InputLimits.Default);
        var width = Math.Min(line.Width, 4 * line.Height);
        var span = line.Width - width;
        var tiles = new List<byte[]>();
        for (var i = 0; i < 16 && (i == 0 || span > 0); i++)
        {
            var x0 = span * i / 15;
            var pixels = new float[width * line.Height];
            for (var y = 0; y < line.Height; y++)
                Array.Copy(line.Pixels, y * line.Width + x0, pixels, y * width, width);
            tiles.Add(LineSynthesiser.EncodePng(new GrayImage(width, line.Height, pixels)));
        }
        var from = imagePath is null ? "a drawn line" : imagePath;
        return (tiles, $"{tiles.Count} tiles of {width}x{line.Height} px from {from}");
    }

    private static string? FindDemoLine()
    {
        foreach (var start in new[] { Directory.GetCurrentDirectory(), AppContext.BaseDirectory })
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                var candidate = Path.Combine(dir.FullName, "fixtures", "demo", "ledger-02.png");
                if (File.Exists(candidate)) return candidate;
            }
        return null;
    }

    /// <summary>A row of joined loops, like a line of small letters, when no demo image is at hand.</summary>
    private static GrayImage DrawnLine()
    {
        const int w = 240, h = 48;
        var p = new float[w * h];
        Array.Fill(p, 1f);
        for (var x = 8; x < w - 8; x++)
        {
            var t = (x - 8) / 9.0;
            var yc = 28 - 8 * Math.Sin(t * Math.PI) * (1 + 0.3 * Math.Sin(t / 2.3));
            for (var y = (int)yc - 1; y <= (int)yc + 1; y++)
                if (y >= 0 && y < h) p[y * w + x] = 0.1f;
        }
        return new GrayImage(w, h, p);
    }

    private static void WriteCopies(IReadOnlyList<byte[]> tiles, string folder, int count)
    {
        Directory.CreateDirectory(folder);
        for (var i = 0; i < count; i++)
        {
            var path = Path.Combine(folder, string.Create(CultureInfo.InvariantCulture, $"line-{i:D6}.png"));
            if (!File.Exists(path)) File.WriteAllBytes(path, tiles[i % tiles.Count]);
        }
    }

    /// <summary>Runs this same executable as a child process, so each batch's peak memory is its own.</summary>
    private static int RunSelf(IReadOnlyList<string> args)
    {
        var host = Environment.ProcessPath ?? throw new InvalidOperationException("cannot find this executable");
        var psi = new ProcessStartInfo(host) { UseShellExecute = false };
        if (Path.GetFileNameWithoutExtension(host) == "dotnet")
            psi.ArgumentList.Add(Assembly.GetEntryAssembly()!.Location);
        foreach (var a in args) psi.ArgumentList.Add(a);
        using var child = Process.Start(psi) ?? throw new InvalidOperationException("cannot start a child process");
        child.WaitForExit();
        return child.ExitCode;
    }
}
