using System.CommandLine;
using System.Globalization;
using HandLine.Features;
using HandLine.Formats;
using HandLine.Imaging;
using HandLine.Model;
using HandLine.Training;

namespace HandLine.Cli.Commands;

internal static class TrainCommand
{
    public static Command Create()
    {
        var train = new Option<string[]>("--train") { Description = "Training manifest TSV(s)", Required = true, AllowMultipleArgumentsPerToken = true };
        var valid = new Option<string>("--valid") { Description = "Validation manifest TSV", Required = true };
        var outPath = new Option<string>("--out") { Description = "Model file to write (the best by validation CER)", Required = true };
        var from = new Option<string?>("--from") { Description = "Start from this model (fine-tuning) instead of random weights" };
        var epochs = new Option<int>("--epochs") { DefaultValueFactory = _ => 30, Description = "Passes over the training lines" };
        var maxMinutes = new Option<double>("--max-minutes") { Description = "Stop after this many minutes of training (0 = no limit)" };
        var batch = new Option<int>("--batch") { DefaultValueFactory = _ => 16, Description = "Lines per batch" };
        var seed = new Option<int>("--seed") { DefaultValueFactory = _ => 1, Description = "Seed for weights and batch order" };
        var threads = new Option<int>("--threads") { Description = "CPU threads for the network (0 = all)" };
        var resume = new Option<bool>("--resume") { Description = "Continue from the checkpoint beside --out" };
        var lr = new Option<double>("--learning-rate") { DefaultValueFactory = _ => 1e-3, Description = "Adam step size" };
        var hidden = new Option<int>("--hidden") { DefaultValueFactory = _ => 128, Description = "LSTM units per direction (new models; with --from, a wider warm start)" };
        var layers = new Option<int>("--layers") { DefaultValueFactory = _ => 2, Description = "LSTM layers (new models)" };
        var height = new Option<int>("--line-height") { DefaultValueFactory = _ => 40, Description = "Normalised line height (new models; with --from, a warm start at this height)" };
        var stride = new Option<int>("--frame-stride") { DefaultValueFactory = _ => 2, Description = "Columns per frame (new models; with --from, a warm start with this stride)" };
        var geometric = new Option<bool>("--geometric") { Description = "Add geometric column features (new models)" };
        var convolution = new Option<bool>("--convolution") { Description = "Two 3x3 convolution layers ahead of the LSTM (new models; pixel columns only)" };
        var noAugment = new Option<bool>("--no-augment") { Description = "Train on the stored lines as they are, without fresh distortions each epoch" };
        var epochLines = new Option<long>("--epoch-lines") { Description = "Lines per epoch, so large sets are validated more often than once a pass (0 = one pass)" };
        var keepPrepared = new Option<bool>("--keep-prepared") { Description = "Keep each manifest's prepared lines beside it (MANIFEST.prepared) and reuse them while nothing has changed" };
        var maxLines = new Option<long>("--max-lines") { Description = "Stop after this many training lines in total (a fixed budget for comparisons; 0 = no limit)" };

        var command = new Command("train", "Train a model with CTC loss on manifest lines, keeping the best by validation CER")
        {
            train, valid, outPath, from, epochs, maxMinutes, batch, seed, threads, resume, lr, hidden, layers, height, stride, geometric, convolution, maxLines, keepPrepared, noAugment, epochLines,
        };
        // The work runs on a worker thread so the Ctrl+C handler is in place while it runs: a stop then
        // ends the current batch, saves a checkpoint and leaves a resumable run.
        command.SetAction((parse, cancel) => Task.Run(() => CommandRunner.Guard(() =>
        {
            var options = new TrainingOptions
            {
                Epochs = parse.GetValue(epochs), MaxMinutes = parse.GetValue(maxMinutes), BatchSize = parse.GetValue(batch),
                Seed = parse.GetValue(seed), Threads = parse.GetValue(threads), Resume = parse.GetValue(resume),
                LearningRate = parse.GetValue(lr),
                EpochLines = parse.GetValue(epochLines),
                Augmentation = parse.GetValue(noAugment) ? null : new Augmentation(),
                MaxBatches = (parse.GetValue(maxLines) + parse.GetValue(batch) - 1) / Math.Max(1, parse.GetValue(batch)),
            };
            options.Validate();
            var fromPath = parse.GetValue(from);
            // Symbols the training transcripts need beyond the starting set join it, so no training line is lost
            // for want of a class; symbols found only in validation lines do not (those lines are skipped below).
            var trainTexts = parse.GetValue(train)!.SelectMany(m => Manifest.Read(m).Entries.Select(e => e.Text)).ToList();
            string? fromId = null;
            LineModel Open()
            {
                if (fromPath is null)
                {
                    var added = CharacterSet.Default.MissingSymbols(trainTexts);
                    ReportGrowth(added);
                    return LineModel.Create(CharacterSet.Default.Append(added),
                        new FeatureConfig(parse.GetValue(height), parse.GetValue(geometric), parse.GetValue(stride)),
                        new NetworkConfig(parse.GetValue(hidden), parse.GetValue(layers), Convolution: parse.GetValue(convolution)), options.Seed);
                }
                var loaded = ModelFile.Load(fromPath);
                fromId = loaded.Id;
                // --line-height, --frame-stride or --hidden given with --from: a warm start of that shape, for
                // comparing input sizes and capacities (LineModel.Reshaped).
                int Given(Option<int> option, int current) => parse.GetResult(option) is { Implicit: false } ? parse.GetValue(option) : current;
                var features = loaded.Features with { LineHeight = Given(height, loaded.Features.LineHeight), FrameStride = Given(stride, loaded.Features.FrameStride) };
                var network = loaded.Header.Network with { Hidden = Given(hidden, loaded.Header.Network.Hidden) };
                if (features != loaded.Features || network != loaded.Header.Network)
                {
                    Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"reshaping {fromPath}: line height {loaded.Features.LineHeight} -> {features.LineHeight}, frame stride {loaded.Features.FrameStride} -> {features.FrameStride}, LSTM width {loaded.Header.Network.Hidden} -> {network.Hidden}"));
                    var reshaped = loaded.Reshaped(features, network, options.Seed);
                    loaded.Dispose();
                    loaded = reshaped;
                }
                var missing = loaded.Charset.MissingSymbols(trainTexts);
                if (missing.Count == 0) return loaded;
                ReportGrowth(missing);
                using (loaded) return loaded.WithSymbols(missing, options.Seed);
            }
            using var model = Open();

            var limits = InputLimits.Default;
            var clock = System.Diagnostics.Stopwatch.StartNew();
            var keep = parse.GetValue(keepPrepared);
            IReadOnlyList<LineSample> trainSet, validSet;
            IReadOnlyList<InputException> trainErrors, validErrors;
            try
            {
                (trainSet, trainErrors) = TrainingData.Load(parse.GetValue(train)!, model.Features, model.Charset, limits, options.Threads, keep, Console.Error.WriteLine, cancel);
                (validSet, validErrors) = TrainingData.Load([parse.GetValue(valid)!], model.Features, model.Charset, limits, options.Threads, keep, Console.Error.WriteLine, cancel);
            }
            catch (OperationCanceledException)
            {
                // Preparing many lines takes minutes; a stop then has nothing to save.
                Console.Error.WriteLine("stopped while preparing lines: nothing was trained or written");
                return ExitCodes.Cancelled;
            }
            foreach (var e in trainErrors.Concat(validErrors).Take(20)) Console.Error.WriteLine($"skipped: {e.Message}");
            if (trainErrors.Count + validErrors.Count > 20) Console.Error.WriteLine($"... {trainErrors.Count + validErrors.Count - 20} more skipped");
            Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"prepared {trainSet.Count} training and {validSet.Count} validation lines in {clock.Elapsed.TotalSeconds:F0} s"));

            var recipe = new TrainingRecord(
                "handline train " + string.Join(' ', Environment.GetCommandLineArgs().Skip(1).SkipWhile(a => a != "train").Skip(1)),
                parse.GetValue(train)!.Select(Path.GetFileName).OfType<string>().ToArray(), Path.GetFileName(parse.GetValue(valid)),
                options.Seed, 0, 0, 0, fromId);
            var result = new Trainer(Console.Error, interactive: !Console.IsErrorRedirected)
                .Train(model, trainSet, validSet, parse.GetValue(outPath)!, options, recipe, cancel);
            Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"\nbest validation CER {result.BestValidationCer:P2} after {result.Epochs} epochs, {result.LinesSeen} lines, {result.Minutes:F1} min{(result.StoppedEarly ? " (stopped; resume with --resume)" : "")}"));
            return cancel.IsCancellationRequested ? ExitCodes.Cancelled : ExitCodes.Ok;
        })));
        return command;
    }

    private static void ReportGrowth(IReadOnlyList<string> added)
    {
        if (added.Count == 0) return;
        // Code points as well as glyphs: an added space-like or invisible symbol is otherwise easy to miss.
        Console.Error.WriteLine($"character set grows by {added.Count}: " + string.Join(", ",
            added.Select(s => string.Create(CultureInfo.InvariantCulture, $"{s} (U+{char.ConvertToUtf32(s, 0):X4})"))));
    }
}
