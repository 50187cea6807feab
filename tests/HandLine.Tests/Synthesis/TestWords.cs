using System.Text;

namespace HandLine.Tests.Synthesis;

/// <summary>Invented words for word-list and mixture tests, written to a file as a word list would be.</summary>
internal static class TestWords
{
    private static readonly string[] Onsets = ["b", "br", "c", "d", "f", "g", "h", "l", "m", "n", "p", "qu", "r", "s", "st", "t", "v", "w", "y", "z"];
    private static readonly string[] Rhymes = ["ab", "ell", "ix", "om", "und", "arn", "ep", "ow", "ist", "ale", "ock", "ure"];

    /// <summary>Every onset-rhyme-onset-rhyme word (some capitalised, as proper nouns are in a list), in a fixed order.</summary>
    public static IReadOnlyList<string> Words { get; } = Build();

    private static string[] Build()
    {
        var words = new List<string>();
        for (var i = 0; i < Onsets.Length; i++)
            for (var j = 0; j < Rhymes.Length; j++)
            {
                var w = Onsets[i] + Rhymes[j] + Onsets[(i + j) % Onsets.Length] + Rhymes[(i * 7 + j) % Rhymes.Length];
                words.Add((i + j) % 5 == 0 ? char.ToUpperInvariant(w[0]) + w[1..] : w);
            }
        words.Add("o'clock");
        return words.ToArray();
    }

    public static string Write(string dir, IEnumerable<string>? extra = null)
    {
        var path = Path.Combine(dir, "words.txt");
        File.WriteAllText(path, string.Join("\n", Words.Concat(extra ?? [])) + "\n", new UTF8Encoding(false));
        return path;
    }
}
