using System.CommandLine;

namespace HandLine.Cli.Commands;

/// <summary>
/// The whole command tree in one place, so that the executable and the documentation test parse command lines
/// with the same parser: a documented command or option that stops existing fails a test, not a reader.
/// </summary>
internal static class CommandTree
{
    public static RootCommand Build()
    {
        var root = new RootCommand("HandLine: transcribe scanned handwritten text lines, score transcripts, train models.")
        {
            TranscribeCommand.Create(),
            SegmentCommand.Create(),
            ScoreCommand.Create(),
            SampleCommand.Create(),
            ReviewCommand.Create(),
            CorrectCommand.Create(),
            AdaptCommand.Create(),
            SynthCommand.Create(),
            TrainCommand.Create(),
            MergeCommand.Create(),
            BenchCommand.Create(),
            BenchBatchCommand.Create(),
            LmCommand.Create(),
            WordsCommand.Create(),
            CalibrateCommand.Create(),
            FitTemperatureCommand.Create(),
            BenchDecodeCommand.Create(),
            TuneDecodeCommand.Create(),
        };
        VersionReport.Attach(root);
        return root;
    }
}
