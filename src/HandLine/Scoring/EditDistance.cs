using HandLine.Formats;

namespace HandLine.Scoring;

/// <summary>
/// Levenshtein alignment by the dynamic programme of Wagner and Fischer (1974): O(n·m) time and
/// O(min(n, m)) memory. Each cell carries the S/D/I/hit counts of the path that reaches it, so the
/// result comes from one optimal alignment without storing the whole matrix for a trace-back.
/// </summary>
/// <remarks>
/// Tie-break, applied in every cell: a substitution or hit first, then a deletion, then an insertion.
/// The counts equal those of the trace-back from the last cell under the same preference. Only the
/// first choice can change the counts: for a fixed distance, D − I = |truth| − |hypothesis|, so S alone
/// decides the split, and the deletion/insertion order only moves where the gaps sit.
/// </remarks>
public static class EditDistance
{
    public static EditCounts Align<T>(ReadOnlySpan<T> truth, ReadOnlySpan<T> hypothesis)
        where T : IEquatable<T> =>
        // The shorter sequence runs along the row buffer; the tie-break is stated in truth terms,
        // so it does not depend on which way round the matrix is laid out.
        hypothesis.Length <= truth.Length
            ? Run(truth, hypothesis, rowsAreTruth: true)
            : Run(hypothesis, truth, rowsAreTruth: false);

    /// <summary>Character-level alignment over NFC code points (the units of CER).</summary>
    public static EditCounts AlignCharacters(string truth, string hypothesis)
    {
        ArgumentNullException.ThrowIfNull(truth);
        ArgumentNullException.ThrowIfNull(hypothesis);
        return Align<int>(TextUnits.CodePoints(truth), TextUnits.CodePoints(hypothesis));
    }

    /// <summary>Word-level alignment over NFC, whitespace-separated words (the units of WER).</summary>
    public static EditCounts AlignWords(string truth, string hypothesis)
    {
        ArgumentNullException.ThrowIfNull(truth);
        ArgumentNullException.ThrowIfNull(hypothesis);
        return Align<string>(TextUnits.Words(truth), TextUnits.Words(hypothesis));
    }

    /// <summary>
    /// The same optimal alignment as <see cref="AlignCharacters"/> (same counts, same tie-break), traced back
    /// over the full matrix so it can say which hypothesis characters are hits. O(n·m) memory: meant for lines.
    /// </summary>
    public static UnitAlignment TraceCharacters(string truth, string hypothesis)
    {
        ArgumentNullException.ThrowIfNull(truth);
        ArgumentNullException.ThrowIfNull(hypothesis);
        return Trace<int>(TextUnits.CodePoints(truth), TextUnits.CodePoints(hypothesis));
    }

    /// <summary>Full-matrix version of <see cref="Align{T}"/> that also reports where each unit went.</summary>
    public static UnitAlignment Trace<T>(ReadOnlySpan<T> truth, ReadOnlySpan<T> hypothesis)
        where T : IEquatable<T>
    {
        var comparer = EqualityComparer<T>.Default;
        int n = truth.Length, m = hypothesis.Length;
        // cells[i, j]: best counts aligning truth[..i] with hypothesis[..j], with the same preference as Run.
        var cells = new Cell[n + 1, m + 1];
        var moves = new byte[n + 1, m + 1]; // 0 diagonal, 1 deletion (up), 2 insertion (left)
        for (var j = 1; j <= m; j++) { cells[0, j] = cells[0, j - 1].Insert(); moves[0, j] = 2; }
        for (var i = 1; i <= n; i++)
        {
            cells[i, 0] = cells[i - 1, 0].Delete();
            moves[i, 0] = 1;
            for (var j = 1; j <= m; j++)
            {
                var best = comparer.Equals(truth[i - 1], hypothesis[j - 1]) ? cells[i - 1, j - 1].Hit() : cells[i - 1, j - 1].Substitute();
                byte move = 0;
                var deletion = cells[i - 1, j].Delete();
                var insertion = cells[i, j - 1].Insert();
                if (deletion.Distance < best.Distance) { best = deletion; move = 1; }
                if (insertion.Distance < best.Distance) { best = insertion; move = 2; }
                cells[i, j] = best;
                moves[i, j] = move;
            }
        }

        var hits = new bool[m];
        var deletionsBefore = new int[m + 1];
        var truthIndex = new int[m];
        for (int i = n, j = m; i > 0 || j > 0;)
        {
            switch (moves[i, j])
            {
                case 0:
                    hits[j - 1] = comparer.Equals(truth[i - 1], hypothesis[j - 1]);
                    truthIndex[j - 1] = i - 1;
                    i--; j--;
                    break;
                case 1:
                    deletionsBefore[j]++;
                    i--;
                    break;
                default:
                    truthIndex[j - 1] = -1;
                    j--;
                    break;
            }
        }
        var last = cells[n, m];
        return new UnitAlignment(new EditCounts(last.S, last.D, last.I, last.H), hits, deletionsBefore, truthIndex);
    }

    /// <summary>
    /// Fills the matrix row by row. A step down consumes one unit of <paramref name="rows"/>, a step
    /// across one unit of <paramref name="cols"/>; which of those is a deletion depends on which
    /// sequence is the truth.
    /// </summary>
    private static EditCounts Run<T>(ReadOnlySpan<T> rows, ReadOnlySpan<T> cols, bool rowsAreTruth)
        where T : IEquatable<T>
    {
        var comparer = EqualityComparer<T>.Default;
        var prev = new Cell[cols.Length + 1];
        var cur = new Cell[cols.Length + 1];
        for (var j = 1; j <= cols.Length; j++)
            prev[j] = rowsAreTruth ? prev[j - 1].Insert() : prev[j - 1].Delete();

        for (var i = 1; i <= rows.Length; i++)
        {
            cur[0] = rowsAreTruth ? prev[0].Delete() : prev[0].Insert();
            for (var j = 1; j <= cols.Length; j++)
            {
                var best = comparer.Equals(rows[i - 1], cols[j - 1]) ? prev[j - 1].Hit() : prev[j - 1].Substitute();
                var deletion = rowsAreTruth ? prev[j].Delete() : cur[j - 1].Delete();
                var insertion = rowsAreTruth ? cur[j - 1].Insert() : prev[j].Insert();
                // Strict '<' keeps the earlier candidate on a tie: substitution/hit, deletion, insertion.
                if (deletion.Distance < best.Distance)
                    best = deletion;
                if (insertion.Distance < best.Distance)
                    best = insertion;
                cur[j] = best;
            }
            (prev, cur) = (cur, prev);
        }

        var last = prev[cols.Length];
        return new EditCounts(last.S, last.D, last.I, last.H);
    }

    /// <summary>Counts of the best path found so far into one matrix cell.</summary>
    private readonly record struct Cell(int S, int D, int I, int H)
    {
        public int Distance => S + D + I;

        public Cell Hit() => this with { H = H + 1 };

        public Cell Substitute() => this with { S = S + 1 };

        public Cell Delete() => this with { D = D + 1 };

        public Cell Insert() => this with { I = I + 1 };
    }
}
