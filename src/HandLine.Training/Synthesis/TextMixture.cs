using System.Text;
using HandLine.Model;

namespace HandLine.Synthesis;

/// <summary>
/// Line texts drawn from several sources (<see cref="TextSource"/>) in the shares of
/// <see cref="TextMixtureOptions"/>, so that no single grammar dominates what the network reads: the phrase
/// templates, words of a general word list in random order with punctuation and figures mixed in (as they
/// come, in capitals, or with capitalised words), random strings of the default character set, and dates and
/// amounts in many styles. Every text uses only symbols of <see cref="CharacterSet.Default"/>.
/// The same seed, words and options give the same texts. Not thread-safe: use one mixture per thread.
/// </summary>
public sealed class TextMixture
{
    private static readonly TextSource[] Sources = Enum.GetValues<TextSource>();

    // Random strings draw from the default set without the space; spaces are placed separately.
    private static readonly string[] Symbols = CharacterSet.Default.Symbols.Where(s => s != " ").ToArray();

    private readonly Random _rng;
    private readonly PhraseGenerator _phrases;
    private readonly IReadOnlyList<string> _words;
    private readonly TextMixtureOptions _options;
    private readonly double[] _cumulative;

    /// <param name="words">Words to draw from (see <see cref="WordList.Load"/>); each must fit the default set.</param>
    public TextMixture(int seed, IReadOnlyList<string> words, TextMixtureOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(words);
        if (words.Count == 0)
            throw new ArgumentException("The word list is empty.", nameof(words));
        foreach (var w in words)
            if (string.IsNullOrWhiteSpace(w) || !CharacterSet.Default.CanEncode(w))
                throw new ArgumentException($"Word '{w}' is empty or has symbols outside the default character set.", nameof(words));
        _options = options ?? new TextMixtureOptions();
        _options.Validate();
        _words = words;
        _rng = new Random(seed);
        _phrases = new PhraseGenerator(_rng.Next());
        _cumulative = new double[Sources.Length];
        var sum = 0.0;
        for (var i = 0; i < Sources.Length; i++)
            _cumulative[i] = sum += _options.ShareOf(Sources[i]);
    }

    /// <summary>The next text and its source.</summary>
    public MixedText Next()
    {
        var source = PickSource();
        var text = source switch
        {
            TextSource.Phrase => _phrases.Next(),
            TextSource.Words => WordLine(titled: false, sentenceCase: Chance(0.5)),
            TextSource.Capitals => WordLine(titled: false, sentenceCase: false).ToUpperInvariant(),
            TextSource.Titled => WordLine(titled: true, sentenceCase: false),
            TextSource.Characters => CharacterLine(),
            _ => FigureLine(),
        };
        return new MixedText(text, source);
    }

    private TextSource PickSource()
    {
        var u = _rng.NextDouble();
        for (var i = 0; i < Sources.Length; i++)
            if (u < _cumulative[i])
                return Sources[i];
        // u is below 1 and the shares sum to 1 within rounding; the last source with a share takes the rest.
        return Sources.Last(s => _options.ShareOf(s) > 0);
    }

    private bool Chance(double p) => _rng.NextDouble() < p;

    private string Word() => _words[_rng.Next(_words.Count)];

    private static string FirstLetter(string word) =>
        word.Length > 0 && char.IsLower(word[0]) ? char.ToUpperInvariant(word[0]) + word[1..] : word;

    /// <summary>Every word of a token with a capital first letter, behind any opening quote or bracket.</summary>
    private static string Capitalised(string token)
    {
        var chars = token.ToCharArray();
        for (var i = 0; i < chars.Length; i++)
            if (char.IsLower(chars[i]) && (i == 0 || chars[i - 1] is '"' or '(' or '\'' or '-' or ' '))
                chars[i] = char.ToUpperInvariant(chars[i]);
        return new string(chars);
    }

    /// <summary>
    /// Words (now and then a figure) until the line reaches a length drawn between the limits, joined by spaces or
    /// punctuation. Words keep the list's case, except that <paramref name="titled"/> gives every word a capital
    /// first letter and <paramref name="sentenceCase"/> the first word only.
    /// </summary>
    private string WordLine(bool titled, bool sentenceCase)
    {
        var target = _rng.Next(_options.MinLength, _options.MaxLength + 1);
        var line = new StringBuilder();
        var tokens = 0;
        while (line.Length < target)
        {
            var token = Token();
            if (titled || (sentenceCase && tokens == 0))
                token = Capitalised(token);
            if (tokens > 0)
            {
                var separator = Separator();
                // One long word must not push a line far past the limit; stop before it instead.
                if (line.Length + separator.Length + token.Length > _options.MaxLength + 8)
                    break;
                line.Append(separator);
            }
            line.Append(token);
            tokens++;
        }
        line.Append(_rng.NextDouble() switch
        {
            < 0.25 => ".",
            < 0.29 => "?",
            < 0.32 => "!",
            < 0.35 => ":",
            _ => "",
        });
        return line.ToString();
    }

    private string Token()
    {
        if (Chance(0.1))
            return FigureText.Next(_rng);
        var word = Chance(0.03) ? $"{Word()}-{Word()}" : Word();
        return _rng.NextDouble() switch
        {
            < 0.03 => $"\"{word}\"",
            < 0.05 => $"({word})",
            < 0.06 => $"'{word}'",
            < 0.07 => $"{word}*",
            _ => word,
        };
    }

    private string Separator() => _rng.NextDouble() switch
    {
        < 0.10 => ", ",
        < 0.13 => "; ",
        < 0.15 => ": ",
        < 0.17 => " - ",
        < 0.19 => " & ",
        < 0.20 => " + ",
        < 0.21 => " = ",
        < 0.23 => ". ",
        _ => " ",
    };

    /// <summary>Symbols drawn evenly from the default set, with single spaces now and then (never at the ends).</summary>
    private string CharacterLine()
    {
        var length = _rng.Next(_options.MinCharacters, _options.MaxCharacters + 1);
        var line = new StringBuilder(length);
        while (line.Length < length)
        {
            var canSpace = line.Length > 0 && line[^1] != ' ' && line.Length < length - 1;
            line.Append(canSpace && Chance(0.15) ? " " : Symbols[_rng.Next(Symbols.Length)]);
        }
        return line.ToString();
    }

    /// <summary>One to three figures, sometimes after a word, joined as a list or a sum.</summary>
    private string FigureLine()
    {
        var count = _rng.Next(1, 4);
        var parts = new List<string>(count);
        for (var i = 0; i < count; i++)
            parts.Add(FigureText.Next(_rng));
        var joiner = _rng.Next(4) switch
        {
            0 => ", ",
            1 => " - ",
            2 => "; ",
            _ => " ",
        };
        var figures = string.Join(joiner, parts);
        return _rng.Next(3) switch
        {
            0 => figures,
            1 => $"{FirstLetter(Word())} {figures}",
            _ => $"{Word()}: {figures}",
        };
    }
}
