using HandLine.Decoding;
using HandLine.Model;
using static TorchSharp.torch;

namespace HandLine.Tests.Decoding;

public sealed class CtcTests
{
    /// <summary>
    /// CTC definition (Graves et al. 2006, eq. 2-3): p(l|x) is the sum over every frame path π with B(π) = l of
    /// ∏ y_{π_t}, where B merges repeats and then removes blanks. Enumerate all paths on a tiny example.
    /// </summary>
    [Theory]
    [InlineData(new[] { 1, 2 }, 4)]
    [InlineData(new[] { 1, 1 }, 4)]
    [InlineData(new[] { 2 }, 3)]
    [InlineData(new[] { 1, 2, 1 }, 5)]
    public void TorchCtcLossEqualsTheBruteForceSumOverAlignments(int[] label, int frames)
    {
        const int classes = 3; // blank + two symbols
        var rng = new Random(42 + frames);
        var probs = new double[frames, classes];
        for (var t = 0; t < frames; t++)
        {
            var row = Enumerable.Range(0, classes).Select(_ => rng.NextDouble() + 0.05).ToArray();
            for (var c = 0; c < classes; c++) probs[t, c] = row[c] / row.Sum();
        }

        double total = 0;
        foreach (var path in AllPaths(frames, classes))
        {
            if (!Collapse(path).SequenceEqual(label)) continue;
            double p = 1;
            for (var t = 0; t < frames; t++) p *= probs[t, path[t]];
            total += p;
        }

        var logProbs = tensor(Enumerable.Range(0, frames * classes).Select(k => (float)Math.Log(probs[k / classes, k % classes])).ToArray())
            .reshape(frames, 1, classes);
        var loss = nn.functional.ctc_loss(logProbs, tensor(label.Select(v => (long)v).ToArray()).reshape(1, label.Length),
            tensor(new long[] { frames }), tensor(new long[] { label.Length }), reduction: nn.Reduction.Sum);
        Assert.Equal(-Math.Log(total), loss.item<float>(), 4);
    }

    [Fact]
    public void GreedyDecodingMergesRepeatsThenRemovesBlanks()
    {
        // Path a a - a b b - (blank = 0): merging repeats gives a - a b -, removing blanks gives "aab"
        // (the collapse rule B of Graves et al. 2006).
        var charset = CharacterSet.FromString("ab");
        int[] path = [1, 1, 0, 1, 2, 2, 0];
        var probs = PeakedPosteriors(path, charset.ClassCount, peak: 0.9);
        var h = GreedyDecoder.Decode(probs, charset);
        Assert.Equal("aab", h.Text);
        Assert.Equal([(0, 1), (3, 3), (4, 5)], h.Chars.Select(c => (c.FirstFrame, c.LastFrame)));
    }

    [Fact]
    public void ConfidencesFollowTheirDefinitions()
    {
        var charset = CharacterSet.FromString("ab");
        // Frame 0 'a' at 0.6, frame 1 'a' at 0.8, frame 2 blank at 0.5, frame 3 'b' at 0.7.
        double[][] rows =
        [
            [0.3, 0.6, 0.1], [0.1, 0.8, 0.1], [0.5, 0.25, 0.25], [0.2, 0.1, 0.7],
        ];
        var post = new Posteriors(4, 3, rows.SelectMany(r => r.Select(v => (float)Math.Log(v))).ToArray());
        var h = GreedyDecoder.Decode(post, charset);
        Assert.Equal("ab", h.Text);
        Assert.Equal(0.8, h.Chars[0].Confidence, 5); // best frame of the run
        Assert.Equal(0.7, h.Chars[1].Confidence, 5);
        Assert.Equal(Math.Pow(0.6 * 0.8 * 0.5 * 0.7, 0.25), h.Confidence, 5); // geometric mean of best-path frames
    }

    [Fact]
    public void AllBlankPosteriorsDecodeToEmptyText()
    {
        var charset = CharacterSet.FromString("ab");
        var h = GreedyDecoder.Decode(PeakedPosteriors([0, 0, 0], 3, 0.95), charset);
        Assert.Equal("", h.Text);
        Assert.Empty(h.Chars);
        Assert.Equal(0.95, h.Confidence, 4);
    }

    internal static Posteriors PeakedPosteriors(int[] path, int classes, double peak)
    {
        var values = new float[path.Length * classes];
        for (var t = 0; t < path.Length; t++)
            for (var c = 0; c < classes; c++)
                values[t * classes + c] = (float)Math.Log(c == path[t] ? peak : (1 - peak) / (classes - 1));
        return new Posteriors(path.Length, classes, values);
    }

    private static IEnumerable<int[]> AllPaths(int frames, int classes)
    {
        var total = (int)Math.Pow(classes, frames);
        for (var n = 0; n < total; n++)
        {
            var path = new int[frames];
            var k = n;
            for (var t = 0; t < frames; t++) { path[t] = k % classes; k /= classes; }
            yield return path;
        }
    }

    private static int[] Collapse(int[] path)
    {
        var result = new List<int>();
        var previous = -1;
        foreach (var c in path)
        {
            if (c != previous && c != 0) result.Add(c);
            previous = c;
        }
        return result.ToArray();
    }
}
