using System.CommandLine;
using System.Globalization;
using HandLine.Adaptation;
using HandLine.Batch;
using HandLine.Model;
using HandLine.Training;

namespace HandLine.Cli.Commands;

internal static class AdaptCommand
{
    /// <summary>The fonts 'adapt' replays general lines from by default, copied beside the executable from fixtures/fonts.</summary>
    public static string ReplayFonts => Path.Combine(AppContext.BaseDirectory, "fonts");

    public static Command Create()
    {
        var defaults = new AdaptOptions { ImagesRoot = ".", Replay = [] };
        var runDir = new Argument<string>("RUN_DIR") { Description = "Folder written by 'transcribe' (or an earlier 'adapt') whose lines were corrected" };
        var corrections = new Option<string>("--corrections")
        {
            Description = "The review page's corrections TSV, or a manifest TSV of line images and their text (columns source and line name the run's lines)",
            Required = true,
        };
        var outDir = new Option<string>("--out") { Description = "New folder for the adapted model (adapted.hlm) and the run read again with it", Required = true };
        var images = new Option<string>("--images")
        {
            Description = "Folder the run's sources are relative to: the folder given to 'transcribe', or its manifest's folder",
            Required = true,
        };
        var model = new Option<string?>("--model") { Description = "Model to adapt (default: the run's model, from its summary.json)" };
        var replay = new Option<string[]>("--replay")
        {
            Description = "Fonts (files or folders) to render general lines from, or manifest TSVs to draw them from, trained beside the corrections so other hands are not forgotten (default: the fonts shipped beside handline)",
            AllowMultipleArgumentsPerToken = true,
        };
        var replayShare = new Option<double>("--replay-share") { Description = "General lines per corrected training line (0 = none)", DefaultValueFactory = _ => defaults.ReplayShare };
        var holdBack = new Option<double>("--hold-back") { Description = "Share of the corrected lines held back to stop training and to check the result", DefaultValueFactory = _ => defaults.HoldBackShare };
        var passes = new Option<int>("--passes") { Description = "Passes over the training lines, at most", DefaultValueFactory = _ => defaults.Passes };
        var lr = new Option<double>("--learning-rate") { Description = "Adam step size", DefaultValueFactory = _ => defaults.LearningRate };
        var noAugment = new Option<bool>("--no-augment") { Description = "Train on the lines as they are, without fresh distortions each pass" };
        var seed = new Option<int>("--seed") { Description = "Seed of the split, the replayed lines and training", DefaultValueFactory = _ => defaults.Seed };
        var flagBelow = new Option<double>("--flag-below")
        {
            Description = "Flag re-read lines whose confidence is below this, for review (0..1)",
            DefaultValueFactory = _ => TranscribeOptions.DefaultFlagBelow,
        };
        var threads = new Option<int>("--threads") { Description = "CPU threads for the network (0 = all cores); 1 is best when other jobs share the machine" };
        var decoding = new DecodingArguments();
        var command = new Command("adapt", "Fine-tune the run's model on an editor's corrections, refuse if the held-back lines read worse, and read the run again with it")
        {
            runDir, corrections, outDir, images, model, replay, replayShare, holdBack, passes, lr, noAugment, seed, flagBelow, threads,
        };
        foreach (var option in decoding.All) command.Options.Add(option);
        var batch = BatchCommandOptions.AddTo(command, transcribing: false);
        command.SetAction((parse, cancel) => Task.Run(() => CommandRunner.Guard(() =>
        {
            var replayPaths = parse.GetValue(replay) is { Length: > 0 } given ? given : [ReplayFonts];
            var options = new AdaptOptions
            {
                ImagesRoot = parse.GetValue(images)!,
                Replay = replayPaths,
                ReplayShare = parse.GetValue(replayShare),
                HoldBackShare = parse.GetValue(holdBack),
                Passes = parse.GetValue(passes),
                LearningRate = parse.GetValue(lr),
                Augmentation = parse.GetValue(noAugment) ? null : new Augmentation(),
                Seed = parse.GetValue(seed),
                Threads = parse.GetValue(threads),
            };
            TorchRuntime.SetThreads(options.Threads);
            var say = batch.Quiet(parse) ? TextWriter.Null : Console.Error;
            var r = Adapter.Run(parse.GetValue(runDir)!, parse.GetValue(corrections)!, parse.GetValue(outDir)!, parse.GetValue(model), options,
                parse.GetValue(flagBelow), decoding.Build(parse), batch.Read(parse), say, cancel);
            var check = string.Create(CultureInfo.InvariantCulture,
                $"held-back lines ({r.HeldBackLines}): CER {r.HeldBackCerBefore:P2} before, {r.HeldBackCerAfter:P2} after");
            if (r.Refused)
            {
                Console.Error.WriteLine($"refused: the adapted model reads the held-back corrections worse than the model did ({check}); nothing was written. Correct more lines, or give a smaller --learning-rate.");
                return ExitCodes.AdaptRefused;
            }
            if (r.ModelPath is null)
            {
                say.WriteLine("stopped on request before the model was written; nothing was kept");
                return ExitCodes.Cancelled;
            }
            say.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"adapted on {r.TrainedLines} corrected and {r.ReplayLines} general line(s) in {r.TrainingMinutes:F1} min{(r.ModelReused ? " (earlier)" : "")}; {check}"));
            say.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"model {r.ModelId} in {r.ModelPath}; {r.Sources} sources ({r.SourcesRead} read again), {r.Lines} lines, {r.Flagged} flagged, {r.Errors} errors in {r.ReReadSeconds:F1} s"));
            if (r.Cancelled)
            {
                say.WriteLine("stopped on request; run the same command again to continue where it stopped");
                return ExitCodes.Cancelled;
            }
            return r.Errors > 0 ? ExitCodes.CompletedWithErrors : ExitCodes.Ok;
        })));
        return command;
    }
}
