using System.CommandLine;
using HandLine.Batch;

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
        var flagBelow = new Option<double>("--flag-below")
        {
            Description = "Flag lines whose confidence is below this, for review (0..1)",
            DefaultValueFactory = _ => TranscribeOptions.DefaultFlagBelow,
        };
        flagBelow.Validators.Add(r =>
        {
            var v = r.GetValueOrDefault<double>();
            if (v is < 0 or > 1) r.AddError("--flag-below must be between 0 and 1");
        });

        var decoding = new DecodingArguments();
        var command = new Command("transcribe", "Transcribe line or page images into text plus confidence reports")
        {
            inputs, outDir, model, flagBelow,
        };
        foreach (var option in decoding.All) command.Options.Add(option);
        command.SetAction((parse, cancel) =>
        {
            return Task.FromResult(CommandRunner.Guard(() =>
            {
                var options = new TranscribeOptions(
                    parse.GetValue(outDir)!, parse.GetValue(model) ?? DefaultModel.PathBesideExecutable, parse.GetValue(flagBelow),
                    Decoding: decoding.Build(parse));
                var s = TranscribeRun.Run(parse.GetValue(inputs)!, options, Console.Error, cancel);
                Console.Error.WriteLine(
                    $"{s.Sources} sources, {s.Lines} lines, {s.Flagged} flagged, {s.Errors} errors in {s.Seconds:F1} s (model {s.ModelId}); reports in {options.OutDir}");
                if (cancel.IsCancellationRequested) return ExitCodes.Cancelled;
                return s.HasErrors ? ExitCodes.CompletedWithErrors : ExitCodes.Ok;
            }));
        });
        return command;
    }
}
