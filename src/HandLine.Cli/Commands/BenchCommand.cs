using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using System.Text.Json;
using System.Text.Json.Nodes;
using HandLine.Batch;
using HandLine.Decoding;
using HandLine.Model;
using HandLine.Recognition;
using static TorchSharp.torch;

namespace HandLine.Cli.Commands;

/// <summary>
/// Every speed figure of the CPU path in one run, on the same generated lines: the imaging stage, the network at
/// several batch sizes, decoding, a whole `transcribe` run of the lines as image files, the naive path (one image
/// at a time, each stage after the other), the machine's matrix-multiply ceiling at the model's shapes and the
/// network's operations per line, so the share of the ceiling reached can be read off. Figures from one run are
/// comparable with each other; absolute numbers move with whatever else the machine is doing.
/// </summary>
internal static class BenchCommand
{
    private static readonly int[] BatchSizes = [1, 8, 16, 32];

    public static Command Create()
    {
        var model = new Option<string?>("--model") { Description = "Model file (default: the bundled model)" };
        var lines = new Option<int>("--lines") { Description = "Generated line images to measure on", DefaultValueFactory = _ => 256 };
        var json = new Option<bool>("--json") { Description = "Print one JSON object instead of the table" };
        var threads = new Option<int>("--threads")
        {
            Description = "CPU threads for the network and the transcription run (default: as transcribe, half the cores, at least 1; 0 = all cores)",
            DefaultValueFactory = _ => BatchCommandOptions.DefaultThreads,
        };
        lines.Validators.Add(r =>
        {
            if (r.GetValueOrDefault<int>() is < 8 or > 100_000) r.AddError("--lines must be between 8 and 100000");
        });
        threads.Validators.Add(r =>
        {
            if (r.GetValueOrDefault<int>() is < 0 or > 1024) r.AddError("--threads must be between 0 and 1024");
        });
        var command = new Command("bench", "Measure the CPU path's speed stage by stage, end to end and against the machine's matrix-multiply ceiling")
        {
            model, lines, json, threads,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var threadCount = parse.GetValue(threads) is var t and > 0 ? t : Environment.ProcessorCount;
            TorchRuntime.SetThreads(threadCount);
            var modelPath = parse.GetValue(model) ?? DefaultModel.PathBesideExecutable;
            var figures = Measure(modelPath, parse.GetValue(lines), threadCount);
            Console.WriteLine(parse.GetValue(json)
                ? figures.ToJsonString(new JsonSerializerOptions { WriteIndented = true })
                : Table(figures));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static JsonObject Measure(string modelPath, int count, int threads)
    {
        var load = File.Exists("/proc/loadavg") ? File.ReadAllText("/proc/loadavg").Split(' ')[0] : "unknown";
        using var lineModel = ModelFile.Load(modelPath);
        var recogniser = new Recogniser(lineModel);
        var (images, note) = BenchLines.Make(count, seed: 18);
        var work = Directory.CreateTempSubdirectory("handline-bench-").FullName;
        try
        {
            // (a) imaging: bytes to prepared lines, one image after another on one thread.
            recogniser.Prepare(images[0], "warm-up");
            var cpu = ProcessorTime();
            var clock = Stopwatch.StartNew();
            var prepared = images.Select((b, i) => recogniser.Prepare(b, $"line {i}")).ToArray();
            var imagingSeconds = clock.Elapsed.TotalSeconds;
            var imagingCpu = ProcessorTime() - cpu;
            var lines = prepared.SelectMany(p => p).ToArray();
            var meanFrames = lines.Average(l => l.Features.Frames);
            var meanWidth = lines.Average(l => l.Line.Ink.Width);

            // (b) the network at each batch size, as transcribe batches it.
            var forward = new JsonObject();
            var best = (Batch: 0, LinesPerSecond: 0.0, Posteriors: (IReadOnlyList<Posteriors>)[], Cpu: 0.0);
            foreach (var size in BatchSizes)
            {
                recogniser.RunInLanes(lines.Take(size).ToArray(), size); // warm-up at this shape
                cpu = ProcessorTime();
                clock.Restart();
                var posteriors = recogniser.RunInLanes(lines, size);
                var rate = lines.Length / clock.Elapsed.TotalSeconds;
                forward[size.ToString(CultureInfo.InvariantCulture)] = Round(rate);
                if (rate > best.LinesPerSecond) best = (size, rate, posteriors, ProcessorTime() - cpu);
            }

            // How the network's speed goes with line width: the lines in three equal groups by frame count.
            var byWidth = new JsonArray();
            var sorted = lines.OrderBy(l => l.Features.Frames).ToArray();
            for (var third = 0; third < 3; third++)
            {
                var part = sorted.Skip(third * sorted.Length / 3).Take((third + 1) * sorted.Length / 3 - third * sorted.Length / 3).ToArray();
                if (part.Length == 0) continue;
                clock.Restart();
                recogniser.RunInLanes(part, best.Batch);
                byWidth.Add(new JsonObject
                {
                    ["mean_frames"] = Round(part.Average(l => l.Features.Frames)),
                    ["lines_per_s"] = Round(part.Length / clock.Elapsed.TotalSeconds),
                });
            }

            // (c) decoding the best batch's posteriors, greedy and at the default beam.
            var greedy = DecodeRate(new LineDecoder(lineModel.Charset, DecodingOptions.Greedy), best.Posteriors);
            var beam = DecodeRate(new LineDecoder(lineModel.Charset, new DecodingOptions()), best.Posteriors);

            // (d) end to end: the same lines as image files through a real transcription run.
            var input = Path.Combine(work, "lines");
            BenchLines.Write(images, input);
            cpu = ProcessorTime();
            clock.Restart();
            var run = TranscribeRun.Run([input], new TranscribeOptions(Path.Combine(work, "out"), modelPath), TextWriter.Null);
            var endToEnd = run.Lines / clock.Elapsed.TotalSeconds;
            var endToEndCpu = ProcessorTime() - cpu;

            // The naive path: one image at a time, read, prepared, the network on its lines alone, decoded.
            var naive = Naive(recogniser, input);

            // (e) the ceiling and (f) the network's work per line.
            var shapes = MatmulShapes(lineModel, best.Batch);
            var ceilings = new JsonObject();
            var ceiling = 0.0;
            foreach (var (name, m, k, n) in shapes)
            {
                var g = MatmulGflops(m, k, n);
                ceilings[name] = Round(g);
                ceiling = Math.Max(ceiling, g);
            }
            var flopsPerLine = NetworkCost.FlopsPerFrame(lineModel) * meanFrames;
            var reached = best.LinesPerSecond * flopsPerLine / 1e9;

            using var self = Process.GetCurrentProcess();
            return new JsonObject
            {
                ["lines"] = lines.Length,
                ["images"] = images.Count,
                ["source"] = note,
                ["mean_width_px"] = Round(meanWidth),
                ["mean_frames"] = Round(meanFrames),
                ["threads"] = threads,
                ["cores"] = Environment.ProcessorCount,
                ["load_average_1min"] = load,
                ["model"] = lineModel.Id,
                ["imaging_lines_per_s"] = Round(lines.Length / imagingSeconds),
                ["imaging_cpu_ms_per_line"] = Round(1000 * imagingCpu / lines.Length, 2),
                ["model_lines_per_s_by_batch"] = forward,
                ["model_best_batch"] = best.Batch,
                ["model_lines_per_s_by_width"] = byWidth,
                ["model_lines_per_s"] = Round(best.LinesPerSecond),
                ["model_cpu_ms_per_line"] = Round(1000 * best.Cpu / lines.Length, 2),
                ["greedy_lines_per_s"] = Round(greedy),
                ["beam_lines_per_s"] = Round(beam),
                ["decode_share"] = Round(best.LinesPerSecond / beam, 4),
                ["end_to_end_lines_per_s"] = Round(endToEnd),
                ["end_to_end_share_of_model"] = Round(endToEnd / best.LinesPerSecond, 4),
                ["end_to_end_cpu_ms_per_line"] = Round(1000 * endToEndCpu / run.Lines, 2),
                ["naive_lines_per_s"] = Round(naive),
                ["speedup_over_naive"] = Round(endToEnd / naive, 3),
                ["matmul_gflops_by_shape"] = ceilings,
                ["matmul_gflops"] = Round(ceiling),
                ["network_mflop_per_line"] = Round(flopsPerLine / 1e6),
                ["model_gflops"] = Round(reached),
                ["model_ceiling_share"] = Round(reached / ceiling, 4),
                ["peak_memory_mb"] = Round(self.PeakWorkingSet64 / (1024.0 * 1024.0)),
            };
        }
        finally
        {
            Directory.Delete(work, recursive: true);
        }
    }

    private static double DecodeRate(LineDecoder decoder, IReadOnlyList<Posteriors> posteriors)
    {
        foreach (var p in posteriors.Take(10)) decoder.Decode(p);
        var clock = Stopwatch.StartNew();
        foreach (var p in posteriors) decoder.Decode(p);
        return posteriors.Count / clock.Elapsed.TotalSeconds;
    }

    /// <summary>
    /// Each image read, prepared, run through the network alone (libtorch's own LSTM, one batch of the image's
    /// lines: the path transcribe took before issue 18) and decoded before the next starts.
    /// </summary>
    private static double Naive(Recogniser recogniser, string folder)
    {
        var files = Directory.GetFiles(folder, "*.png").Order(StringComparer.Ordinal).ToArray();
        var lines = 0;
        Read(File.ReadAllBytes(files[0]), "warm-up");
        var clock = Stopwatch.StartNew();
        foreach (var f in files) lines += Read(File.ReadAllBytes(f), f);
        return lines / clock.Elapsed.TotalSeconds;

        int Read(byte[] bytes, string name)
        {
            var prepared = recogniser.Prepare(bytes, name);
            var posteriors = recogniser.Model.Run(prepared.Select(p => p.Features).ToArray());
            return recogniser.Decode(name, prepared, posteriors).Count;
        }
    }

    /// <summary>
    /// The matrix products that carry the network's work: each LSTM layer's input projection (all of a batch's
    /// frames at once, both directions' gates side by side), its recurrent step (one row per line of the batch)
    /// and the output layer.
    /// </summary>
    private static IReadOnlyList<(string Name, int M, int K, int N)> MatmulShapes(LineModel model, int batch)
    {
        var net = model.Header.Network;
        var input = net.Convolution ? ColumnConvolution.OutputSize(model.Features.LineHeight) : model.Features.FrameDimension;
        const int frames = 2048;
        return
        [
            ($"input_projection_{frames}x{input}x{8 * net.Hidden}", frames, input, 8 * net.Hidden),
            ($"recurrent_step_{batch}x{net.Hidden}x{4 * net.Hidden}", batch, net.Hidden, 4 * net.Hidden),
        ];
    }

    /// <summary>GFLOP/s of a TorchSharp float32 matrix product [m, k] × [k, n], on libtorch's current threads.</summary>
    private static double MatmulGflops(int m, int k, int n)
    {
        using var a = randn(m, k);
        using var b = randn(k, n);
        using (var warm = a.mm(b)) { }
        var flops = 2.0 * m * k * n;
        var reps = Math.Max(3, (int)(2e9 / flops)); // about two billion operations
        var clock = Stopwatch.StartNew();
        for (var i = 0; i < reps; i++)
        {
            using var c = a.mm(b);
        }
        return reps * flops / clock.Elapsed.TotalSeconds / 1e9;
    }

    private static double Round(double v, int digits = 1) => Math.Round(v, digits);

    /// <summary>
    /// Seconds of CPU this process has used, on all its threads. On a machine shared with other work, wall-clock
    /// rates move with the load; CPU time per line moves much less, so it compares builds measured at different loads.
    /// </summary>
    private static double ProcessorTime()
    {
        using var self = Process.GetCurrentProcess();
        return self.TotalProcessorTime.TotalSeconds;
    }

    private static string Table(JsonObject f)
    {
        var ci = CultureInfo.InvariantCulture;
        var w = new StringWriter(ci);
        w.WriteLine($"bench: {f["lines"]} lines from {f["images"]} images ({f["source"]}), mean normalised width {f["mean_width_px"]} px, {f["mean_frames"]} frames; " +
                    $"model {f["model"]}; {f["threads"]} thread(s) of {f["cores"]} cores; load average {f["load_average_1min"]}");
        w.WriteLine($"  imaging (one thread)          {f["imaging_lines_per_s"],9} lines/s   {f["imaging_cpu_ms_per_line"]} ms CPU a line");
        foreach (var (size, rate) in f["model_lines_per_s_by_batch"]!.AsObject())
            w.WriteLine($"  network, batch {size,-3}           {rate,9} lines/s");
        foreach (var part in f["model_lines_per_s_by_width"]!.AsArray())
            w.WriteLine($"  network, {part!["mean_frames"],5} frames a line {part["lines_per_s"],9} lines/s (batch {f["model_best_batch"]})");
        w.WriteLine($"  decoding, greedy              {f["greedy_lines_per_s"],9} lines/s");
        w.WriteLine($"  decoding, default beam        {f["beam_lines_per_s"],9} lines/s   decode/network time {f["decode_share"]}");
        w.WriteLine($"  network CPU at its best batch {f["model_cpu_ms_per_line"],9} ms a line");
        w.WriteLine($"  transcribe, end to end        {f["end_to_end_lines_per_s"],9} lines/s   {f["end_to_end_share_of_model"]} of the network's best; {f["end_to_end_cpu_ms_per_line"]} ms CPU a line (all threads, model load included)");
        w.WriteLine($"  naive (one image at a time)   {f["naive_lines_per_s"],9} lines/s   end to end is {f["speedup_over_naive"]}x this");
        foreach (var (shape, g) in f["matmul_gflops_by_shape"]!.AsObject())
            w.WriteLine($"  matmul {shape,-34} {g,7} GFLOP/s");
        w.WriteLine($"  network work                  {f["network_mflop_per_line"],9} MFLOP/line; at its best batch {f["model_gflops"]} GFLOP/s = {f["model_ceiling_share"]} of the ceiling");
        w.WriteLine($"  peak memory                   {f["peak_memory_mb"],9} MB");
        return w.ToString().TrimEnd();
    }
}
