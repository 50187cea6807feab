using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using HandLine.Calibration;

namespace HandLine.Cli.Commands;

internal static class CalibrateCommand
{
    public static Command Create()
    {
        var truth = new Option<string>("--truth") { Description = "Manifest TSV with the correct transcripts", Required = true };
        var run = new Option<string>("--run") { Description = "Folder written by 'transcribe'", Required = true };
        var catchShare = new Option<double>("--catch")
        {
            Description = "Share of character errors the flagged lines should hold (0..1]", DefaultValueFactory = _ => Calibrator.DefaultCatch,
        };
        var bins = new Option<int>("--bins") { Description = "Bins of the reliability table", DefaultValueFactory = _ => Calibrator.DefaultBins };
        var json = new Option<bool>("--json") { Description = "Print one JSON object instead of tables" };
        var command = new Command("calibrate", "How well confidence predicts correctness, and the --flag-below value that catches a share of errors")
        {
            truth, run, catchShare, bins, json,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var c = parse.GetValue(catchShare);
            if (c is <= 0 or > 1) throw new ArgumentException("--catch must be above 0 and at most 1");
            if (parse.GetValue(bins) < 1) throw new ArgumentException("--bins must be at least 1");
            var input = CalibrationInput.Load(parse.GetValue(truth)!, parse.GetValue(run)!);
            if (input.Lines.Count == 0) throw new ArgumentException("no run line matches a truth entry");
            var report = Calibrator.Evaluate(input.Lines, c, parse.GetValue(bins), input.UnmatchedTruthSources, input.UnmatchedErrors);
            if (parse.GetValue(json)) Console.WriteLine(ToJson(report));
            else WriteText(Console.Out, report);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static string ToJson(CalibrationReport r) => JsonSerializer.Serialize(new Dictionary<string, object>
    {
        ["chars"] = r.Characters.Count,
        ["char_ece"] = Math.Round(r.Characters.Ece, 6),
        ["lines"] = r.Lines.Count,
        ["line_ece"] = Math.Round(r.Lines.Ece, 6),
        ["char_bins"] = Bins(r.Characters),
        ["line_bins"] = Bins(r.Lines),
        ["catch"] = r.Threshold.Target,
        ["flag_below"] = r.Threshold.FlagBelow,
        ["flagged_lines"] = r.Threshold.FlaggedLines,
        ["caught_errors"] = r.Threshold.CaughtErrors,
        ["total_errors"] = r.Threshold.TotalErrors,
        ["unmatched_truth_sources"] = r.UnmatchedTruthSources,
    }, new JsonSerializerOptions { WriteIndented = true });

    private static object[] Bins(ReliabilityTable t) => t.Bins.Select(b => (object)new Dictionary<string, object>
    {
        ["lower"] = b.Lower, ["upper"] = b.Upper, ["count"] = b.Count,
        ["mean_confidence"] = Math.Round(b.MeanConfidence, 6), ["accuracy"] = Math.Round(b.Accuracy, 6),
    }).ToArray();

    private static void WriteText(TextWriter w, CalibrationReport r)
    {
        var ci = CultureInfo.InvariantCulture;
        w.WriteLine(string.Create(ci, $"Characters: {r.Characters.Count}   lines: {r.Lines.Count}"));
        w.WriteLine();
        w.WriteLine("Character confidence against correctness (a character is correct when the alignment to the truth matches it):");
        WriteTable(w, r.Characters, "chars");
        w.WriteLine(string.Create(ci, $"Expected calibration error (characters): {r.Characters.Ece:F4}"));
        w.WriteLine();
        w.WriteLine("Line confidence against \"the whole line is right\":");
        WriteTable(w, r.Lines, "lines");
        w.WriteLine(string.Create(ci, $"Expected calibration error (lines): {r.Lines.Ece:F4}"));
        w.WriteLine();
        var t = r.Threshold;
        if (t.TotalErrors == 0)
        {
            w.WriteLine("No character errors: nothing needs flagging (--flag-below 0).");
        }
        else
        {
            w.WriteLine(string.Create(ci,
                $"To catch {100 * t.Target:0.#}% of the {t.TotalErrors} character errors: --flag-below {t.FlagBelow:0.#####}"));
            w.WriteLine(string.Create(ci,
                $"  flags {t.FlaggedLines} of {t.TotalLines} lines ({100 * t.FlaggedShare:F1}%) holding {t.CaughtErrors} errors ({100 * t.CaughtShare:F1}%)"));
        }
        if (r.UnmatchedTruthSources > 0)
            w.WriteLine(string.Create(ci,
                $"{r.UnmatchedTruthSources} truth entries have no run output ({r.UnmatchedErrors} characters); they are not counted above."));
    }

    private static void WriteTable(TextWriter w, ReliabilityTable t, string unit)
    {
        var ci = CultureInfo.InvariantCulture;
        w.WriteLine(string.Create(ci, $"  {"confidence",-12} {unit,7} {"mean conf",10} {"correct",8} {"gap",7}"));
        foreach (var b in t.Bins)
        {
            var range = string.Create(ci, $"{b.Lower:F2}-{b.Upper:F2}");
            w.WriteLine(b.Count == 0
                ? string.Create(ci, $"  {range,-12} {0,7} {"-",10} {"-",8} {"-",7}")
                : string.Create(ci, $"  {range,-12} {b.Count,7} {b.MeanConfidence,10:F3} {b.Accuracy,8:F3} {b.Gap,7:+0.000;-0.000}"));
        }
    }
}
