using HandLine.Decoding;
using HandLine.Language;
using HandLine.Model;

namespace HandLine.Tests.Decoding;

public sealed class LexiconDecodingTests
{
    private static readonly CharacterSet Charset = CharacterSet.Default;
    private static readonly Lexicon Words = Lexicon.FromWords(["Recd", "bush", "barley"]);

    /// <summary>
    /// Each character gets one frame at 0.9, then a blank frame at 0.9. At <paramref name="ambiguous"/> the frame is
    /// split: the written character 0.5, <paramref name="rival"/> 0.4.
    /// </summary>
    private static Posteriors Line(string text, int ambiguous = -1, char rival = '\0')
    {
        var rows = new List<double[]>();
        double[] Peak(int cls)
        {
            var row = Enumerable.Repeat(0.1 / (Charset.ClassCount - 1), Charset.ClassCount).ToArray();
            row[cls] = 0.9;
            return row;
        }
        var classes = Charset.Encode(text);
        for (var i = 0; i < classes.Length; i++)
        {
            if (i == ambiguous)
            {
                var row = Enumerable.Repeat(0.1 / (Charset.ClassCount - 2), Charset.ClassCount).ToArray();
                row[classes[i]] = 0.5;
                row[Charset.Encode(rival.ToString())[0]] = 0.4;
                rows.Add(row);
            }
            else rows.Add(Peak(classes[i]));
            rows.Add(Peak(0));
        }
        return new Posteriors(rows.Count, Charset.ClassCount, rows.SelectMany(r => r.Select(v => (float)Math.Log(v))).ToArray());
    }

    private const string Misread = "Recd 3 bush. barlcy 1 4 6";
    private const string Listed = "Recd 3 bush. barley 1 4 6";

    [Fact]
    public void TheListedWordWinsAnAmbiguousFrameWhileNumbersAndPunctuationStayFree()
    {
        var post = Line(Misread, Misread.IndexOf('c', 5), rival: 'e');
        Assert.Equal(Misread, GreedyDecoder.Decode(post, Charset).Text);
        Assert.Equal(Misread, new BeamDecoder(Charset, new DecodingOptions { Beam = 8 }).Decode(post).Text);

        var strict = new BeamDecoder(Charset, new DecodingOptions { Beam = 8, Lexicon = Words }).Decode(post);
        Assert.Equal(Listed, strict.Text);
        // The list forced 'e' against the evidence (0.4 against 'c' at 0.5), and its confidence says so:
        // about 0.4 / (0.4 + 0.5 + small rivals) ≈ 0.44 by the character posterior's definition; the rest stay high.
        var e = Listed.IndexOf("ley", StringComparison.Ordinal) + 1;
        Assert.InRange(strict.Chars[e].Confidence, 0.4, 0.46);
        Assert.All(strict.Chars.Where((_, i) => i != e), c => Assert.True(c.Confidence > 0.9, $"{c.Symbol} {c.Confidence}"));
    }

    [Fact]
    public void SoftModeTradesThePenaltyAgainstTheEvidence()
    {
        var post = Line(Misread, Misread.IndexOf('c', 5), rival: 'e');
        // 'c' beats 'e' by log(0.5/0.4) ≈ 0.22: a penalty of 0 lets the unlisted word through, 3 does not.
        Assert.Equal(Misread, new BeamDecoder(Charset, new DecodingOptions { Beam = 8, Lexicon = Words, LexiconPenalty = 0 }).Decode(post).Text);
        Assert.Equal(Listed, new BeamDecoder(Charset, new DecodingOptions { Beam = 8, Lexicon = Words, LexiconPenalty = 3 }).Decode(post).Text);
        // In soft mode the unlisted reading stays in the final beam and takes a share of the line:
        // e^(0.22 − 1) / (1 + e^(0.22 − 1)) ≈ 0.31 with a penalty of 1, so the line confidence is about 0.69 at most.
        var soft = new BeamDecoder(Charset, new DecodingOptions { Beam = 8, Lexicon = Words, LexiconPenalty = 1 }).Decode(post);
        Assert.Equal(Listed, soft.Text);
        Assert.Contains(soft.Alternatives, a => a.Text == Misread);
        Assert.InRange(soft.Alternatives.Single(a => a.Text == Misread).Share / soft.Confidence, 0.4, 0.5); // e^(−0.78) ≈ 0.46
        // With clear evidence an unlisted word still gets through a moderate penalty.
        Assert.Equal("Pd 7 Thos", new BeamDecoder(Charset, new DecodingOptions { Beam = 8, Lexicon = Words, LexiconPenalty = 3 }).Decode(Line("Pd 7 Thos")).Text);
    }

    [Fact]
    public void CaseVariantsOfListedWordsAreAccepted()
    {
        var strict = new BeamDecoder(Charset, new DecodingOptions { Beam = 8, Lexicon = Words });
        Assert.Equal("RECD 2 Bush, BARLEY", strict.Decode(Line("RECD 2 Bush, BARLEY")).Text);
        Assert.False(Words.Accepts("rECD"));
        Assert.True(Words.Accepts("Barley"));
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void StrictModeNeverWritesAnUnlistedWord(int seed)
    {
        // Noise posteriors: without the list the decoder writes non-words, with it every word is listed.
        var rng = new Random(seed);
        var post = BeamSearchTests.RandomPosteriors(40, Charset.ClassCount, rng);
        var free = new BeamDecoder(Charset, new DecodingOptions { Beam = 6 }).Decode(post);
        Assert.Contains(Lexicon.WordsIn(free.Text), w => !Words.Accepts(w));

        var strict = new BeamDecoder(Charset, new DecodingOptions { Beam = 6, Lexicon = Words }).Decode(post);
        Assert.NotEmpty(strict.Text);
        Assert.All(strict.Alternatives, a => Assert.All(Lexicon.WordsIn(a.Text), w => Assert.True(Words.Accepts(w), $"'{w}' in '{a.Text}'")));
    }

    [Fact]
    public void AWordTheModelCannotWriteIsReportedWithItsLine()
    {
        var path = Path.Combine(Directory.CreateTempSubdirectory("hl-lex-").FullName, "words.txt");
        File.WriteAllText(path, "barley\ncafé\n");
        var e = Assert.Throws<InputException>(() => new BeamDecoder(Charset, new DecodingOptions { Beam = 4, Lexicon = Lexicon.Load(path) }));
        Assert.Equal(path, e.Path);
        Assert.Contains("line 2", e.Message);
        Directory.Delete(Path.GetDirectoryName(path)!, true);
    }
}
