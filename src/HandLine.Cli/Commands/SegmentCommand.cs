using System.CommandLine;
using System.Globalization;
using HandLine.Batch;
using HandLine.Layout;

namespace HandLine.Cli.Commands;

internal static class SegmentCommand
{
    public static Command Create()
    {
        var inputs = new Argument<string[]>("PAGE")
        {
            Description = "Page images, folders (searched recursively) or manifest .tsv files",
            Arity = ArgumentArity.OneOrMore,
        };
        var outDir = new Option<string>("--out") { Description = "Folder for one JSON file of line boxes per page", Required = true };
        var saveLines = new Option<bool>("--save-lines") { Description = "Also write each line's crop as NAME/line-NNN.png" };
        var command = new Command("segment", "Find the lines of whole pages (boxes, columns, reading order) without reading them")
        {
            inputs, outDir, saveLines,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var s = SegmentRun.Run(parse.GetValue(inputs)!, parse.GetValue(outDir)!, parse.GetValue(saveLines), new PageAnalyser(), log: Console.Error);
            Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{s.Pages} pages, {s.Lines} lines, {s.Errors.Count} errors; page stage {s.SegmentSeconds:F2} s ({(s.Pages == 0 ? 0 : s.SegmentSeconds / s.Pages):F2} s a page)"));
            return s.Errors.Count > 0 ? ExitCodes.CompletedWithErrors : ExitCodes.Ok;
        }));
        return command;
    }
}
