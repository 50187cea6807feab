using HandLine.Model;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class PhraseGeneratorTests
{
    private static List<string> Lines(int seed, int n)
    {
        var g = new PhraseGenerator(seed);
        return Enumerable.Range(0, n).Select(_ => g.Next()).ToList();
    }

    [Fact]
    public void Five_thousand_lines_cover_every_symbol_often_and_fit_the_character_set()
    {
        var lines = Lines(11, 5000);
        Assert.All(lines, l => Assert.True(CharacterSet.Default.CanEncode(l), l));
        var counts = PhraseGenerator.CountSymbols(lines);
        // Rule of thumb, common practice, no source: a few dozen examples per symbol at this scale.
        var rare = CharacterSet.Default.Symbols
            .Where(s => !counts.TryGetValue(s, out var n) || n < 20)
            .ToList();
        Assert.Empty(rare);
    }

    [Fact]
    public void Lines_are_mostly_between_15_and_45_characters()
    {
        var lines = Lines(3, 2000);
        var inRange = lines.Count(l => l.Length is >= 15 and <= 45);
        Assert.True(inRange >= 0.95 * lines.Count, $"{inRange} of {lines.Count} in range");
        Assert.All(lines, l => Assert.Equal(l.Trim(), l));
        Assert.True(lines.Distinct().Count() > 1900, "lines should rarely repeat");
    }

    [Fact]
    public void Same_seed_same_lines_and_different_seed_different_lines()
    {
        Assert.Equal(Lines(5, 200), Lines(5, 200));
        Assert.NotEqual(Lines(5, 200), Lines(6, 200));
    }

    [Fact]
    public void Money_dates_and_register_forms_all_appear()
    {
        var lines = Lines(8, 3000);
        Assert.Contains(lines, l => System.Text.RegularExpressions.Regex.IsMatch(l, @"£\d+ \d+s \d+d"));
        Assert.Contains(lines, l => System.Text.RegularExpressions.Regex.IsMatch(l, @"\b\d+/\d+/1[89]\d\d\b"));
        Assert.Contains(lines, l => System.Text.RegularExpressions.Regex.IsMatch(l, @"£\d+\.\d+\.\d+"));
        Assert.Contains(lines, l => l.StartsWith("Bapt. ", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.StartsWith("Buried ", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.Contains(" do. ", StringComparison.Ordinal));
    }

    [Fact]
    public void CountSymbols_counts_code_points()
    {
        // Counted by hand.
        var counts = PhraseGenerator.CountSymbols(["£3 ½", "aa"]);
        Assert.Equal(
            new Dictionary<string, int> { [" "] = 1, ["3"] = 1, ["a"] = 2, ["£"] = 1, ["½"] = 1 },
            counts.ToDictionary());
    }
}
