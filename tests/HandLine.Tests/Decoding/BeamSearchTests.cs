using HandLine.Decoding;
using HandLine.Model;

namespace HandLine.Tests.Decoding;

public sealed class BeamSearchTests
{
    private static readonly CharacterSet Abc = CharacterSet.FromString("abc");

    /// <summary>A beam wide enough to keep every prefix, and no candidate pruning: the search is then exact.</summary>
    private static BeamDecoder Wide(int alternatives = 5) =>
        new(Abc, new DecodingOptions { Beam = 5000, CandidateFloor = 0, Alternatives = alternatives });

    /// <summary>
    /// CTC definition (Graves et al. 2006, eq. 2-3): p(l|x) = Σ over frame paths π with B(π) = l of ∏_t y_{π_t},
    /// B merging repeats and then removing blanks. Enumerating all 4^T paths gives every labelling's probability;
    /// prefix beam search with an unbounded beam must find the most probable one and its exact probability.
    /// </summary>
    [Theory]
    [InlineData(1, 11)]
    [InlineData(2, 12)]
    [InlineData(3, 13)]
    [InlineData(4, 14)]
    [InlineData(5, 15)]
    [InlineData(6, 16)]
    [InlineData(6, 17)]
    [InlineData(6, 18)]
    public void WideBeamFindsTheBruteForceMostProbableLabelling(int frames, int seed)
    {
        var post = RandomPosteriors(frames, Abc.ClassCount, new Random(seed));
        var exact = BruteForce(post);
        var ranked = exact.OrderByDescending(p => p.Value).ToArray();
        // The float rows sum to 1 only to ~1e-7, so posteriors are the probabilities over their total.
        var total = exact.Values.Sum();

        var h = Wide().Decode(post);

        Assert.Equal(ranked[0].Key, h.Text);
        Assert.Equal(Math.Log(ranked[0].Value), h.Alternatives[0].Score, 9);
        // Every labelling is in the final beam, so the shares are the exact posteriors P(l|x) (they sum to 1 over all l).
        Assert.Equal(ranked[0].Value / total, h.Confidence, 9);
        var topK = Math.Min(5, ranked.Length);
        Assert.Equal(ranked.Take(topK).Select(p => p.Key), h.Alternatives.Select(a => a.Text));
        for (var i = 0; i < topK; i++) Assert.Equal(ranked[i].Value / total, h.Alternatives[i].Share, 9);

        // The forward recursion (Graves et al. 2006, eq. 6-9) gives the same labelling probabilities as enumeration.
        foreach (var (text, p) in ranked.Take(8))
            Assert.Equal(Math.Log(p), CtcAlignment.LogProbability(post, Abc.Encode(text)), 9);

        // Character confidence by its definition, from the brute-force posteriors: p(l) over p(l) plus every
        // labelling that substitutes or deletes that one character.
        for (var j = 0; j < h.Text.Length; j++)
        {
            var variants = new HashSet<string> { h.Text, h.Text.Remove(j, 1) };
            foreach (var c in "abc") variants.Add(h.Text[..j] + c + h.Text[(j + 1)..]);
            Assert.Equal(exact[h.Text] / variants.Sum(v => exact.GetValueOrDefault(v)), h.Chars[j].Confidence, 9);
        }
    }

    [Fact]
    public void BeamFindsTheLabellingThatBestPathDecodingMisses()
    {
        // Hand computation from the CTC definition (Graves et al. 2006): two frames, each blank 0.55, a 0.4, b 0.05.
        // Best path: blank blank → "" with 0.55² = 0.3025. But "a" collects aa, a-, -a: 0.16 + 0.22 + 0.22 = 0.6.
        double[] row = [0.55, 0.4, 0.05];
        var post = new Posteriors(2, 3, row.Concat(row).Select(v => (float)Math.Log(v)).ToArray());
        var charset = CharacterSet.FromString("ab");

        Assert.Equal("", GreedyDecoder.Decode(post, charset).Text);
        var h = new BeamDecoder(charset, new DecodingOptions { Beam = 4 }).Decode(post);
        Assert.Equal("a", h.Text);
        Assert.Equal(Math.Log(0.6), h.Alternatives[0].Score, 5);
        Assert.Equal(Math.Log(0.3025), h.Alternatives.Single(a => a.Text == "").Score, 5);
    }

    [Fact]
    public void EqualScoresAreOrderedByLabelSequence()
    {
        // One frame: blank 0.2, a 0.4, b 0.4 — "a" and "b" tie exactly; the lower class sequence comes first.
        var charset = CharacterSet.FromString("ab");
        var post = new Posteriors(1, 3, new[] { 0.2, 0.4, 0.4 }.Select(v => (float)Math.Log(v)).ToArray());
        var decoder = new BeamDecoder(charset, new DecodingOptions { Beam = 3 });
        var first = decoder.Decode(post);
        Assert.Equal(["a", "b", ""], first.Alternatives.Select(a => a.Text));
        Assert.Equal(first.Alternatives.Select(a => (a.Text, a.Score)), decoder.Decode(post).Alternatives.Select(a => (a.Text, a.Score)));
    }

    [Fact]
    public void CharactersCarryTheFramesOfTheBestPath()
    {
        // Same path as the greedy test: a a - a b b - collapses to "aab" (rule B of Graves et al. 2006).
        var charset = CharacterSet.FromString("ab");
        var post = CtcTests.PeakedPosteriors([1, 1, 0, 1, 2, 2, 0], charset.ClassCount, peak: 0.9);
        var h = new BeamDecoder(charset, new DecodingOptions { Beam = 8 }).Decode(post);
        Assert.Equal("aab", h.Text);
        Assert.Equal([(0, 1), (3, 3), (4, 5)], h.Chars.Select(c => (c.FirstFrame, c.LastFrame)));
        Assert.All(h.Chars, c => Assert.InRange(c.Confidence, 0, 1));
        Assert.InRange(h.Confidence, 0, 1);
    }

    [Fact]
    public void ANarrowBeamStillAgreesWithGreedyOnPeakedPosteriors()
    {
        var rng = new Random(5);
        for (var trial = 0; trial < 20; trial++)
        {
            var path = Enumerable.Range(0, 12).Select(_ => rng.Next(Abc.ClassCount)).ToArray();
            var post = CtcTests.PeakedPosteriors(path, Abc.ClassCount, peak: 0.97);
            Assert.Equal(GreedyDecoder.Decode(post, Abc).Text, new BeamDecoder(Abc, new DecodingOptions { Beam = 2 }).Decode(post).Text);
        }
    }

    /// <summary>
    /// Character posterior by its definition, from brute-force labelling probabilities (CTC definition, Graves et
    /// al. 2006): p(l) over p(l) plus every labelling that substitutes or deletes character j, for every
    /// labelling that fits in the frames.
    /// </summary>
    [Theory]
    [InlineData(4, 31)]
    [InlineData(5, 32)]
    [InlineData(6, 33)]
    public void CharacterPosteriorsMatchTheirDefinitionByEnumeration(int frames, int seed)
    {
        var post = RandomPosteriors(frames, Abc.ClassCount, new Random(seed));
        var exact = BruteForce(post);
        foreach (var text in exact.Keys.Where(k => k.Length is > 0 and <= 4))
        {
            var labels = Abc.Encode(text);
            var conf = CharacterPosterior.Compute(post, labels, CtcAlignment.BestPath(post, labels), candidateFloor: 0);
            for (var j = 0; j < text.Length; j++)
            {
                var variants = new HashSet<string> { text, text.Remove(j, 1) };
                foreach (var c in "abc") variants.Add(text[..j] + c + text[(j + 1)..]);
                var expected = exact[text] / variants.Sum(v => exact.GetValueOrDefault(v));
                Assert.True(Math.Abs(expected - conf[j]) < 1e-9, $"'{text}' char {j}: expected {expected}, got {conf[j]}");
            }
        }
    }

    /// <summary>
    /// A narrow beam must keep exactly the prefixes the textbook algorithm keeps (Hannun et al. 2014, algorithm 1:
    /// extend every prefix by blank, repeat and each character, merge equal prefixes, keep the B best), written
    /// here plainly with strings and no shortcuts; the decoder's pruning may only skip work, never change results.
    /// </summary>
    [Theory]
    [InlineData(2, 21)]
    [InlineData(3, 22)]
    [InlineData(4, 23)]
    public void NarrowBeamMatchesAPlainReferenceSearch(int beam, int seed)
    {
        var rng = new Random(seed);
        for (var trial = 0; trial < 10; trial++)
        {
            var post = RandomPosteriors(12, Abc.ClassCount, rng);
            var expected = ReferenceSearch(post, beam);
            var h = new BeamDecoder(Abc, new DecodingOptions { Beam = beam, CandidateFloor = 0, Alternatives = beam }).Decode(post);
            Assert.Equal(expected.Select(e => e.Text), h.Alternatives.Select(a => a.Text));
            for (var i = 0; i < expected.Count; i++) Assert.Equal(expected[i].LogP, h.Alternatives[i].Score, 9);
        }
    }

    private static List<(string Text, double LogP)> ReferenceSearch(Posteriors post, int width)
    {
        static double Add(double a, double b) => double.IsNegativeInfinity(a) ? b : double.IsNegativeInfinity(b) ? a
            : Math.Max(a, b) + Math.Log(1 + Math.Exp(-Math.Abs(a - b)));
        var beam = new Dictionary<string, (double B, double Nb)> { [""] = (0, double.NegativeInfinity) };
        for (var t = 0; t < post.Frames; t++)
        {
            var next = new Dictionary<string, (double B, double Nb)>();
            void Put(string l, double b, double nb)
            {
                var old = next.GetValueOrDefault(l, (double.NegativeInfinity, double.NegativeInfinity));
                next[l] = (Add(old.Item1, b), Add(old.Item2, nb));
            }
            foreach (var (l, (b, nb)) in beam)
            {
                Put(l, Add(b, nb) + post[t, 0], double.NegativeInfinity);
                if (l.Length > 0) Put(l, double.NegativeInfinity, nb + post[t, Abc.Encode(l[^1..])[0]]);
                for (var c = 1; c < post.Classes; c++)
                {
                    var s = Abc.SymbolOf(c);
                    var sameAsLast = l.Length > 0 && l[^1..] == s;
                    Put(l + s, double.NegativeInfinity, (sameAsLast ? b : Add(b, nb)) + post[t, c]);
                }
            }
            beam = next.OrderByDescending(p => Add(p.Value.B, p.Value.Nb)).ThenBy(p => p.Key, StringComparer.Ordinal)
                .Take(width).ToDictionary(p => p.Key, p => p.Value);
        }
        return beam.Select(p => (p.Key, Add(p.Value.B, p.Value.Nb))).OrderByDescending(p => p.Item2)
            .ThenBy(p => p.Key, StringComparer.Ordinal).ToList();
    }

    internal static Posteriors RandomPosteriors(int frames, int classes, Random rng)
    {
        var values = new float[frames * classes];
        for (var t = 0; t < frames; t++)
        {
            var row = Enumerable.Range(0, classes).Select(_ => rng.NextDouble() + 0.02).ToArray();
            var sum = row.Sum();
            for (var c = 0; c < classes; c++) values[t * classes + c] = (float)Math.Log(row[c] / sum);
        }
        return new Posteriors(frames, classes, values);
    }

    /// <summary>Every labelling's probability, summed over all paths (the CTC definition); uses the float inputs exactly.</summary>
    private static Dictionary<string, double> BruteForce(Posteriors post)
    {
        var result = new Dictionary<string, double>(StringComparer.Ordinal);
        var total = (int)Math.Pow(post.Classes, post.Frames);
        for (var n = 0; n < total; n++)
        {
            var k = n;
            double p = 1;
            var label = new List<int>();
            var previous = -1;
            for (var t = 0; t < post.Frames; t++)
            {
                var c = k % post.Classes;
                k /= post.Classes;
                p *= Math.Exp(post[t, c]);
                if (c != previous && c != 0) label.Add(c);
                previous = c;
            }
            var text = string.Concat(label.Select(Abc.SymbolOf));
            result[text] = result.GetValueOrDefault(text) + p;
        }
        return result;
    }
}
