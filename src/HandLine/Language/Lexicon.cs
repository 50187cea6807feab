using System.Globalization;
using System.Text;
using HandLine.Formats;

namespace HandLine.Language;

/// <summary>
/// A word list for lexicon decoding. A word is a run of letters (Unicode letters, NFC); digits, punctuation,
/// symbols and spaces are never part of a word, so they stay free when words are constrained. Besides each
/// listed spelling, its Capitalised and UPPER forms are accepted ("barley" admits "Barley" and "BARLEY").
/// </summary>
public sealed class Lexicon
{
    private const string Stage = "lexicon";
    private static readonly UTF8Encoding StrictUtf8 = new(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true);

    private readonly Dictionary<string, long> _counts;
    private readonly Dictionary<string, int> _lineOf;
    private readonly HashSet<string> _accepted;

    private Lexicon(string source, Dictionary<string, long> counts, Dictionary<string, int> lineOf)
    {
        Source = source;
        _counts = counts;
        _lineOf = lineOf;
        _accepted = new HashSet<string>(counts.Keys.SelectMany(CaseVariants), StringComparer.Ordinal);
    }

    /// <summary>The file the list came from, or a description for lists built in code; used in messages.</summary>
    public string Source { get; }

    /// <summary>Listed spellings and their counts (1 when the file gives none; repeats add up).</summary>
    public IReadOnlyDictionary<string, long> Counts => _counts;

    /// <summary>Every accepted spelling: the listed ones and their case variants.</summary>
    public IReadOnlySet<string> Accepted => _accepted;

    public bool Accepts(string word)
    {
        ArgumentNullException.ThrowIfNull(word);
        return _accepted.Contains(TextUnits.ToNfc(word));
    }

    /// <summary>The 1-based file line a listed spelling first came from (0 for lists built in code).</summary>
    public int LineOf(string word) => _lineOf.GetValueOrDefault(word);

    /// <summary>The spelling as listed, Capitalised (first letter upper case) and UPPER.</summary>
    public static IEnumerable<string> CaseVariants(string word)
    {
        ArgumentNullException.ThrowIfNull(word);
        yield return word;
        if (word.Length == 0) yield break;
        var first = Rune.GetRuneAt(word, 0);
        yield return Rune.ToUpperInvariant(first) + word[first.Utf16SequenceLength..];
        yield return word.ToUpperInvariant();
    }

    /// <summary>True for a code point that can be part of a word.</summary>
    public static bool IsWordCharacter(Rune rune) => Rune.IsLetter(rune);

    /// <summary>The words of a text: maximal runs of letters, NFC.</summary>
    public static IEnumerable<string> WordsIn(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var word = new StringBuilder();
        foreach (var rune in TextUnits.ToNfc(text).EnumerateRunes())
        {
            if (IsWordCharacter(rune)) { word.Append(rune.ToString()); continue; }
            if (word.Length > 0) { yield return word.ToString(); word.Clear(); }
        }
        if (word.Length > 0) yield return word.ToString();
    }

    /// <summary>A list built in code; every entry must be a word (letters only).</summary>
    public static Lexicon FromWords(IEnumerable<string> words)
    {
        ArgumentNullException.ThrowIfNull(words);
        var counts = new Dictionary<string, long>(StringComparer.Ordinal);
        foreach (var raw in words)
        {
            ArgumentNullException.ThrowIfNull(raw, nameof(words));
            var word = TextUnits.ToNfc(raw);
            if (Problem(word) is { } problem) throw new ArgumentException($"'{raw}': {problem}", nameof(words));
            counts[word] = counts.GetValueOrDefault(word) + 1;
        }
        if (counts.Count == 0) throw new ArgumentException("The word list is empty.", nameof(words));
        return new Lexicon("(word list)", counts, new Dictionary<string, int>());
    }

    /// <summary>
    /// Reads a UTF-8 word list: one word per line, optionally a tab and a whole-number count. Blank lines and
    /// lines starting with '#' are skipped; a byte-order mark and CR line ends are allowed.
    /// </summary>
    /// <exception cref="InputException">Stage "lexicon", naming the file and the first bad line.</exception>
    public static Lexicon Load(string path)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        var bytes = InputFile.ReadAllBytes(path, Stage, "word list");

        var counts = new Dictionary<string, long>(StringComparer.Ordinal);
        var lineOf = new Dictionary<string, int>(StringComparer.Ordinal);
        var lineNumber = 0;
        foreach (var raw in ByteLines.Split(bytes))
        {
            lineNumber++;
            string line;
            try
            {
                line = StrictUtf8.GetString(raw.Span);
            }
            catch (DecoderFallbackException)
            {
                throw Error(path, lineNumber, "not valid UTF-8");
            }
            if (line.Trim().Length == 0 || line[0] == '#') continue;

            var parts = line.Split('\t');
            if (parts.Length > 2) throw Error(path, lineNumber, "more than one tab; expected WORD or WORD<TAB>COUNT");
            long count = 1;
            if (parts.Length == 2 && !long.TryParse(parts[1].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out count))
                throw Error(path, lineNumber, $"the count '{parts[1]}' is not a whole number");
            var word = TextUnits.ToNfc(parts[0]);
            if (Problem(word) is { } problem) throw Error(path, lineNumber, problem);
            counts[word] = counts.GetValueOrDefault(word) + count;
            lineOf.TryAdd(word, lineNumber);
        }
        if (counts.Count == 0) throw new InputException(path, Stage, "the word list has no words");
        return new Lexicon(path, counts, lineOf);
    }

    private static string? Problem(string word)
    {
        if (word.Length == 0) return "the word is empty";
        foreach (var rune in word.EnumerateRunes())
        {
            if (!IsWordCharacter(rune))
                return Rune.IsWhiteSpace(rune)
                    ? $"'{word}' contains a space; list one word per line"
                    : $"'{word}' contains '{rune}', which is not a letter; list words as letters only (digits, punctuation and spaces are always allowed)";
        }
        return null;
    }

    private static InputException Error(string path, int lineNumber, string reason) => new(path, Stage, $"line {lineNumber}: {reason}");
}
