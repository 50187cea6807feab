using System.CommandLine;
using HandLine.Batch;

namespace HandLine.Cli.Commands;

/// <summary>
/// The options that control how a batch runs rather than what it computes (share of the inputs, progress
/// display), kept apart from the transcription settings and added to a command in one call.
/// </summary>
internal sealed class BatchCommandOptions
{
    private readonly Option<string?> _shard = new("--shard")
    {
        Description = "Process only share K of N of the inputs (K counted from 0), e.g. 3/8, for cluster array jobs; join the shard folders with 'handline merge'",
    };

    private readonly Option<int> _threads = new("--threads")
    {
        Description = "CPU threads for the network (0 = all cores); 1 is best when other jobs share the machine",
    };

    private readonly Option<bool> _quiet = new("--quiet")
    {
        Description = "Write nothing to stderr but fatal errors (input problems still go to errors.jsonl)",
    };

    private BatchCommandOptions()
    {
        _threads.Validators.Add(r =>
        {
            if (r.GetValueOrDefault<int>() is < 0 or > 1024) r.AddError("--threads must be between 0 and 1024");
        });
        _shard.Validators.Add(r =>
        {
            var text = r.GetValueOrDefault<string?>();
            if (text is null) return;
            try
            {
                ShardSpec.Parse(text);
            }
            catch (ArgumentException e)
            {
                r.AddError($"--shard: {e.Message}");
            }
        });
    }

    /// <param name="transcribing">Adds --shard and --threads, which only a transcription run uses.</param>
    public static BatchCommandOptions AddTo(Command command, bool transcribing)
    {
        var options = new BatchCommandOptions();
        if (transcribing)
        {
            command.Options.Add(options._shard);
            command.Options.Add(options._threads);
        }
        command.Options.Add(options._quiet);
        return options;
    }

    public bool Quiet(ParseResult parse) => parse.GetValue(_quiet);

    public int Threads(ParseResult parse) => parse.GetValue(_threads);

    /// <summary>Progress redrawn in place at a terminal, plain periodic lines when stderr is a file or pipe, none with --quiet.</summary>
    public BatchOptions Read(ParseResult parse) => new()
    {
        Shard = parse.GetResult(_shard) is null || parse.GetValue(_shard) is not { } text ? null : ShardSpec.Parse(text),
        Progress = Quiet(parse) ? ProgressStyle.None : Console.IsErrorRedirected ? ProgressStyle.Plain : ProgressStyle.Terminal,
    };
}
