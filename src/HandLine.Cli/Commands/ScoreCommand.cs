using System.CommandLine;
using HandLine.Scoring;

namespace HandLine.Cli.Commands;

internal static class ScoreCommand
{
    public static Command Create()
    {
        var truth = new Option<string>("--truth") { Description = "Manifest TSV with the correct transcripts", Required = true };
        var run = new Option<string>("--run") { Description = "Folder written by 'transcribe'", Required = true };
        var json = new Option<bool>("--json") { Description = "Print one JSON object instead of tables" };
        var rows = new Option<int>("--rows") { Description = "Per-line rows to show, worst first", DefaultValueFactory = _ => 20 };
        var by = new Option<string[]>("--by")
        {
            Description = "Also score per value of this extra manifest column (#columns header), or per image folder with 'folder'; repeatable",
            AllowMultipleArgumentsPerToken = false,
        };
        var command = new Command("score", "Character and word error rates of a run against a truth manifest")
        {
            truth, run, json, rows, by,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var report = Scorer.ScoreRun(parse.GetValue(truth)!, parse.GetValue(run)!, parse.GetValue(by) ?? []);
            if (parse.GetValue(json)) Console.WriteLine(ScoreReportWriter.ToJson(report));
            else ScoreReportWriter.WriteText(Console.Out, report, parse.GetValue(rows));
            return ExitCodes.Ok;
        }));
        return command;
    }
}
