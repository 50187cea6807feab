using HandLine.Language;

namespace HandLine.Tests.Language;

public sealed class KneserNeyTests
{
    /// <summary>
    /// Worked example, order 2, lines "aab" and "ab"; vocabulary a, b, end, other (|V| = 4). Formulas: interpolated
    /// Kneser–Ney (Chen &amp; Goodman 1998, sec. 3 — recalled from memory, equation numbers not checked):
    /// p(w|h) = max(c(hw) − D, 0)/Σc(h·) + D·N1+(h·)/Σc(h·) · p_lower(w), lower order on continuation counts
    /// N1+(·w), bottom uniform 1/|V|, D = n1/(n1 + 2·n2).
    /// Bigram counts: (s,a)=2 (a,a)=1 (a,b)=2 (b,end)=2 → n1=1, n2=3, D2 = 1/7.
    /// Continuation counts: a=2 ({s,a}), b=1, end=1 → n1=2, n2=1, D1 = 2/4 = 1/2; Σ = 4, N1+ = 3.
    /// </summary>
    [Fact]
    public void ASmallWorkedExampleMatchesTheHandComputation()
    {
        var lm = CharNgramBuilder.Build(["aab", "ab"], 2);
        Assert.Equal(1.0 / 2, lm.Discounts[0], 12);
        Assert.Equal(1.0 / 7, lm.Discounts[1], 12);

        // Unigram level: p1(w) = max(N1+(·w) − 1/2, 0)/4 + (1/2 · 3/4) · 1/4.
        const double backoff1 = 0.5 * 3 / 4 * 0.25; // 0.09375
        double p1A = 1.5 / 4 + backoff1, p1B = 0.5 / 4 + backoff1, p1End = 0.5 / 4 + backoff1, p1Other = backoff1;
        Assert.Equal(1.0, p1A + p1B + p1End + p1Other, 12); // 0.46875 + 0.21875 + 0.21875 + 0.09375

        // After "a": counts a→a 1, a→b 2; Σ = 3, N1+ = 2, so the lower order gets (1/7 · 2/3).
        const double d = 1.0 / 7, gammaA = d * 2 / 3;
        Assert.Equal((2 - d) / 3 + gammaA * p1B, lm.Probability("a", "b"), 12);   // 0.639881
        Assert.Equal((1 - d) / 3 + gammaA * p1A, lm.Probability("a", "a"), 12);   // 0.330357
        Assert.Equal(gammaA * p1End, lm.Probability("a", null), 12);              // 0.020833
        Assert.Equal(gammaA * p1Other, lm.Probability("a", "z"), 12);             // unseen character
        // Start of line: (s,a) = 2, Σ = 2, N1+ = 1.
        Assert.Equal((2 - d) / 2 + d / 2 * p1A, lm.Probability("", "a"), 12);
        // After "b" only the end was seen.
        Assert.Equal((2 - d) / 2 + d / 2 * p1End, lm.Probability("ab", null), 12);
    }

    [Fact]
    public void CrossEntropyIsTheMeanNegativeLog2ProbabilityPerSymbol()
    {
        // Definition of cross-entropy: "ab" is three predictions — a after the start, b after a, end after b.
        var lm = CharNgramBuilder.Build(["aab", "ab"], 2);
        var expected = -(Math.Log2(lm.Probability("", "a")) + Math.Log2(lm.Probability("a", "b")) + Math.Log2(lm.Probability("ab", null))) / 3;
        Assert.Equal(expected, lm.BitsPerCharacter(["ab"]), 12);
    }

    /// <summary>A probability distribution must sum to 1 over the vocabulary (definition), in any context.</summary>
    [Theory]
    [InlineData(1)]
    [InlineData(3)]
    [InlineData(6)]
    public void NextCharacterDistributionsSumToOne(int order)
    {
        var lm = CharNgramBuilder.Build(SampleText, order);
        var rng = new Random(order);
        var alphabet = lm.Symbols.Append("é").Append("#").ToArray(); // two characters never seen
        for (var trial = 0; trial < 50; trial++)
        {
            var context = string.Concat(Enumerable.Range(0, rng.Next(0, 10)).Select(_ => alphabet[rng.Next(alphabet.Length)]));
            var sum = lm.Symbols.Sum(s => lm.Probability(context, s)) + lm.Probability(context, null) + lm.Probability(context, "é");
            Assert.Equal(1.0, sum, 10);
        }
    }

    [Fact]
    public void TheFileRoundTripsAndDamageIsCaught()
    {
        var dir = Directory.CreateTempSubdirectory("hl-lm-").FullName;
        try
        {
            var path = Path.Combine(dir, "ledger.hlc");
            var lm = CharNgramBuilder.Build(SampleText, 4);
            CharNgramFile.Save(path, lm, SampleText.Length, ["sample"]);
            var back = CharNgramFile.Load(path);
            Assert.Equal(lm.Order, back.Order);
            Assert.Equal(lm.Symbols, back.Symbols);
            foreach (var (context, next) in new[] { ("Recd of ", "J"), ("bush", "."), ("", "P"), ("Folio 2", null) })
                Assert.Equal(lm.Probability(context, next), back.Probability(context, next), 15);
            Assert.Empty(Directory.GetFiles(dir, "*.tmp"));

            var bytes = File.ReadAllBytes(path);
            bytes[bytes.Length / 2] ^= 1;
            File.WriteAllBytes(path, bytes);
            var e = Assert.Throws<InputException>(() => CharNgramFile.Load(path));
            Assert.Equal(path, e.Path);
            Assert.Contains("checksum", e.Message);

            File.WriteAllBytes(path, bytes[..20]);
            Assert.Throws<InputException>(() => CharNgramFile.Load(path));
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    internal static readonly string[] SampleText =
    [
        "Recd of Josiah Pelling 3 bush. barley £1 4s 6d",
        "Pd Thos. Marrable for thatching the barn 7/6",
        "12th March 1851. Sold 2 cwt. hay to Mr Orrin",
        "Hannah d. of Wm. & Ann Cressley, bapt. 3 May",
        "Folio 23. Merrowby Hall rents, Michaelmas 1852",
    ];
}
