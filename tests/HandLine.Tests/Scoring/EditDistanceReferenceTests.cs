using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

/// <summary>Checks the distance against an independent implementation: the Quickenshtein NuGet package.</summary>
public sealed class EditDistanceReferenceTests
{
    // BMP only and already NFC, so a UTF-16 unit is a code point and Quickenshtein (which compares
    // UTF-16 units) measures the same thing. A small alphabet makes matches, and so ties, common.
    private const string Alphabet = "abcde £½éß Ωж中";

    [Fact]
    public void Distance_matches_Quickenshtein_on_random_strings()
    {
        var random = new Random(20240611);
        for (var n = 0; n < 400; n++)
        {
            var truth = RandomText(random);
            var hypothesis = random.Next(4) == 0 ? Mutate(random, truth) : RandomText(random);

            // Reference: Quickenshtein 1.5.1 (NuGet), Levenshtein distance over UTF-16 units.
            var expected = Quickenshtein.Levenshtein.GetDistance(truth, hypothesis);
            var counts = EditDistance.AlignCharacters(truth, hypothesis);

            Assert.True(expected == counts.Distance, $"'{truth}' vs '{hypothesis}': expected {expected}, got {counts.Distance}");
            // The counts must describe a real alignment of these two strings.
            Assert.Equal(truth.Length, counts.TruthLength);
            Assert.Equal(hypothesis.Length, counts.HypothesisLength);
        }
    }

    private static string RandomText(Random random)
    {
        var chars = new char[random.Next(0, 25)];
        for (var i = 0; i < chars.Length; i++)
            chars[i] = Alphabet[random.Next(Alphabet.Length)];
        return new string(chars);
    }

    /// <summary>A few random edits of <paramref name="text"/>, so near-misses are tested as well as unrelated pairs.</summary>
    private static string Mutate(Random random, string text)
    {
        var chars = text.ToList();
        for (var edits = random.Next(1, 4); edits > 0; edits--)
        {
            var c = Alphabet[random.Next(Alphabet.Length)];
            switch (random.Next(3))
            {
                case 0 when chars.Count > 0:
                    chars[random.Next(chars.Count)] = c;
                    break;
                case 1 when chars.Count > 0:
                    chars.RemoveAt(random.Next(chars.Count));
                    break;
                default:
                    chars.Insert(random.Next(chars.Count + 1), c);
                    break;
            }
        }
        return new string(chars.ToArray());
    }
}
