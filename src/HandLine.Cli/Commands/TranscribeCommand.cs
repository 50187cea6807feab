using System.CommandLine;
using HandLine.Batch;
using HandLine.Layout;
using HandLine.Model;
using HandLine.Recognition;

namespace HandLine.Cli.Commands;

internal static class TranscribeCommand
{
    public static Command Create()
    {
        var inputs = new Argument<string[]>("INPUT")
        {
            Description = "Image files, folders (searched recursively) or manifest .tsv files",
            Arity = ArgumentArity.OneOrMore,
        };
        var outDir = new Option<string>("--out") { Description = "Folder for text files and reports", Required = true };
        var model = new Option<string?>("--model") { Description = "Model file (default: the bundled model)" };
        var flagBelow = new Option<double?>("--flag-below")
        {
            Description = $"Flag lines whose confidence is below this, for review (0..1; default: the model's own, fitted with its temperature, else {TranscribeOptions.DefaultFlagBelow})",
        };
        flagBelow.Validators.Add(r =>
        {
            var v = r.GetValueOrDefault<double?>();
            if (v is < 0 or > 1) r.AddError("--flag-below must be between 0 and 1");
        });

        var rotation = new Option<string>("--rotation")
        {
            Description = "Which way the images' text is turned clockwise: auto (detect it for each image), 0, 90, 180 or 270",
            DefaultValueFactory = _ => "auto",
        };
        rotation.Validators.Add(r =>
        {
            try
            {
                OrientationOptions.Parse(r.GetValueOrDefault<string>() ?? "");
            }
            catch (ArgumentException e)
            {
                r.AddError($"--rotation: {e.Message}");
            }
        });

        var layout = new Option<LayoutMode>("--layout")
        {
            Description = "How to take each image: Auto (decide from the image), Page (a whole page: deskew, rules, columns, lines in reading order) or Line (a line image or a strip of a few lines)",
            DefaultValueFactory = _ => LayoutMode.Auto,
        };
        var alto = new Option<bool>("--alto") { Description = "Also write one ALTO XML v4 file per page (NAME.alto.xml: text blocks, lines, words with confidence)" };
        var decoding = new DecodingArguments();
        var command = new Command("transcribe", "Transcribe line or page images into text plus confidence reports")
        {
            inputs, outDir, model, flagBelow, rotation, layout, alto,
        };
        foreach (var option in decoding.All) command.Options.Add(option);
        var batch = BatchCommandOptions.AddTo(command, transcribing: true);
        command.SetAction((parse, cancel) =>
        {
            // On a worker thread, so the action's task exists at once and Ctrl+C reaches the cancellation token.
            return Task.Run(() => CommandRunner.Guard(() =>
            {
                // Built inside the guard: a bad word list or language model is a clear error, exit code 2.
                var options = new TranscribeOptions(
                    parse.GetValue(outDir)!, parse.GetValue(model) ?? DefaultModel.PathBesideExecutable, parse.GetValue(flagBelow),
                    Decoding: decoding.Build(parse), Orientation: OrientationOptions.Parse(parse.GetValue(rotation)!),
                    Layout: parse.GetValue(layout), Alto: parse.GetValue(alto));
                TorchRuntime.SetThreads(batch.Threads(parse));
                var s = TranscribeRun.Run(parse.GetValue(inputs)!, options, batch.Read(parse), Console.Error, cancel);
                var say = batch.Quiet(parse) ? TextWriter.Null : Console.Error;
                say.WriteLine(
                    $"{s.Sources} sources, {s.Lines} lines, {s.Flagged} flagged, {s.Errors} errors in {s.Seconds:F1} s (model {s.ModelId}); reports in {options.OutDir}");
                if (s.Reused > 0)
                    say.WriteLine($"{s.Reused} sources reused from the journal of an earlier run in {options.OutDir}");
                if (s.Cancelled)
                {
                    say.WriteLine("stopped on request; run the same command again to continue where it stopped");
                    return ExitCodes.Cancelled;
                }
                return s.HasErrors ? ExitCodes.CompletedWithErrors : ExitCodes.Ok;
            }));
        });
        return command;
    }
}
