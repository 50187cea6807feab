using HandLine.Model;

namespace HandLine.Decoding;

/// <summary>
/// The single most probable frame path that collapses to a given labelling (Viterbi over the CTC topology of
/// Graves et al. 2006: the labels with a blank before, between and after them; a label may be skipped to
/// only when it differs from the one two states back).
/// </summary>
public static class CtcAlignment
{
    /// <summary>First and last frame at which each label is emitted on the best path; (−1, −1) for all when no path exists.</summary>
    public static (int First, int Last)[] BestPath(Posteriors posteriors, IReadOnlyList<int> labels)
    {
        ArgumentNullException.ThrowIfNull(posteriors);
        ArgumentNullException.ThrowIfNull(labels);
        int frames = posteriors.Frames, states = 2 * labels.Count + 1;
        var spans = Enumerable.Repeat((-1, -1), labels.Count).ToArray();
        if (frames == 0) return spans;
        int ClassOf(int s) => s % 2 == 0 ? 0 : labels[s / 2];

        var score = new double[states];
        var next = new double[states];
        var back = new int[frames, states];
        Array.Fill(score, double.NegativeInfinity);
        score[0] = posteriors[0, 0];
        if (states > 1) score[1] = posteriors[0, ClassOf(1)];
        for (var t = 1; t < frames; t++)
        {
            for (var s = 0; s < states; s++)
            {
                var best = score[s];
                var from = s;
                if (s >= 1 && score[s - 1] > best) { best = score[s - 1]; from = s - 1; }
                if (s >= 2 && s % 2 == 1 && ClassOf(s) != ClassOf(s - 2) && score[s - 2] > best) { best = score[s - 2]; from = s - 2; }
                next[s] = best + posteriors[t, ClassOf(s)];
                back[t, s] = from;
            }
            (score, next) = (next, score);
        }

        var end = states - 1;
        if (states > 1 && score[states - 2] > score[end]) end = states - 2;
        if (double.IsNegativeInfinity(score[end])) return spans;
        for (int t = frames - 1, s = end; t >= 0; t--)
        {
            if (s % 2 == 1)
            {
                var j = s / 2;
                spans[j] = (t, spans[j].Item2 < 0 ? t : spans[j].Item2);
            }
            if (t > 0) s = back[t, s];
        }
        return spans;
    }

    /// <summary>
    /// log p(labels | x): the sum over every frame path that collapses to the labels, by the forward recursion
    /// (Graves et al. 2006, eq. 6-9). −∞ when the labels cannot fit in the frames.
    /// </summary>
    public static double LogProbability(Posteriors posteriors, IReadOnlyList<int> labels)
    {
        ArgumentNullException.ThrowIfNull(posteriors);
        ArgumentNullException.ThrowIfNull(labels);
        int frames = posteriors.Frames, states = 2 * labels.Count + 1;
        if (frames == 0) return labels.Count == 0 ? 0 : double.NegativeInfinity;
        int ClassOf(int s) => s % 2 == 0 ? 0 : labels[s / 2];
        var alpha = new double[states];
        var next = new double[states];
        Array.Fill(alpha, double.NegativeInfinity);
        alpha[0] = posteriors[0, 0];
        if (states > 1) alpha[1] = posteriors[0, ClassOf(1)];
        for (var t = 1; t < frames; t++)
        {
            for (var s = 0; s < states; s++)
            {
                var sum = alpha[s];
                if (s >= 1) sum = LogSpace.Add(sum, alpha[s - 1]);
                if (s >= 2 && s % 2 == 1 && ClassOf(s) != ClassOf(s - 2)) sum = LogSpace.Add(sum, alpha[s - 2]);
                next[s] = sum + posteriors[t, ClassOf(s)];
            }
            (alpha, next) = (next, alpha);
        }
        return states > 1 ? LogSpace.Add(alpha[states - 1], alpha[states - 2]) : alpha[0];
    }
}
