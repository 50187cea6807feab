using System.CommandLine;
using HandLine.Review;

namespace HandLine.Cli.Commands;

internal static class CorrectCommand
{
    public static Command Create()
    {
        var runDir = new Argument<string>("RUN_DIR") { Description = "Folder written by 'transcribe'" };
        var corrections = new Option<string>("--corrections") { Description = "Corrections TSV exported by the review page", Required = true };
        var images = new Option<string>("--images")
        {
            Description = "Folder the run's sources are relative to: the folder given to 'transcribe', or its manifest's folder (for the line crops)",
            Required = true,
        };
        var command = new Command("correct", "Apply an editor's corrections to a run and write the corrected lines as a ground-truth manifest for 'train'")
        {
            runDir, corrections, images,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var result = RunCorrector.Apply(parse.GetValue(runDir)!, parse.GetValue(corrections)!, parse.GetValue(images)!);
            Console.WriteLine($"{result.Corrections} correction(s) read; {result.LinesChanged} line(s) changed, {result.TranscriptsWritten} transcript file(s) rewritten.");
            Console.WriteLine($"Ground truth: {result.ManifestLines} line(s) in {result.ManifestPath}" +
                (result.Illegible > 0 ? $"; {result.Illegible} illegible line(s) left out" : "") +
                (result.Uncut > 0 ? $"; {result.Uncut} line(s) left out whose page could not be cut into lines again" : ""));
            return ExitCodes.Ok;
        }));
        return command;
    }
}
