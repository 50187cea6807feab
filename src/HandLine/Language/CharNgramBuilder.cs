using HandLine.Formats;

namespace HandLine.Language;

/// <summary>Counts the n-grams of training lines and turns them into a <see cref="CharNgramModel"/>.</summary>
public static class CharNgramBuilder
{
    /// <summary>
    /// Builds the model. Each line is NFC-normalised, padded with order − 1 start symbols and closed with an
    /// end symbol. Continuation counts of order k are the number of distinct symbols seen before each k-gram
    /// (Chen &amp; Goodman 1998); with full start padding every counted k-gram has such a left neighbour.
    /// </summary>
    public static CharNgramModel Build(IEnumerable<string> lines, int order)
    {
        ArgumentNullException.ThrowIfNull(lines);
        if (order is < 1 or > CharNgramModel.MaxOrder)
            throw new ArgumentOutOfRangeException(nameof(order), $"order must be 1 to {CharNgramModel.MaxOrder}");

        var texts = lines.Select(l => TextUnits.ToNfc(l ?? throw new ArgumentException("A line is null.", nameof(lines)))).ToList();
        var symbols = texts.SelectMany(t => t.EnumerateRunes().Select(r => r.ToString())).Distinct().Order(StringComparer.Ordinal).ToArray();
        if (symbols.Length > CharNgramModel.MaxSymbols)
            throw new ArgumentException($"The text has {symbols.Length} distinct characters; at most {CharNgramModel.MaxSymbols} are supported.", nameof(lines));
        var ids = symbols.Select((s, i) => (s, i)).ToDictionary(p => p.s, p => CharNgramModel.FirstTextId + p.i, StringComparer.Ordinal);

        var counts = new Dictionary<ulong, int>[order];
        for (var k = 0; k < order; k++) counts[k] = new Dictionary<ulong, int>();
        var top = counts[order - 1];
        var mask = CharNgramModel.Mask(order);
        foreach (var text in texts)
        {
            ulong window = 0;
            for (var i = 0; i < order - 1; i++) window = (window << 8) | CharNgramModel.StartId;
            foreach (var rune in text.EnumerateRunes())
            {
                window = ((window << 8) | (uint)ids[rune.ToString()]) & mask;
                top[window] = top.GetValueOrDefault(window) + 1;
            }
            window = ((window << 8) | CharNgramModel.EndId) & mask;
            top[window] = top.GetValueOrDefault(window) + 1;
        }

        // Continuation counts: every distinct (k+1)-gram "x g" adds one to g.
        for (var k = order - 1; k >= 1; k--)
        {
            var lower = counts[k - 1];
            var m = CharNgramModel.Mask(k);
            foreach (var key in counts[k].Keys)
                lower[key & m] = lower.GetValueOrDefault(key & m) + 1;
        }

        var discounts = counts.Select(Discount).ToArray();
        return new CharNgramModel(order, symbols, discounts, counts);
    }

    /// <summary>
    /// D = n1 / (n1 + 2·n2) over the counts used at that order (Chen &amp; Goodman 1998, after Ney et al.); when
    /// there are no count-1 or no count-2 n-grams the estimate is degenerate and 0.5 is used instead
    /// (common practice, no source).
    /// </summary>
    internal static double Discount(Dictionary<ulong, int> counts)
    {
        long n1 = counts.Values.Count(c => c == 1), n2 = counts.Values.Count(c => c == 2);
        return n1 == 0 || n2 == 0 ? 0.5 : (double)n1 / (n1 + 2 * n2);
    }
}
