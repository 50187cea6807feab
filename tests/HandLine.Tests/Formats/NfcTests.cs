using HandLine.Formats;

namespace HandLine.Tests.Formats;

/// <summary>
/// NFC cases from the Unicode Standard: UAX #15 (Unicode Normalization Forms) and chapter 3.12
/// (Hangul). Code points recalled from memory of those documents, not copied from them.
/// </summary>
public sealed class NfcTests
{
    [Theory]
    [InlineData("e\u0301", "\u00E9")]                      // base + combining acute composes
    [InlineData("\u212B", "\u00C5")]                       // ANGSTROM SIGN: singleton, never recomposed
    [InlineData("\u2126", "\u03A9")]                       // OHM SIGN → GREEK CAPITAL OMEGA
    [InlineData("\u1E0B\u0323", "\u1E0D\u0307")]           // d-dot-above + dot below: reordered, recomposed
    [InlineData("q\u0307\u0323", "q\u0323\u0307")]         // no precomposed q: marks only reordered by class
    [InlineData("\u0344", "\u0308\u0301")]                 // non-starter decomposition is not recomposed
    [InlineData("\u0958", "\u0915\u093C")]                 // composition exclusion (Devanagari qa)
    [InlineData("A\u0301\u0301", "\u00C1\u0301")]          // second acute has nothing left to join
    [InlineData("\u1100\u1161\u11A8", "\uAC01")]           // Hangul L + V + T → one syllable
    [InlineData("\uAC00\u11A8", "\uAC01")]                 // Hangul LV syllable + T
    [InlineData("\u0301e", "\u0301e")]                     // a leading mark stays; e alone is already NFC
    [InlineData("Ren\u00E9 Fairbrook, \u00A33", "Ren\u00E9 Fairbrook, \u00A33")] // already NFC: unchanged
    public void Produces_the_standard_NFC(string input, string expected)
    {
        Assert.Equal(expected, TextUnits.ToNfc(input));
    }

    [Fact]
    public void NFC_is_idempotent_over_the_BMP()
    {
        // Property of any normalization form (UAX #15): NFC(NFC(x)) = NFC(x). Each character is
        // tested after "a" and before U+0301 so composition with neighbours is exercised too.
        for (var cp = 0x20; cp < 0x10000; cp++)
        {
            if (cp is >= 0xD800 and <= 0xDFFF)
                continue;
            var text = "a" + (char)cp + "\u0301";
            var once = TextUnits.ToNfc(text);
            Assert.Equal(once, TextUnits.ToNfc(once));
        }
    }
}
