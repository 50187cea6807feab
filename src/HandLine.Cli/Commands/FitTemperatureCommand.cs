using System.CommandLine;
using System.Globalization;
using HandLine.Calibration;
using HandLine.Decoding;
using HandLine.Formats;
using HandLine.Model;

namespace HandLine.Cli.Commands;

/// <summary>
/// Fits the temperature that makes a model's character confidences honest on lines with known text (fit it on
/// hands the model did not train on, as they are what it will meet), prints the calibration at every temperature
/// tried, and writes the model again with it. The network runs once; each temperature is a decoding pass.
/// </summary>
internal static class FitTemperatureCommand
{
    public static Command Create()
    {
        var truth = new Argument<string>("TRUTH") { Description = "Manifest .tsv with line images and their correct transcripts" };
        var model = new Option<string?>("--model") { Description = "Model file (default: the bundled model)" };
        var output = new Option<string>("--out") { Description = "Where to write the model with its fitted temperature", Required = true };
        var count = new Option<int>("--count") { Description = "Sources to use (the first N)", DefaultValueFactory = _ => 2000 };
        var beam = new Option<int>("--beam")
        {
            Description = $"Beam width the confidences are fitted for (0 or 1 = greedy; default {DecodingOptions.DefaultBeam})",
            DefaultValueFactory = _ => DecodingOptions.DefaultBeam,
        };
        var threads = new Option<int>("--threads") { Description = "CPU threads for the network (0 = libtorch's default)", DefaultValueFactory = _ => 0 };
        var command = new Command("fit-temperature",
            "Fit one temperature to a model's outputs so its character confidences match how often characters are right on the given lines")
        {
            truth, model, output, count, beam, threads,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            if (parse.GetValue(count) < 1) throw new ArgumentException("--count must be at least 1");
            var truthPath = parse.GetValue(truth)!;
            var manifest = Manifest.Read(truthPath);
            if (manifest.Errors.Count > 0) throw manifest.Errors[0];
            var truthOf = manifest.Entries.ToDictionary(e => e.FullPath, e => e.Text, StringComparer.Ordinal);
            var options = parse.GetValue(beam) <= 1 ? DecodingOptions.Greedy : new DecodingOptions { Beam = parse.GetValue(beam) };
            options.Validate();

            TorchRuntime.SetThreads(parse.GetValue(threads));
            var modelPath = parse.GetValue(model) ?? DefaultModel.PathBesideExecutable;
            using var lineModel = ModelFile.Load(modelPath);
            var (sampled, _) = SampledPosteriors.Run(lineModel, [truthPath], parse.GetValue(count));
            var sources = sampled.Select(s => new TemperatureFit.Source(s.Source.Source, truthOf[s.Source.FullPath], s.Lines)).ToArray();
            var fit = TemperatureFit.Fit(sources, new LineDecoder(lineModel.Charset, options));

            var ci = CultureInfo.InvariantCulture;
            var current = lineModel.Temperature;
            Console.WriteLine(string.Create(ci,
                $"{sources.Length} sources, {fit.AsGiven.Characters} characters; the model's temperature now {current:0.####}"));
            Console.WriteLine($"{"temperature",12} {"char NLL",9} {"char ECE",9}");
            foreach (var p in fit.Tried)
                Console.WriteLine(string.Create(ci, $"{p.Temperature * current,12:0.####} {p.CharNll,9:F4} {p.CharEce,9:F4}{(p == fit.Best ? "  best" : "")}"));
            var temperature = Math.Round(fit.Best.Temperature * current, 4);
            // The flag threshold for this model, chosen on the same lines at the fitted temperature (transcribe's
            // default when no --flag-below is given).
            var flag = Calibrator.ChooseThreshold(TemperatureFit.Lines(sources, new LineDecoder(lineModel.Charset, options), fit.Best.Temperature), Calibrator.DefaultCatch);
            var record = new TemperatureRecord(Path.GetFileName(truthPath), sources.Length, fit.Best.Characters,
                options.UsesBeam ? $"beam {options.Beam}" : "greedy", Math.Round(fit.AsGiven.CharEce, 6), Math.Round(fit.Best.CharEce, 6),
                DateTime.UtcNow.ToString("O"), flag.FlagBelow, Math.Round(flag.CaughtShare, 4), Math.Round(flag.FlaggedShare, 4));
            var id = lineModel.SaveWithTemperature(parse.GetValue(output)!, temperature, record);
            Console.WriteLine(string.Create(ci,
                $"temperature {temperature:0.####}: character calibration error {fit.AsGiven.CharEce:F4} -> {fit.Best.CharEce:F4} on these lines"));
            Console.WriteLine(string.Create(ci,
                $"flag threshold {flag.FlagBelow:0.#####}: flags {flag.FlaggedShare:P1} of these lines and catches {flag.CaughtShare:P1} of their character errors (transcribe's default for this model)"));
            Console.WriteLine($"wrote {parse.GetValue(output)} (model {id})");
            return ExitCodes.Ok;
        }));
        return command;
    }
}
