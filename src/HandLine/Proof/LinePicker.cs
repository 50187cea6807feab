using System.Buffers.Binary;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>
/// Chooses the run lines whose correction should teach a model the most, for <c>review --pick</c> and
/// <c>sample --pick</c>: lines the model is least sure of, that hold the characters it is least sure of across the
/// whole run, spread over the run's sources so that one bad page cannot fill the pick. Lines an editor has already
/// checked are left out. The choice is greedy: each step takes the line with the largest gain, where a doubtful
/// character counts less each time an earlier pick already holds it (so the pick is not N copies of one problem),
/// and a source may hold no more than its share of the pick while other sources still have lines to offer.
/// Ties are broken by a key drawn from the seed, so the same run and seed give the same pick.
/// </summary>
public static class LinePicker
{
    /// <summary>
    /// A character below this confidence counts as doubtful (the review page's default threshold; a rule of thumb,
    /// common practice, no source).
    /// </summary>
    public const double DoubtBelow = 0.75;

    /// <summary>
    /// Weight of the doubtful characters a line would newly cover against the line's own doubt (1 - confidence).
    /// A rule of thumb (common practice, no source): a line holding two uncovered characters of average doubt 0.5
    /// gains about as much as 25 points less line confidence.
    /// </summary>
    public const double CoverageWeight = 0.25;

    /// <summary>A line whose machine text repeats one already picked gains only this share: one copy teaches it.</summary>
    public const double RepeatShare = 0.1;

    /// <summary>Reads the run's <c>lines.jsonl</c> and picks up to <paramref name="count"/> unchecked lines.</summary>
    /// <exception cref="InputException">The run's lines cannot be read.</exception>
    public static IReadOnlyList<PickCandidate> Pick(string runDir, int count, int seed)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        return Pick(ReadCandidates(runDir), count, seed);
    }

    /// <summary>Up to <paramref name="count"/> of the candidates, in the order they were picked (most valuable first).</summary>
    public static IReadOnlyList<PickCandidate> Pick(IReadOnlyList<PickCandidate> candidates, int count, int seed)
    {
        ArgumentNullException.ThrowIfNull(candidates);
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 1);
        var doubt = SymbolDoubt(candidates);
        var covered = new Dictionary<string, int>(StringComparer.Ordinal);
        var pickedTexts = new HashSet<string>(StringComparer.Ordinal);
        var perSource = new Dictionary<string, int>(StringComparer.Ordinal);
        var sources = candidates.Select(c => c.Source).Distinct(StringComparer.Ordinal).Count();
        var share = sources == 0 ? 0 : (count + sources - 1) / sources;
        var doubtful = candidates.Select(c => c.Chars.Where(x => x.Confidence < DoubtBelow).Select(x => x.Symbol).Distinct(StringComparer.Ordinal).ToArray()).ToArray();

        double Gain(int i)
        {
            var c = candidates[i];
            var gain = 1 - Math.Clamp(c.Confidence, 0, 1);
            foreach (var s in doubtful[i])
                gain += CoverageWeight * doubt[s] / (1 + covered.GetValueOrDefault(s));
            return pickedTexts.Contains(c.Text) ? gain * RepeatShare : gain;
        }

        // Lazy greedy: a line's gain can only fall as others are picked, so a popped line whose gain, worked out
        // again, still beats the next stored one is the best there is.
        var queue = new PriorityQueue<int, (double Gain, ulong Tie)>(Comparer<(double Gain, ulong Tie)>.Create((a, b) =>
            a.Gain != b.Gain ? b.Gain.CompareTo(a.Gain) : a.Tie.CompareTo(b.Tie)));
        var ties = candidates.Select(c => TieKey(seed, c)).ToArray();
        for (var i = 0; i < candidates.Count; i++)
            queue.Enqueue(i, (Gain(i), ties[i]));
        var held = new List<int>();
        var picked = new List<PickCandidate>();
        while (picked.Count < count)
        {
            if (queue.Count == 0)
            {
                if (held.Count == 0) break;
                // Every source with lines left is at its share: the others have none to give, so the share grows.
                share++;
                foreach (var i in held) queue.Enqueue(i, (Gain(i), ties[i]));
                held.Clear();
                continue;
            }
            var best = queue.Dequeue();
            if (perSource.GetValueOrDefault(candidates[best].Source) >= share)
            {
                held.Add(best);
                continue;
            }
            var gain = Gain(best);
            if (queue.TryPeek(out _, out var next) && gain < next.Gain)
            {
                queue.Enqueue(best, (gain, ties[best]));
                continue;
            }
            var c = candidates[best];
            picked.Add(c);
            perSource[c.Source] = perSource.GetValueOrDefault(c.Source) + 1;
            pickedTexts.Add(c.Text);
            foreach (var s in doubtful[best])
                covered[s] = covered.GetValueOrDefault(s) + 1;
        }
        return picked;
    }

    /// <summary>How unsure the model is of each symbol over the whole run: its mean (1 - confidence).</summary>
    private static Dictionary<string, double> SymbolDoubt(IEnumerable<PickCandidate> candidates)
    {
        var sums = new Dictionary<string, (double Sum, int Count)>(StringComparer.Ordinal);
        foreach (var c in candidates)
            foreach (var (symbol, confidence) in c.Chars)
            {
                var (sum, n) = sums.GetValueOrDefault(symbol);
                sums[symbol] = (sum + 1 - Math.Clamp(confidence, 0, 1), n + 1);
            }
        return sums.ToDictionary(p => p.Key, p => p.Value.Sum / p.Value.Count, StringComparer.Ordinal);
    }

    private static ulong TieKey(int seed, PickCandidate c)
    {
        var hash = SHA256.HashData(Encoding.UTF8.GetBytes($"{seed}\0{c.Source}\0{c.Line}"));
        return BinaryPrimitives.ReadUInt64LittleEndian(hash);
    }

    /// <summary>The run's lines that no editor has checked yet (<c>corrected</c> is not true).</summary>
    /// <exception cref="InputException">Stage "run": no lines.jsonl, or a record that is not valid.</exception>
    public static IReadOnlyList<PickCandidate> ReadCandidates(string runDir)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        var lines = RunReader.ReadLines(runDir);
        var bytes = RunReader.ReadLinesFile(runDir, out _);
        var extra = new Dictionary<(string, int), (bool Corrected, List<(string, double)> Chars)>();
        foreach (var raw in ByteLines.Split(bytes))
        {
            if (raw.Span.Trim(" \t"u8).Length == 0)
                continue;
            // ReadLines has checked every record already.
            using var doc = JsonDocument.Parse(raw);
            var root = doc.RootElement;
            var chars = new List<(string, double)>();
            if (root.TryGetProperty("chars", out var array) && array.ValueKind == JsonValueKind.Array)
                foreach (var ch in array.EnumerateArray())
                    if (ch.ValueKind == JsonValueKind.Object && ch.TryGetProperty("char", out var s) && s.ValueKind == JsonValueKind.String
                        && ch.TryGetProperty("confidence", out var v) && v.ValueKind == JsonValueKind.Number)
                        chars.Add((s.GetString()!, v.GetDouble()));
            var corrected = root.TryGetProperty("corrected", out var k) && k.ValueKind == JsonValueKind.True;
            extra[(root.GetProperty("source").GetString()!, root.GetProperty("line").GetInt32())] = (corrected, chars);
        }
        return lines.Where(l => !extra[(l.Source, l.Line)].Corrected)
            .Select(l => new PickCandidate(l.Source, l.Line, l.Text, l.Confidence ?? 0, extra[(l.Source, l.Line)].Chars))
            .ToArray();
    }
}
