using System.CommandLine;
using HandLine.Cli.Commands;

var root = new RootCommand("HandLine: transcribe scanned handwritten text lines, score transcripts, train models.")
{
    TranscribeCommand.Create(),
    ScoreCommand.Create(),
    SynthCommand.Create(),
    TrainCommand.Create(),
    LmCommand.Create(),
    WordsCommand.Create(),
    CalibrateCommand.Create(),
    BenchDecodeCommand.Create(),
    TuneDecodeCommand.Create(),
};
return root.Parse(args).Invoke();
