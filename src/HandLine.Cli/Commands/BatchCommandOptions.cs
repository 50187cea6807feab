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
        Description = "CPU threads for the network (default: half the cores, at least 1, as images are prepared and decoded on the others; 0 = all cores)",
        DefaultValueFactory = _ => DefaultThreads,
    };

    /// <summary>
    /// The network's threads unless told: half the cores, at least one, since the run prepares and decodes
    /// images on worker threads meanwhile. On the 2-core development machine under load, libtorch on 2 threads
    /// took 84 s for what 1 thread did in 19 s (docs/measurements.md): its threads wait for each other when
    /// other work holds a core.
    /// </summary>
    public static int DefaultThreads => Math.Max(1, Environment.ProcessorCount / 2);

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
