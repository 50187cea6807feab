using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using HandLine.Decoding;
using HandLine.Model;

namespace HandLine.Cli.Commands;

/// <summary>
/// Model time against decoding time on real lines. Images are prepared first (not timed); then the model runs
/// on each source as 'transcribe' runs it, then every line is decoded greedily and with the chosen settings.
/// </summary>
internal static class BenchDecodeCommand
{
    /// <summary>Decoding at the default beam should add at most this share to model time.</summary>
    private const double TargetShare = 0.25;

    public static Command Create()
    {
        var inputs = new Argument<string[]>("INPUT") { Description = "Line images, folders or manifest .tsv files", Arity = ArgumentArity.OneOrMore };
        var model = new Option<string?>("--model") { Description = "Model file (default: the bundled model)" };
        var count = new Option<int>("--count") { Description = "Sources to use (the first N)", DefaultValueFactory = _ => 200 };
        var threads = new Option<int>("--threads") { Description = "CPU threads for the network (0 = libtorch's default)", DefaultValueFactory = _ => 1 };
        var decoding = new DecodingArguments();
        var command = new Command("bench-decode", "Measure decoding time against model time on real lines and print the ratio")
        {
            inputs, model, count, threads,
        };
        foreach (var option in decoding.All) command.Options.Add(option);
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var options = decoding.Build(parse);
            TorchRuntime.SetThreads(parse.GetValue(threads));
            using var lineModel = ModelFile.Load(parse.GetValue(model) ?? DefaultModel.PathBesideExecutable);
            var (prepared, modelSeconds) = SampledPosteriors.Run(lineModel, parse.GetValue(inputs)!, parse.GetValue(count));
            var posteriors = prepared.SelectMany(p => p.Lines).ToArray();

            var greedy = new LineDecoder(lineModel.Charset, DecodingOptions.Greedy);
            var chosen = new LineDecoder(lineModel.Charset, options);
            var greedySeconds = Time(greedy, posteriors);
            var chosenSeconds = Time(chosen, posteriors);

            var ci = CultureInfo.InvariantCulture;
            var n = posteriors.Length;
            Console.WriteLine(string.Create(ci, $"lines: {n} from {prepared.Count} sources, {posteriors.Average(p => p.Frames):F0} frames per line on average; network threads: {parse.GetValue(threads)}"));
            Console.WriteLine(string.Create(ci, $"model:             {1000 * modelSeconds / n,8:F3} ms/line"));
            Console.WriteLine(string.Create(ci, $"greedy decoding:   {1000 * greedySeconds / n,8:F3} ms/line  ({100 * greedySeconds / modelSeconds:F1}% of model time)"));
            Console.WriteLine(string.Create(ci, $"{Describe(options),-18} {1000 * chosenSeconds / n,8:F3} ms/line  ({100 * chosenSeconds / modelSeconds:F1}% of model time)"));
            Console.WriteLine(string.Create(ci, $"decode/model ratio: {chosenSeconds / modelSeconds:F3} (target at the default beam: at most {TargetShare:F2}) {(chosenSeconds / modelSeconds <= TargetShare ? "met" : "NOT met")}"));
            return ExitCodes.Ok;
        }));
        return command;
    }

    /// <summary>Decodes every line once to warm up, then times a second pass.</summary>
    private static double Time(LineDecoder decoder, IReadOnlyList<Posteriors> posteriors)
    {
        foreach (var p in posteriors.Take(20)) decoder.Decode(p);
        var clock = Stopwatch.StartNew();
        foreach (var p in posteriors) decoder.Decode(p);
        return clock.Elapsed.TotalSeconds;
    }

    private static string Describe(DecodingOptions o) =>
        !o.UsesBeam ? "greedy (chosen):" :
        $"beam {o.Beam}{(o.Lexicon is null ? "" : " +lexicon")}{(o.LanguageModel is null ? "" : " +lm")}:";
}
