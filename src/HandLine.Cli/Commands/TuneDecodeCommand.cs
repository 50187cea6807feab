using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using HandLine.Calibration;
using HandLine.Decoding;
using HandLine.Formats;
using HandLine.Language;
using HandLine.Model;
using HandLine.Scoring;

namespace HandLine.Cli.Commands;

/// <summary>
/// Runs the model once on a proof sample, then decodes it with every combination of the listed settings and
/// prints CER, WER and decoding time for each, so beam width and weights can be chosen on one's own material.
/// </summary>
internal static class TuneDecodeCommand
{
    public static Command Create()
    {
        var truth = new Argument<string>("TRUTH") { Description = "Manifest .tsv with images and their correct transcripts" };
        var model = new Option<string?>("--model") { Description = "Model file (default: the bundled model)" };
        var count = new Option<int>("--count") { Description = "Sources to use (the first N)", DefaultValueFactory = _ => 300 };
        var threads = new Option<int>("--threads") { Description = "CPU threads for the network (0 = libtorch's default)", DefaultValueFactory = _ => 1 };
        var beams = List("--beams", "Beam widths to try (0 or 1 = greedy)", "1,8");
        var lexicon = new Option<string?>("--lexicon") { Description = "Word list to try" };
        var lexiconModes = List("--lexicon-modes", "With --lexicon: 'off', 'strict' or a soft weight, e.g. off,strict,4", "off,strict");
        var lm = new Option<string?>("--lm") { Description = "Character language model to try" };
        var lmWeights = List("--lm-weights", "With --lm: weights to try (0 = model off)", "0,0.5");
        var bonuses = List("--char-bonuses", "Character bonuses to try", "0");
        var command = new Command("tune-decode", "Compare decoder settings on a proof sample: CER, WER, calibration error and decoding time for each")
        {
            truth, model, count, threads, beams, lexicon, lexiconModes, lm, lmWeights, bonuses,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var manifest = Manifest.Read(parse.GetValue(truth)!);
            if (manifest.Errors.Count > 0) throw manifest.Errors[0];
            var truthOf = manifest.Entries.ToDictionary(e => e.FullPath, e => e.Text, StringComparer.Ordinal);
            var words = parse.GetValue(lexicon) is { } lexiconPath ? Lexicon.Load(lexiconPath) : null;
            var languageModel = parse.GetValue(lm) is { } lmPath ? CharNgramFile.Load(lmPath) : null;

            TorchRuntime.SetThreads(parse.GetValue(threads));
            using var lineModel = ModelFile.Load(parse.GetValue(model) ?? DefaultModel.PathBesideExecutable);
            var (prepared, modelSeconds) = SampledPosteriors.Run(lineModel, [parse.GetValue(truth)!], parse.GetValue(count));
            var lines = prepared.Sum(p => p.Lines.Count);
            var ci = CultureInfo.InvariantCulture;
            Console.WriteLine(string.Create(ci, $"{prepared.Count} sources, {lines} lines; model {1000 * modelSeconds / lines:F2} ms/line"));
            Console.WriteLine($"{"setting",-44} {"CER %",7} {"WER %",7} {"char ECE",9} {"line ECE",9} {"decode ms/line",15}");

            foreach (var options in Grid(parse, beams, lexiconModes, lmWeights, bonuses, words, languageModel))
            {
                var decoder = new LineDecoder(lineModel.Charset, options);
                var clock = Stopwatch.StartNew();
                var decoded = prepared.Select(p => p.Lines.Select(decoder.Decode).ToArray()).ToArray();
                var seconds = clock.Elapsed.TotalSeconds;
                var report = Scorer.Score(prepared.Select((p, i) => new ScoreItem(p.Source.Source, truthOf[p.Source.FullPath],
                    string.Join(' ', decoded[i].Select(h => h.Text).Where(t => t.Length > 0)))));
                var calibration = Calibrator.Evaluate(prepared.SelectMany((p, i) => CalibrationInput.ForSource(p.Source.Source, truthOf[p.Source.FullPath],
                    decoded[i])).ToArray());
                Console.WriteLine(string.Create(ci,
                    $"{Describe(options),-44} {100 * ErrorRate.Of(report.CharCounts),7:F2} {100 * ErrorRate.Of(report.WordCounts),7:F2} {calibration.Characters.Ece,9:F4} {calibration.Lines.Ece,9:F4} {1000 * seconds / lines,15:F3}"));
            }
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Option<string> List(string name, string description, string defaults) =>
        new(name) { Description = description + $" (default {defaults})", DefaultValueFactory = _ => defaults };

    private static IEnumerable<DecodingOptions> Grid(ParseResult parse, Option<string> beams, Option<string> lexiconModes,
        Option<string> lmWeights, Option<string> bonuses, Lexicon? words, CharNgramModel? lm)
    {
        static double Number(string s, string option) => double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out var v)
            ? v : throw new ArgumentException($"{option}: '{s}' is not a number");
        static string[] Items(string s) => s.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);

        var modes = words is null ? ["off"] : Items(parse.GetValue(lexiconModes)!);
        var weights = lm is null ? [0.0] : Items(parse.GetValue(lmWeights)!).Select(w => Number(w, "--lm-weights")).ToArray();
        var bonusValues = Items(parse.GetValue(bonuses)!).Select(b => Number(b, "--char-bonuses")).ToArray();
        foreach (var beam in Items(parse.GetValue(beams)!).Select(b => (int)Number(b, "--beams")))
        {
            if (beam <= 1) { yield return DecodingOptions.Greedy; continue; }
            foreach (var mode in modes)
                foreach (var weight in weights)
                    foreach (var bonus in bonusValues)
                    {
                        var options = new DecodingOptions
                        {
                            Beam = beam,
                            Lexicon = mode == "off" ? null : words,
                            LexiconPenalty = mode is "off" or "strict" ? null : Number(mode, "--lexicon-modes"),
                            LanguageModel = weight > 0 ? lm : null,
                            LmWeight = weight > 0 ? weight : new DecodingOptions().LmWeight,
                            CharBonus = bonus,
                        };
                        options.Validate();
                        yield return options;
                    }
        }
    }

    private static string Describe(DecodingOptions o)
    {
        if (!o.UsesBeam) return "greedy";
        var parts = new List<string> { $"beam {o.Beam}" };
        if (o.Lexicon is not null) parts.Add(o.LexiconPenalty is { } w ? string.Create(CultureInfo.InvariantCulture, $"lexicon soft {w}") : "lexicon strict");
        if (o.LanguageModel is not null) parts.Add(string.Create(CultureInfo.InvariantCulture, $"lm {o.LmWeight}"));
        if (o.CharBonus != 0) parts.Add(string.Create(CultureInfo.InvariantCulture, $"bonus {o.CharBonus}"));
        return string.Join(", ", parts);
    }
}
