using HandLine.Model;

namespace HandLine.Decoding;

/// <summary>
/// The posterior of each chosen character against the readings that differ from the chosen line only there:
/// <code>conf_j = p(l | x) / (p(l | x) + Σ_{c ≠ l_j} p(l with l_j → c | x) + p(l without l_j | x))</code>
/// with every p(·|x) the exact CTC probability (Graves et al. 2006), computed for all j at once from the forward
/// (α) and backward (β) variables of the chosen labelling: a substitution or deletion at j leaves the α of the
/// states before j and the β of the states after j unchanged, so each variant costs one pass over the frames.
/// </summary>
public static class CharacterPosterior
{
    /// <summary>Substitutes considered per character, strongest first (common practice, no source).</summary>
    public const int MaxRivals = 4;

    /// <param name="candidateFloor">A substitute c is considered when its posterior reaches this at some frame
    /// within one frame of the character's span; at most <see cref="MaxRivals"/> of them, and the sums only cover
    /// the frames between the neighbouring characters. With 0 every class and every frame is used: the exact value.</param>
    public static double[] Compute(Posteriors posteriors, IReadOnlyList<int> labels, IReadOnlyList<(int First, int Last)> spans, double candidateFloor)
    {
        var exact = candidateFloor <= 0;
        ArgumentNullException.ThrowIfNull(posteriors);
        ArgumentNullException.ThrowIfNull(labels);
        ArgumentNullException.ThrowIfNull(spans);
        int frames = posteriors.Frames, count = labels.Count, states = 2 * count + 1;
        var result = new double[count];
        if (count == 0 || frames == 0) return result;
        var ninf = double.NegativeInfinity;
        int ClassOf(int s) => s % 2 == 0 ? 0 : labels[s / 2];
        bool Skip(int s) => s % 2 == 1 && s >= 2 && ClassOf(s) != ClassOf(s - 2); // s−2 → s allowed
        double Y(int t, int c) => posteriors[t, c];

        var alpha = new double[frames, states];
        var beta = new double[frames, states];
        for (var s = 0; s < states; s++) { alpha[0, s] = ninf; beta[frames - 1, s] = ninf; }
        alpha[0, 0] = Y(0, 0);
        alpha[0, 1] = Y(0, ClassOf(1));
        for (var t = 1; t < frames; t++)
            for (var s = 0; s < states; s++)
            {
                var sum = alpha[t - 1, s];
                if (s >= 1) sum = LogSpace.Add(sum, alpha[t - 1, s - 1]);
                if (Skip(s)) sum = LogSpace.Add(sum, alpha[t - 1, s - 2]);
                alpha[t, s] = sum + Y(t, ClassOf(s));
            }
        beta[frames - 1, states - 1] = 0;
        beta[frames - 1, states - 2] = 0;
        for (var t = frames - 2; t >= 0; t--)
            for (var s = 0; s < states; s++)
            {
                var sum = Y(t + 1, ClassOf(s)) + beta[t + 1, s];
                if (s + 1 < states) sum = LogSpace.Add(sum, Y(t + 1, ClassOf(s + 1)) + beta[t + 1, s + 1]);
                if (s + 2 < states && Skip(s + 2)) sum = LogSpace.Add(sum, Y(t + 1, ClassOf(s + 2)) + beta[t + 1, s + 2]);
                beta[t, s] = sum;
            }
        var total = LogSpace.Add(alpha[frames - 1, states - 1], alpha[frames - 1, states - 2]);
        var floor = candidateFloor > 0 ? Math.Log(candidateFloor) : ninf;

        for (var j = 0; j < count; j++)
        {
            var q = 2 * j + 1;
            var previous = j > 0 ? labels[j - 1] : -1;
            var next = j + 1 < count ? labels[j + 1] : -1;
            var rivals = total;

            // Substitutions: γ(t) = paths of frames 0..t that sit in state q emitting c at t. Sums run over the
            // frames from the previous character's first to the next character's last (best path): a rival placed
            // outside them would have to move its neighbours too, which costs far more than it adds.
            var (first, last) = spans[j].First < 0 ? (0, frames - 1) : spans[j];
            var from = j > 0 && spans[j - 1].First >= 0 ? spans[j - 1].First : 0;
            var to = j + 1 < count && spans[j + 1].Last >= 0 ? spans[j + 1].Last : frames - 1;
            if (!exact) { first = Math.Max(0, first - 1); last = Math.Min(frames - 1, last + 1); }
            else { from = 0; to = frames - 1; first = 0; last = frames - 1; }
            foreach (var c in Rivals(posteriors, labels[j], first, last, floor, exact ? int.MaxValue : MaxRivals))
            {
                double gamma = ninf, p = ninf;
                for (var t = from; t <= to; t++)
                {
                    var enter = t == 0
                        ? (j == 0 ? 0 : ninf)
                        : LogSpace.Add(alpha[t - 1, q - 1], j > 0 && c != previous ? alpha[t - 1, q - 2] : ninf);
                    gamma = LogSpace.Add(gamma, enter) + Y(t, c);
                    double leave;
                    if (t == frames - 1) leave = j == count - 1 ? 0 : ninf;
                    else
                    {
                        leave = Y(t + 1, 0) + beta[t + 1, q + 1];
                        if (next >= 0 && c != next) leave = LogSpace.Add(leave, Y(t + 1, next) + beta[t + 1, q + 2]);
                    }
                    p = LogSpace.Add(p, gamma + leave);
                }
                rivals = LogSpace.Add(rivals, p);
            }

            // Deletion: the blanks either side of l_j merge into one; a path is counted at the frame it leaves that blank.
            var deleted = ninf;
            for (var t = from; t <= to; t++)
            {
                double exit;
                if (t == frames - 1) exit = next < 0 ? 0 : ninf;
                else exit = next < 0 ? ninf : Y(t + 1, next) + beta[t + 1, q + 2];
                deleted = LogSpace.Add(deleted, alpha[t, q - 1] + exit);
                // Straight from l_{j−1} to l_{j+1}, allowed when they differ.
                if (j > 0 && next >= 0 && previous != next && t < frames - 1)
                    deleted = LogSpace.Add(deleted, alpha[t, q - 2] + Y(t + 1, next) + beta[t + 1, q + 2]);
            }
            if (j == 0 && next >= 0) deleted = LogSpace.Add(deleted, Y(0, next) + beta[0, q + 2]); // starts at l_{j+1}
            if (j == count - 1 && j > 0) deleted = LogSpace.Add(deleted, alpha[frames - 1, q - 2]);   // ends at l_{j−1}
            rivals = LogSpace.Add(rivals, deleted);

            result[j] = double.IsNegativeInfinity(total) ? 0 : Math.Exp(total - rivals);
        }
        return result;
    }

    private static IEnumerable<int> Rivals(Posteriors posteriors, int chosen, int first, int last, double floor, int max)
    {
        var best = new List<(double LogP, int Class)>();
        for (var c = 1; c < posteriors.Classes; c++)
        {
            if (c == chosen) continue;
            var peak = double.NegativeInfinity;
            for (var t = first; t <= last; t++) peak = Math.Max(peak, posteriors[t, c]);
            if (peak >= floor) best.Add((peak, c));
        }
        return best.OrderByDescending(b => b.LogP).ThenBy(b => b.Class).Take(max).Select(b => b.Class);
    }
}
