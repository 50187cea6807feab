using System.Text;
using HandLine.Language;
using HandLine.Model;

namespace HandLine.Decoding;

/// <summary>
/// The accepted spellings of a <see cref="Lexicon"/> as a prefix tree over a model's classes. Node 0 is the
/// root (no letters yet); a word's letters lead from it to a node marked as a word end.
/// </summary>
internal sealed class LexiconTrie
{
    public const int Root = 0;

    private readonly Dictionary<long, int> _children = new();
    private readonly List<bool> _isWord = [false];
    private readonly int _classes;

    public LexiconTrie(Lexicon lexicon, CharacterSet charset)
    {
        _classes = charset.ClassCount;
        IsLetterClass = new bool[charset.ClassCount];
        for (var c = 1; c < charset.ClassCount; c++)
            IsLetterClass[c] = Lexicon.IsWordCharacter(Rune.GetRuneAt(charset.SymbolOf(c), 0));

        foreach (var listed in lexicon.Counts.Keys.Order(StringComparer.Ordinal))
        {
            foreach (var word in Lexicon.CaseVariants(listed).Distinct())
            {
                var missing = word.EnumerateRunes().Select(r => r.ToString()).FirstOrDefault(s => !charset.Contains(s));
                if (missing is not null)
                {
                    // Only the listed spelling is the user's mistake; an upper-case form the model cannot write is just not offered.
                    if (word != listed) continue;
                    var line = lexicon.LineOf(listed);
                    throw new InputException(lexicon.Source, "lexicon",
                        (line > 0 ? $"line {line}: " : "") + $"'{listed}' contains '{missing}', which the model cannot write");
                }
                var node = Root;
                foreach (var cls in charset.Encode(word))
                {
                    var key = (long)node * _classes + cls;
                    if (!_children.TryGetValue(key, out var next))
                    {
                        next = _isWord.Count;
                        _isWord.Add(false);
                        _children[key] = next;
                    }
                    node = next;
                }
                _isWord[node] = true;
            }
        }
    }

    /// <summary>True for classes whose symbol is a letter, i.e. part of a word.</summary>
    public bool[] IsLetterClass { get; }

    public int NodeCount => _isWord.Count;

    /// <summary>The node after letter class <paramref name="cls"/>, or −1 when no accepted word continues that way.</summary>
    public int Child(int node, int cls) => _children.GetValueOrDefault((long)node * _classes + cls, -1);

    public bool IsWord(int node) => _isWord[node];
}
