using System.Text;
using HandLine.Formats;

namespace HandLine.Model;

/// <summary>
/// The symbols a model can emit. Index 0 of the model's output is the CTC blank; symbol i of this set
/// is output i + 1. Symbols are single Unicode code points (NFC), so scoring and decoding agree.
/// </summary>
public sealed class CharacterSet
{
    /// <summary>Ledger and register text: letters, digits, common punctuation, money and fractions.</summary>
    public const string DefaultSymbols =
        " !\"&'()*+,-./0123456789:;=?ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz£¼½¾";

    private readonly string[] _symbols;
    private readonly Dictionary<string, int> _index;

    public CharacterSet(IEnumerable<string> symbols)
    {
        ArgumentNullException.ThrowIfNull(symbols);
        _symbols = symbols.ToArray();
        _index = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var i = 0; i < _symbols.Length; i++)
        {
            var s = _symbols[i];
            if (s.EnumerateRunes().Count() != 1)
                throw new ArgumentException($"Symbol '{s}' is not a single code point.", nameof(symbols));
            if (!_index.TryAdd(s, i))
                throw new ArgumentException($"Symbol '{s}' appears twice.", nameof(symbols));
        }
    }

    public static CharacterSet Default { get; } = FromString(DefaultSymbols);

    public static CharacterSet FromString(string symbols) =>
        new(TextUnits.ToNfc(symbols).EnumerateRunes().Select(r => r.ToString()));

    /// <summary>Number of symbols, excluding the blank.</summary>
    public int Count => _symbols.Length;

    /// <summary>Model output width: symbols plus the CTC blank.</summary>
    public int ClassCount => _symbols.Length + 1;

    public IReadOnlyList<string> Symbols => _symbols;

    /// <summary>Symbol for model output class (class 0 is the blank and has none).</summary>
    public string SymbolOf(int classIndex) => _symbols[classIndex - 1];

    public bool Contains(string symbol) => _index.ContainsKey(symbol);

    /// <summary>Model classes (1-based) for a text; throws naming the first symbol outside the set.</summary>
    public int[] Encode(string text)
    {
        var runes = TextUnits.ToNfc(text).EnumerateRunes().ToArray();
        var classes = new int[runes.Length];
        for (var i = 0; i < runes.Length; i++)
        {
            var s = runes[i].ToString();
            if (!_index.TryGetValue(s, out var k))
                throw new ArgumentException(
                    $"Character '{s}' (U+{runes[i].Value:X4}) is not in the character set.", nameof(text));
            classes[i] = k + 1;
        }
        return classes;
    }

    /// <summary>
    /// The symbols of the texts that are not in this set, each once, in code point order: the same texts give
    /// the same order whatever order they come in, so a grown model's classes do not depend on line order.
    /// </summary>
    public IReadOnlyList<string> MissingSymbols(IEnumerable<string> texts)
    {
        ArgumentNullException.ThrowIfNull(texts);
        var missing = new SortedSet<Rune>();
        foreach (var text in texts)
            foreach (var r in TextUnits.ToNfc(text).EnumerateRunes())
                if (!_index.ContainsKey(r.ToString()))
                    missing.Add(r);
        return missing.Select(r => r.ToString()).ToArray();
    }

    /// <summary>
    /// This set with <paramref name="symbols"/> added at the end, so every existing symbol keeps its class.
    /// Throws for a symbol already in the set, or one the model file could not store (see below).
    /// </summary>
    public CharacterSet Append(IEnumerable<string> symbols)
    {
        ArgumentNullException.ThrowIfNull(symbols);
        var added = symbols.ToArray();
        foreach (var s in added)
            if (Contains(s))
                throw new ArgumentException($"Symbol '{s}' is already in the character set.", nameof(symbols));
        var grown = new CharacterSet(_symbols.Concat(added));
        // A model file stores the set as one NFC string, so a symbol that normalises differently, or that
        // composes with the symbol before it (a combining accent after a new letter), would not come back.
        var stored = FromString(grown.ToString());
        if (!stored.Symbols.SequenceEqual(grown.Symbols, StringComparer.Ordinal))
        {
            var bad = added.FirstOrDefault(s => !stored.Contains(s)) ?? added[0];
            throw new ArgumentException(
                $"Symbol '{bad}' (U+{Rune.GetRuneAt(bad, 0).Value:X4}) would not survive Unicode normalisation (NFC) in the model file.",
                nameof(symbols));
        }
        return grown;
    }

    /// <summary>True when every character of the text is in the set.</summary>
    public bool CanEncode(string text) =>
        TextUnits.ToNfc(text).EnumerateRunes().All(r => _index.ContainsKey(r.ToString()));

    public override string ToString() => string.Concat(_symbols);
}
