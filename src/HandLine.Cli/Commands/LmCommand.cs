using System.CommandLine;
using System.Globalization;
using HandLine.Language;

namespace HandLine.Cli.Commands;

internal static class LmCommand
{
    public const int DefaultOrder = 6;

    public static Command Create()
    {
        var text = new Option<string[]>("--text")
        {
            Description = "Training text: manifest .tsv files (their transcripts) or UTF-8 text files, one line per line",
            Required = true, AllowMultipleArgumentsPerToken = true,
        };
        var order = new Option<int>("--order")
        {
            Description = $"Characters of context plus one (1 to {CharNgramModel.MaxOrder})", DefaultValueFactory = _ => DefaultOrder,
        };
        var outPath = new Option<string>("--out") { Description = "Model file to write", Required = true };
        var heldOut = new Option<string[]>("--held-out")
        {
            Description = "Text kept out of training (same formats as --text): print the model's bits per character on it",
            AllowMultipleArgumentsPerToken = true,
        };
        var command = new Command("lm", "Build an interpolated Kneser-Ney character language model for beam search")
        {
            text, order, outPath, heldOut,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var files = parse.GetValue(text)!;
            var lines = TextSources.ReadLines(files);
            if (lines.Count == 0) throw new ArgumentException("the text files hold no lines");
            var model = CharNgramBuilder.Build(lines, parse.GetValue(order));
            CharNgramFile.Save(parse.GetValue(outPath)!, model, lines.Count, files.Select(Path.GetFileName).OfType<string>());
            Console.Error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"order {model.Order} model of {lines.Count} lines, {model.Symbols.Count} symbols, {model.NgramCount} n-grams, discounts {string.Join(" ", model.Discounts.Select(d => d.ToString("F3", CultureInfo.InvariantCulture)))} → {parse.GetValue(outPath)}"));
            if (parse.GetValue(heldOut) is { Length: > 0 } heldOutFiles)
                Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"held-out cross-entropy: {model.BitsPerCharacter(TextSources.ReadLines(heldOutFiles)):F4} bits per character"));
            return ExitCodes.Ok;
        }));
        return command;
    }
}
