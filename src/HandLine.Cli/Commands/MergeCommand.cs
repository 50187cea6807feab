using System.CommandLine;
using HandLine.Batch;

namespace HandLine.Cli.Commands;

internal static class MergeCommand
{
    public static Command Create()
    {
        var runs = new Argument<string[]>("RUN_DIR")
        {
            Description = "Output folders of 'transcribe --shard K/N' runs (all N of them)",
            Arity = ArgumentArity.OneOrMore,
        };
        var outDir = new Option<string>("--out") { Description = "New folder for the merged text files and reports", Required = true };
        var command = new Command("merge", "Join the output folders of shard runs into the output an unsharded run gives")
        {
            runs, outDir,
        };
        var batch = BatchCommandOptions.AddTo(command, transcribing: false);
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var say = batch.Quiet(parse) ? TextWriter.Null : Console.Error;
            var result = RunMerge.Merge(parse.GetValue(runs)!, parse.GetValue(outDir)!);
            if (!result.Merged)
            {
                foreach (var conflict in result.Conflicts) Console.Error.WriteLine($"conflict: {conflict}");
                Console.Error.WriteLine("nothing was written");
                return ExitCodes.Failed;
            }
            say.WriteLine($"merged {result.Runs} runs: {result.Sources} sources, {result.Lines} lines, {result.Errors} errors; reports in {parse.GetValue(outDir)}");
            return result.Errors > 0 ? ExitCodes.CompletedWithErrors : ExitCodes.Ok;
        }));
        return command;
    }
}
