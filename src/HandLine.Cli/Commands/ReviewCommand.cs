using System.CommandLine;
using HandLine.Review;

namespace HandLine.Cli.Commands;

internal static class ReviewCommand
{
    public static Command Create()
    {
        var runDir = new Argument<string>("RUN_DIR") { Description = "Folder written by 'transcribe'" };
        var outPath = new Option<string>("--out") { Description = "The review page to write (one self-contained HTML file)", Required = true };
        var images = new Option<string>("--images")
        {
            Description = "Folder the run's sources are relative to: the folder given to 'transcribe', or its manifest's folder",
            Required = true,
        };
        var all = new Option<bool>("--all") { Description = "List every line of the run, not only the flagged ones" };
        var doubt = new Option<double>("--doubt-below")
        {
            Description = "Mark a character doubtful when its confidence is below this",
            DefaultValueFactory = _ => new ReviewOptions { ImagesRoot = "." }.DoubtBelow,
        };
        var pick = new Option<int?>("--pick") { Description = "Show only the N lines worth correcting first (least sure, spread over the sources, covering the least sure characters) instead of the flagged ones" };
        var seed = new Option<int>("--seed") { Description = "Seed for --pick's ties: same run, same seed, same lines", DefaultValueFactory = _ => 1 };
        var command = new Command("review", "Write a page for checking a run's flagged lines in a browser, lowest confidence first; it exports the corrections for 'correct'")
        {
            runDir, outPath, images, all, doubt, pick, seed,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var options = new ReviewOptions
            {
                ImagesRoot = parse.GetValue(images)!, All = parse.GetValue(all), DoubtBelow = parse.GetValue(doubt),
                Pick = parse.GetValue(pick), Seed = parse.GetValue(seed),
            };
            var page = ReviewPage.Build(parse.GetValue(runDir)!, options);
            var path = parse.GetValue(outPath)!;
            AtomicFile.WriteAllText(path, page.Html);
            Console.WriteLine($"{page.Lines} of {page.RunLines} line(s) to check in {path}" +
                (page.MissingImages > 0 ? $" ({page.MissingImages} without an image: not found under --images)" : ""));
            return ExitCodes.Ok;
        }));
        return command;
    }
}
