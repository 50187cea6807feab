using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Tests.Formats;

public sealed class TextUnitsTests
{
    [Fact]
    public void Precomposed_and_decomposed_letters_are_the_same_character()
    {
        // U+00E9 and U+0065 U+0301 are canonically equivalent; NFC composes the pair (Unicode UAX #15).
        Assert.Equal(new[] { 0xE9 }, TextUnits.CodePoints("e\u0301"));
        Assert.Equal(0, EditDistance.AlignCharacters("Tithe of h\u00E9ritage", "Tithe of he\u0301ritage").Distance);
    }

    [Fact]
    public void A_code_point_outside_the_BMP_is_one_character()
    {
        // U+1D504 MATHEMATICAL FRAKTUR CAPITAL A is one code point stored as two UTF-16 units.
        const string fraktur = "\U0001D504";
        Assert.Equal(2, fraktur.Length);
        Assert.Equal(new[] { 0x1D504 }, TextUnits.CodePoints(fraktur));

        var counts = EditDistance.AlignCharacters(fraktur + "cre", "Acre");
        Assert.Equal((1, 0, 0, 3), (counts.Substitutions, counts.Deletions, counts.Insertions, counts.Hits));
    }

    [Fact]
    public void A_lone_surrogate_is_scored_as_one_replacement_character()
    {
        Assert.Equal(new[] { 'a', 0xFFFD, 'b' }, TextUnits.CodePoints("a\uD800b"));
    }

    [Fact]
    public void Words_split_on_any_Unicode_white_space_without_empty_words()
    {
        // U+00A0 no-break space and U+3000 ideographic space are category Zs, hence white space.
        Assert.Equal(
            new[] { "Paid", "£3", "10s", "6d" },
            TextUnits.Words("  Paid\t£3\u00A010s\u3000\r\n6d  "));
        Assert.Empty(TextUnits.Words(" \t\n"));
        Assert.Empty(TextUnits.Words(""));
    }

    [Fact]
    public void Words_are_NFC()
    {
        Assert.Equal(new[] { "caf\u00E9", "rent" }, TextUnits.Words("cafe\u0301 rent"));
    }
}
