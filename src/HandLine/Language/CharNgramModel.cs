using HandLine.Formats;

namespace HandLine.Language;

/// <summary>
/// Interpolated Kneser–Ney character n-gram model (Chen &amp; Goodman 1998). Every order k from 1 to
/// <see cref="Order"/> keeps its n-gram counts — raw counts at the top order, continuation counts N1+(• g) below
/// it — and one absolute discount D_k. The next-symbol probability is
/// <code>
/// p_k(w | h) = max(c_k(h w) − D_k, 0) / Σ_v c_k(h v)  +  D_k · N1+(h •) / Σ_v c_k(h v) · p_{k−1}(w | h')
/// </code>
/// where h' drops the oldest symbol of h, an unseen context falls straight through to p_{k−1}, and p_0 is
/// uniform over the vocabulary (text symbols, end of line and one "other" symbol for characters never seen),
/// so every symbol keeps some probability and the distribution sums to 1.
/// </summary>
/// <remarks>
/// Symbols are packed one byte each into a 64-bit key, newest in the lowest byte, so a context is a number
/// and shortening it is a mask. Ids: 1 = start of line (context only), 2 = end of line, 3 = other, 4.. = text.
/// </remarks>
public sealed class CharNgramModel
{
    public const int MaxOrder = 8;
    public const int MaxSymbols = 252;
    internal const int StartId = 1;
    public const int EndId = 2;
    public const int OtherId = 3;
    internal const int FirstTextId = 4;

    private readonly Dictionary<string, int> _ids;
    private readonly Dictionary<ulong, int>[] _counts;           // [k-1]: n-gram (h w) of length k → count
    private readonly Dictionary<ulong, (long Total, int Distinct)>[] _contexts; // [k-1]: context h of length k-1
    private readonly double[] _discounts;                        // [k-1]: D_k

    internal CharNgramModel(int order, IReadOnlyList<string> symbols, IReadOnlyList<double> discounts, Dictionary<ulong, int>[] counts)
    {
        Order = order;
        Symbols = symbols.ToArray();
        _discounts = discounts.ToArray();
        _counts = counts;
        _ids = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var i = 0; i < Symbols.Count; i++) _ids[Symbols[i]] = FirstTextId + i;
        _contexts = new Dictionary<ulong, (long, int)>[order];
        for (var k = 0; k < order; k++)
        {
            var stats = new Dictionary<ulong, (long Total, int Distinct)>();
            foreach (var (key, count) in counts[k])
            {
                var h = key >> 8;
                var s = stats.GetValueOrDefault(h);
                stats[h] = (s.Total + count, s.Distinct + 1);
            }
            _contexts[k] = stats;
        }
    }

    public int Order { get; }

    /// <summary>The file the model was read from, for reports; a description for models built in memory.</summary>
    public string Source { get; internal init; } = "(built in memory)";

    /// <summary>Text symbols in id order (single NFC code points).</summary>
    public IReadOnlyList<string> Symbols { get; }

    public IReadOnlyList<double> Discounts => _discounts;

    /// <summary>Symbols a prediction ranges over: the text symbols, end of line and "other".</summary>
    public int VocabularySize => Symbols.Count + 2;

    /// <summary>Length of the id range (ids run 0..IdLimit-1; 0 and the start id are never predicted).</summary>
    public int IdLimit => FirstTextId + Symbols.Count;

    internal IReadOnlyList<Dictionary<ulong, int>> Counts => _counts;

    /// <summary>Distinct n-grams stored, over all orders.</summary>
    public int NgramCount => _counts.Sum(c => c.Count);

    /// <summary>Id of a symbol; characters never seen in training map to <see cref="OtherId"/>.</summary>
    public int IdOf(string symbol)
    {
        ArgumentNullException.ThrowIfNull(symbol);
        return _ids.GetValueOrDefault(symbol, OtherId);
    }

    /// <summary>The context at the start of a line: order − 1 start symbols.</summary>
    public ulong Start
    {
        get
        {
            ulong state = 0;
            for (var i = 0; i < Order - 1; i++) state = (state << 8) | StartId;
            return state;
        }
    }

    /// <summary>The context after <paramref name="id"/> follows <paramref name="state"/> (only the last order − 1 symbols are kept).</summary>
    public ulong Advance(ulong state, int id) => ((state << 8) | (uint)id) & Mask(Order - 1);

    /// <summary>p(id | state) by the recursion in the class summary.</summary>
    public double Probability(ulong state, int id)
    {
        if (id is < EndId || id >= IdLimit) throw new ArgumentOutOfRangeException(nameof(id));
        var p = 1.0 / VocabularySize;
        for (var k = 1; k <= Order; k++)
        {
            var h = state & Mask(k - 1);
            if (!_contexts[k - 1].TryGetValue(h, out var stats)) continue;
            var c = _counts[k - 1].GetValueOrDefault((h << 8) | (uint)id);
            var d = _discounts[k - 1];
            p = Math.Max(c - d, 0) / stats.Total + d * stats.Distinct / stats.Total * p;
        }
        return p;
    }

    /// <summary>Natural-log probabilities of every id after <paramref name="state"/>; ids 0 and start get −∞.</summary>
    public void LogDistribution(ulong state, Span<double> into)
    {
        if (into.Length < IdLimit) throw new ArgumentException($"Need room for {IdLimit} ids.", nameof(into));
        into[0] = into[StartId] = double.NegativeInfinity;
        for (var id = EndId; id < IdLimit; id++) into[id] = Math.Log(Probability(state, id));
    }

    /// <summary>p(next | text so far on this line); <paramref name="next"/> null means end of line.</summary>
    public double Probability(string context, string? next)
    {
        ArgumentNullException.ThrowIfNull(context);
        var state = Start;
        foreach (var rune in TextUnits.ToNfc(context).EnumerateRunes()) state = Advance(state, IdOf(rune.ToString()));
        return Probability(state, next is null ? EndId : IdOf(TextUnits.ToNfc(next)));
    }

    /// <summary>Average bits per symbol (characters and each line's end) over held-out lines: the cross-entropy.</summary>
    public double BitsPerCharacter(IEnumerable<string> lines)
    {
        ArgumentNullException.ThrowIfNull(lines);
        double bits = 0;
        long symbols = 0;
        foreach (var line in lines)
        {
            var state = Start;
            foreach (var rune in TextUnits.ToNfc(line).EnumerateRunes())
            {
                var id = IdOf(rune.ToString());
                bits -= Math.Log2(Probability(state, id));
                state = Advance(state, id);
                symbols++;
            }
            bits -= Math.Log2(Probability(state, EndId));
            symbols++;
        }
        return symbols == 0 ? 0 : bits / symbols;
    }

    internal static ulong Mask(int symbols) => symbols >= 8 ? ulong.MaxValue : (1UL << (8 * symbols)) - 1;
}
