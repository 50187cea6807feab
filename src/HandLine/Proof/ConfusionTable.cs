using System.Text;
using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>
/// Counts the substitutions, deletions and insertions of one optimal character alignment per line (the alignment
/// CER counts, <see cref="EditDistance.TraceCharacters"/>), most frequent first. Lines the run did not produce
/// are left out: all their characters would be deletions and hide the machine's real confusions.
/// </summary>
public static class ConfusionTable
{
    /// <summary>Every distinct error with its count; ties by kind, then truth, then machine text (ordinal).</summary>
    public static IReadOnlyList<Confusion> Of(IEnumerable<LineScore> lines)
    {
        ArgumentNullException.ThrowIfNull(lines);
        var counts = new Dictionary<(ConfusionKind, string, string), int>();
        foreach (var line in lines)
        {
            ArgumentNullException.ThrowIfNull(line, nameof(lines));
            if (line.Missing || line.CharCounts.Distance == 0)
                continue;
            var truth = TextUnits.CodePoints(line.Truth);
            var machine = TextUnits.CodePoints(line.Hypothesis ?? "");
            var alignment = EditDistance.Trace<int>(truth, machine);
            var paired = new bool[truth.Length];
            for (var j = 0; j < machine.Length; j++)
            {
                var t = alignment.TruthIndex[j];
                if (t < 0)
                    Add(ConfusionKind.Insertion, "", Char(machine[j]));
                else
                {
                    paired[t] = true;
                    if (!alignment.HypothesisHits[j])
                        Add(ConfusionKind.Substitution, Char(truth[t]), Char(machine[j]));
                }
            }
            for (var i = 0; i < truth.Length; i++)
                if (!paired[i])
                    Add(ConfusionKind.Deletion, Char(truth[i]), "");
        }
        return counts
            .Select(p => new Confusion(p.Key.Item1, p.Key.Item2, p.Key.Item3, p.Value))
            .OrderByDescending(c => c.Count).ThenBy(c => c.Kind)
            .ThenBy(c => c.Truth, StringComparer.Ordinal).ThenBy(c => c.Machine, StringComparer.Ordinal)
            .ToArray();

        void Add(ConfusionKind kind, string truth, string machine)
        {
            var key = (kind, truth, machine);
            counts[key] = counts.GetValueOrDefault(key) + 1;
        }
    }

    private static string Char(int codePoint) => new Rune(codePoint).ToString();
}
