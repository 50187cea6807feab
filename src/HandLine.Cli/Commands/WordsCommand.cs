using System.CommandLine;
using System.Globalization;
using HandLine.Language;

namespace HandLine.Cli.Commands;

internal static class WordsCommand
{
    public static Command Create()
    {
        var text = new Option<string[]>("--text")
        {
            Description = "Text: manifest .tsv files (their transcripts) or UTF-8 text files", Required = true, AllowMultipleArgumentsPerToken = true,
        };
        var outPath = new Option<string>("--out") { Description = "Word list to write (word, tab, count; most frequent first)", Required = true };
        var minCount = new Option<int>("--min-count") { Description = "Leave out words seen fewer times", DefaultValueFactory = _ => 1 };
        var command = new Command("words", "Make a word list for --lexicon from text (words are runs of letters)")
        {
            text, outPath, minCount,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var counts = TextSources.ReadLines(parse.GetValue(text)!).SelectMany(Lexicon.WordsIn)
                .GroupBy(w => w, StringComparer.Ordinal)
                .Select(g => (Word: g.Key, Count: g.Count()))
                .Where(p => p.Count >= parse.GetValue(minCount))
                .OrderByDescending(p => p.Count).ThenBy(p => p.Word, StringComparer.Ordinal)
                .ToArray();
            if (counts.Length == 0) throw new ArgumentException("no words found");
            AtomicFile.WriteAllText(parse.GetValue(outPath)!,
                string.Concat(counts.Select(p => string.Create(CultureInfo.InvariantCulture, $"{p.Word}\t{p.Count}\n"))));
            Console.Error.WriteLine($"{counts.Length} words → {parse.GetValue(outPath)}");
            return ExitCodes.Ok;
        }));
        return command;
    }
}
