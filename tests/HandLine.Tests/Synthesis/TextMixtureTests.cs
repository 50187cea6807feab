using HandLine.Model;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class TextMixtureTests
{
    private static List<MixedText> Sample(int seed, int n, TextMixtureOptions? options = null)
    {
        var mixture = new TextMixture(seed, TestWords.Words, options);
        return Enumerable.Range(0, n).Select(_ => mixture.Next()).ToList();
    }

    private static readonly Lazy<List<MixedText>> FiveThousand = new(() => Sample(21, 5000));

    private static bool AllCapitals(string text) =>
        text.Any(char.IsLetter) && !text.Any(char.IsLower);

    [Fact]
    public void Default_shares_keep_phrases_under_half_and_sum_to_one()
    {
        var o = new TextMixtureOptions();
        o.Validate();
        Assert.True(o.PhraseShare <= 0.5);
        Assert.True(o.CharactersShare >= 0.05);
        Assert.True(o.CapitalsShare >= 0.10);
        Assert.Equal(1.0, Enum.GetValues<TextSource>().Sum(o.ShareOf), 9);
    }

    [Fact]
    public void Each_source_takes_its_configured_share_within_two_points()
    {
        var lines = FiveThousand.Value;
        var o = new TextMixtureOptions();
        foreach (var source in Enum.GetValues<TextSource>())
        {
            var share = lines.Count(l => l.Source == source) / (double)lines.Count;
            Assert.True(Math.Abs(share - o.ShareOf(source)) <= 0.02, $"{source}: {share:P2} against {o.ShareOf(source):P0}");
        }
    }

    [Fact]
    public void Other_shares_are_followed_too_and_a_zero_share_never_appears()
    {
        var o = new TextMixtureOptions
        {
            PhraseShare = 0, WordsShare = 0.5, CapitalsShare = 0.2, TitledShare = 0.1, CharactersShare = 0.1, FiguresShare = 0.1,
        };
        var lines = Sample(4, 5000, o);
        Assert.DoesNotContain(lines, l => l.Source == TextSource.Phrase);
        foreach (var source in Enum.GetValues<TextSource>())
            Assert.True(Math.Abs(lines.Count(l => l.Source == source) / 5000.0 - o.ShareOf(source)) <= 0.02, source.ToString());
    }

    [Fact]
    public void At_least_a_tenth_of_lines_are_wholly_in_capitals_and_every_capitals_line_is()
    {
        var lines = FiveThousand.Value;
        Assert.All(lines.Where(l => l.Source == TextSource.Capitals), l => Assert.True(AllCapitals(l.Text), l.Text));
        var share = lines.Count(l => AllCapitals(l.Text)) / (double)lines.Count;
        Assert.True(share >= 0.10, $"{share:P2} all-capitals lines");
    }

    [Fact]
    public void Every_text_uses_only_default_symbols_with_no_blank_ends_or_double_spaces()
    {
        Assert.All(FiveThousand.Value, l =>
        {
            Assert.True(CharacterSet.Default.CanEncode(l.Text), l.Text);
            Assert.Equal(l.Text.Trim(), l.Text);
            Assert.NotEmpty(l.Text);
            Assert.DoesNotContain("  ", l.Text, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Sources_look_as_named()
    {
        var lines = FiveThousand.Value;
        var words = TestWords.Words.ToHashSet(StringComparer.OrdinalIgnoreCase);
        // Titled lines: every word that starts with a letter starts with a capital.
        Assert.All(lines.Where(l => l.Source == TextSource.Titled), l =>
            Assert.All(l.Text.Split(' ', '-').Select(w => w.TrimStart('"', '(', '\'')).Where(w => w.Length > 0 && char.IsLetter(w[0])),
                w => Assert.True(char.IsUpper(w[0]), l.Text)));
        // Word lines are mostly list words, in many different orders.
        var wordLines = lines.Where(l => l.Source == TextSource.Words).Select(l => l.Text).ToList();
        var tokens = wordLines.SelectMany(t => t.Split(' ')).Select(w => w.Trim('"', '(', ')', '\'', ',', ';', ':', '.', '?', '!', '*')).ToList();
        Assert.True(tokens.Count(words.Contains) > 0.6 * tokens.Count);
        Assert.Equal(wordLines.Count, wordLines.Distinct().Count());
        // Random character lines use punctuation and digits as often as letters, so they are unlike words.
        var random = string.Concat(lines.Where(l => l.Source == TextSource.Characters).Select(l => l.Text));
        Assert.True(random.Count(c => !char.IsLetter(c) && c != ' ') > 0.25 * random.Length);
        // Figure lines hold digits.
        Assert.All(lines.Where(l => l.Source == TextSource.Figures), l => Assert.Contains(l.Text, char.IsDigit));
    }

    [Fact]
    public void Same_seed_same_texts_and_another_seed_other_texts()
    {
        var a = Sample(7, 300);
        Assert.Equal(a, Sample(7, 300));
        Assert.NotEqual(a.Select(l => l.Text), Sample(8, 300).Select(l => l.Text));
    }

    [Fact]
    public void Source_names_are_the_camel_case_names_written_to_the_log()
    {
        Assert.Equal(["phrase", "words", "capitals", "titled", "characters", "figures"],
            Enum.GetValues<TextSource>().Select(MixedText.NameOf));
    }

    [Fact]
    public void Rejects_bad_options_and_words()
    {
        Assert.Throws<ArgumentException>(() => new TextMixture(1, TestWords.Words, new TextMixtureOptions { PhraseShare = 0.5 }));
        Assert.Throws<ArgumentException>(() => new TextMixture(1, TestWords.Words,
            new TextMixtureOptions { PhraseShare = 1.2, WordsShare = -0.2, CapitalsShare = 0, TitledShare = 0, CharactersShare = 0, FiguresShare = 0 }));
        Assert.Throws<ArgumentException>(() => new TextMixture(1, TestWords.Words, new TextMixtureOptions { MinLength = 30, MaxLength = 20 }));
        Assert.Throws<ArgumentException>(() => new TextMixture(1, []));
        Assert.Throws<ArgumentException>(() => new TextMixture(1, ["café"]));
        Assert.Throws<ArgumentNullException>(() => new TextMixture(1, null!));
    }
}
