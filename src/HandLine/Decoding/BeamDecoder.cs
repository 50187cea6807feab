using System.Text;
using HandLine.Language;
using HandLine.Model;

namespace HandLine.Decoding;

/// <summary>
/// CTC prefix beam search (Graves 2012, sec. 7.5; Hannun et al. 2014, algorithm 1) in natural-log space. Each
/// prefix keeps the log probability of the frame paths that collapse to it ending in a blank (p_b) and ending
/// in its last character (p_nb). After each frame the <see cref="DecodingOptions.Beam"/> prefixes with the best
/// combined score are kept:
/// <code>score(l) = log(p_b + p_nb) + α·log P_lm(l) + β·|l| − penalties</code>
/// where the language model term (Hannun et al. 2014, eq. 2, here per character) includes the end of line once
/// the last frame is reached, and the penalties are the soft lexicon's per unlisted word. A strict lexicon
/// removes any prefix whose current word cannot grow into a listed word.
/// </summary>
/// <remarks>
/// <para>Ties in score are broken by the label sequence (class order, a prefix before its extensions), so the
/// result never depends on hash or insertion order.</para>
/// <para>Confidences. The final beam's texts get shares s_i = exp(score_i) / Σ_j exp(score_j); the line confidence
/// is the chosen text's share. A character's confidence is its posterior against the readings that differ from the
/// chosen text only at that place (see <see cref="CharacterPosterior"/>), from the model's probabilities alone, so a
/// character that the lexicon or language model chose against the evidence shows as doubtful. (Agreement among the
/// final beam's texts was tried first and rejected: prefix beam search prunes early disagreements, so the final
/// texts differ mostly near the end of the line, and those confidences were badly over-confident.) When a strict lexicon leaves no complete text in
/// the final beam, the candidates become the final prefixes cut back to their last word boundary, scored exactly by the
/// forward recursion; the line then gets confidence 0, so it is always flagged.</para>
/// <para>Not thread-safe (it caches language model look-ups); use one per thread.</para>
/// </remarks>
public sealed class BeamDecoder
{
    private const int LexOutsideWord = LexiconTrie.Root;
    private const int LexUnlistedWord = -2;
    private const int CacheLimit = 200_000;

    private readonly CharacterSet _charset;
    private readonly DecodingOptions _options;
    private readonly LexiconTrie? _trie;
    private readonly int[]? _lmIdOfClass;
    private readonly Dictionary<ulong, double[]> _lmCache = new();

    public BeamDecoder(CharacterSet charset, DecodingOptions options)
    {
        ArgumentNullException.ThrowIfNull(charset);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        if (!options.UsesBeam) throw new ArgumentException("Beam search needs a beam width of 2 or more.", nameof(options));
        _charset = charset;
        _options = options;
        if (options.Lexicon is not null) _trie = new LexiconTrie(options.Lexicon, charset);
        if (options.LanguageModel is { } lm)
        {
            _lmIdOfClass = new int[charset.ClassCount];
            for (var c = 1; c < charset.ClassCount; c++) _lmIdOfClass[c] = lm.IdOf(charset.SymbolOf(c));
        }
    }

    public DecodingOptions Options => _options;

    private struct Node
    {
        public int Parent;
        public int Class;      // last label; 0 for the empty prefix
        public int Length;
        public ulong LmState;
        public int Lex;        // trie node, LexOutsideWord, or LexUnlistedWord
        public double Extra;   // α·log P_lm + β·length − lexicon penalties, so far
        public double Pb, Pnb, NextPb, NextPnb;
        public int Stamp;      // frame at which NextPb/NextPnb were last reset
        public int BeamFrame;  // frame for which this prefix is in the beam
    }

    public Hypothesis Decode(Posteriors posteriors)
    {
        ArgumentNullException.ThrowIfNull(posteriors);
        if (posteriors.Classes != _charset.ClassCount)
            throw new ArgumentException($"Posteriors have {posteriors.Classes} classes but the character set needs {_charset.ClassCount}.");
        if (posteriors.Frames == 0) return new Hypothesis("", [], 0);

        var run = new Run(this, posteriors);
        return run.Execute();
    }

    /// <summary>The state of one decode: the tree of prefixes seen and the current beam.</summary>
    private sealed class Run(BeamDecoder owner, Posteriors posteriors)
    {
        private Node[] _nodes = new Node[1024];
        private int _count;
        private readonly Dictionary<long, int> _child = new();
        private readonly int _classes = posteriors.Classes;

        public Hypothesis Execute()
        {
            var o = owner._options;
            var floor = o.CandidateFloor > 0 ? Math.Log(o.CandidateFloor) : double.NegativeInfinity;
            var root = NewNode(new Node
            {
                Parent = -1, Class = 0, LmState = o.LanguageModel?.Start ?? 0, Lex = LexOutsideWord,
                Pb = 0, Pnb = double.NegativeInfinity, Stamp = -1,
            });
            var beam = new List<int> { root };
            var touched = new List<int>();
            var candidates = new List<int>();
            var ranked = new List<(double Score, int Node)>();

            for (var t = 0; t < posteriors.Frames; t++)
            {
                touched.Clear();
                candidates.Clear();
                for (var c = 1; c < _classes; c++)
                    if (posteriors[t, c] >= floor) candidates.Add(c);
                var blank = (double)posteriors[t, 0];

                // Exact pruning: each prefix in a full beam scores at least its blank continuation this frame, so the
                // B-th best score will be at least the lowest of those. A new extension's score is at most its one
                // contribution plus its parent's extra and the bonus (language model and penalties only lower it),
                // so one that falls below this bound could never enter the beam and is not created.
                var bound = double.NegativeInfinity;
                if (beam.Count >= o.Beam)
                {
                    bound = double.PositiveInfinity;
                    foreach (var p in beam)
                        bound = Math.Min(bound, LogSpace.Add(_nodes[p].Pb, _nodes[p].Pnb) + blank + _nodes[p].Extra);
                }

                foreach (var p in beam)
                {
                    var pb = _nodes[p].Pb;
                    var pnb = _nodes[p].Pnb;
                    var last = _nodes[p].Class;
                    var total = LogSpace.Add(pb, pnb);
                    var ceiling = _nodes[p].Extra + Math.Max(0, o.CharBonus);
                    Accumulate(p, t, total + blank, double.NegativeInfinity, touched);
                    if (last > 0) Accumulate(p, t, double.NegativeInfinity, pnb + posteriors[t, last], touched);
                    foreach (var c in candidates)
                    {
                        // A repeated label needs a blank between, so only paths ending in a blank extend by it.
                        var add = (c == last ? pb : total) + posteriors[t, c];
                        // An extension already in the beam also collects its own paths, so it is never skipped.
                        if (add + ceiling < bound && !InBeam((long)p * _classes + c, t)) continue;
                        var child = ChildOf(p, c);
                        if (child < 0) continue;
                        Accumulate(child, t, double.NegativeInfinity, add, touched);
                    }
                }

                ranked.Clear();
                foreach (var n in touched)
                {
                    _nodes[n].Pb = _nodes[n].NextPb;
                    _nodes[n].Pnb = _nodes[n].NextPnb;
                    ranked.Add((Score(n), n));
                }
                // A prefix that drops out keeps stale p_b/p_nb, but they are only read again after Accumulate resets them.
                ranked.Sort((a, b) => Compare(a.Score, a.Node, b.Score, b.Node));
                beam.Clear();
                for (var i = 0; i < Math.Min(o.Beam, ranked.Count); i++)
                {
                    beam.Add(ranked[i].Node);
                    _nodes[ranked[i].Node].BeamFrame = t + 1;
                }
            }
            return Finish(beam);
        }

        private Hypothesis Finish(List<int> beam)
        {
            var o = owner._options;
            var finals = new List<(int Node, double Score)>();
            foreach (var n in beam)
            {
                var score = Score(n);
                var lex = _nodes[n].Lex;
                if (owner._trie is { } trie && lex > 0 && !trie.IsWord(lex))
                {
                    if (o.LexiconPenalty is not { } penalty) continue;
                    score -= penalty;
                }
                if (o.LanguageModel is not null)
                    score += o.LmWeight * LmRow(_nodes[n].LmState)[0];
                finals.Add((n, score));
            }

            // Strict lexicon and every surviving prefix ends inside an unfinished word: fall back to the texts cut
            // at each prefix's last word boundary, scored exactly by the forward recursion, and flag the line.
            var partial = finals.Count == 0;
            if (partial)
            {
                foreach (var n in beam.Select(CompleteAncestor).Distinct())
                {
                    var score = CtcAlignment.LogProbability(posteriors, LabelsOf(n)) + _nodes[n].Extra;
                    if (o.LanguageModel is not null) score += o.LmWeight * LmRow(_nodes[n].LmState)[0];
                    finals.Add((n, score));
                }
            }
            finals.Sort((a, b) => Compare(a.Score, a.Node, b.Score, b.Node));

            var top = finals[0].Score;
            var weights = finals.Select(f => Math.Exp(f.Score - top)).ToArray();
            var sum = weights.Sum();
            var shares = weights.Select(w => w / sum).ToArray();
            var labels = finals.Take(Math.Max(1, o.Alternatives)).Select(f => LabelsOf(f.Node)).ToArray();

            var chosen = labels[0];
            var spans = CtcAlignment.BestPath(posteriors, chosen);
            var confidence = CharacterPosterior.Compute(posteriors, chosen, spans, o.CandidateFloor);
            var chars = new CharConfidence[chosen.Length];
            for (var j = 0; j < chosen.Length; j++)
                chars[j] = new CharConfidence(owner._charset.SymbolOf(chosen[j]), confidence[j], spans[j].First, spans[j].Last);

            var alternatives = finals.Take(o.Alternatives)
                .Select((f, i) => new Alternative(TextOf(labels[i]), f.Score, shares[i])).ToArray();
            return new Hypothesis(TextOf(chosen), chars, partial ? 0 : shares[0]) { Alternatives = alternatives };
        }

        private bool InBeam(long childKey, int t) => _child.TryGetValue(childKey, out var n) && n >= 0 && _nodes[n].BeamFrame == t;

        /// <summary>The nearest prefix (itself or an ancestor) that does not end inside an unfinished word.</summary>
        private int CompleteAncestor(int n)
        {
            var trie = owner._trie!;
            while (_nodes[n].Lex > 0 && !trie.IsWord(_nodes[n].Lex)) n = _nodes[n].Parent;
            return n;
        }

        private void Accumulate(int n, int t, double pb, double pnb, List<int> touched)
        {
            ref var node = ref _nodes[n];
            if (node.Stamp != t)
            {
                node.Stamp = t;
                node.NextPb = double.NegativeInfinity;
                node.NextPnb = double.NegativeInfinity;
                touched.Add(n);
            }
            node.NextPb = LogSpace.Add(node.NextPb, pb);
            node.NextPnb = LogSpace.Add(node.NextPnb, pnb);
        }

        /// <summary>The prefix extended by <paramref name="cls"/>, created on first use; −1 when the lexicon forbids it.</summary>
        private int ChildOf(int parent, int cls)
        {
            var key = (long)parent * _classes + cls;
            if (_child.TryGetValue(key, out var existing)) return existing;

            var o = owner._options;
            var p = _nodes[parent];
            var extra = p.Extra + o.CharBonus;
            var lex = p.Lex;
            if (owner._trie is { } trie)
            {
                if (trie.IsLetterClass[cls])
                {
                    var next = lex == LexUnlistedWord ? -1 : trie.Child(lex, cls);
                    if (next >= 0) lex = next;
                    else if (o.LexiconPenalty is not { } penalty) lex = -1;
                    else
                    {
                        if (lex != LexUnlistedWord) extra -= penalty;
                        lex = LexUnlistedWord;
                    }
                }
                else
                {
                    // A non-letter ends the current word, which must then be a whole listed word.
                    if (lex > 0 && !trie.IsWord(lex))
                    {
                        if (o.LexiconPenalty is not { } penalty) lex = -1;
                        else extra -= penalty;
                    }
                    if (lex != -1) lex = LexOutsideWord;
                }
            }
            if (lex == -1)
            {
                _child[key] = -1;
                return -1;
            }

            var lmState = p.LmState;
            if (o.LanguageModel is { } lm)
            {
                var id = owner._lmIdOfClass![cls];
                extra += o.LmWeight * LmRow(lmState)[cls];
                lmState = lm.Advance(lmState, id);
            }
            var n = NewNode(new Node
            {
                Parent = parent, Class = cls, Length = p.Length + 1, LmState = lmState, Lex = lex, Extra = extra,
                Pb = double.NegativeInfinity, Pnb = double.NegativeInfinity, Stamp = -1, BeamFrame = -1,
            });
            _child[key] = n;
            return n;
        }

        /// <summary>Language model log probabilities after a context, indexed by model class; index 0 holds end of line.</summary>
        private double[] LmRow(ulong state)
        {
            // The cache is shared by every line this decoder reads, and the batch runner decodes images in parallel.
            lock (owner._lmCache)
                if (owner._lmCache.TryGetValue(state, out var cached)) return cached;
            var lm = owner._options.LanguageModel!;
            Span<double> byId = stackalloc double[lm.IdLimit];
            lm.LogDistribution(state, byId);
            var row = new double[_classes];
            row[0] = byId[CharNgramModel.EndId];
            for (var c = 1; c < _classes; c++) row[c] = byId[owner._lmIdOfClass![c]];
            lock (owner._lmCache)
            {
                if (owner._lmCache.Count >= CacheLimit) owner._lmCache.Clear();
                owner._lmCache[state] = row;
            }
            return row;
        }

        private int NewNode(Node node)
        {
            if (_count == _nodes.Length) Array.Resize(ref _nodes, _nodes.Length * 2);
            _nodes[_count] = node;
            return _count++;
        }

        private int[] LabelsOf(int n)
        {
            var labels = new int[_nodes[n].Length];
            for (var i = labels.Length - 1; i >= 0; i--, n = _nodes[n].Parent) labels[i] = _nodes[n].Class;
            return labels;
        }

        private string TextOf(int[] labels)
        {
            var text = new StringBuilder();
            foreach (var c in labels) text.Append(owner._charset.SymbolOf(c));
            return text.ToString();
        }

        private double Score(int n) => LogSpace.Add(_nodes[n].Pb, _nodes[n].Pnb) + _nodes[n].Extra;

        /// <summary>Best score first; equal scores by label sequence, so the order is fully determined.</summary>
        private int Compare(double scoreA, int a, double scoreB, int b)
        {
            var byScore = scoreB.CompareTo(scoreA);
            if (byScore != 0 || a == b) return byScore;
            return LabelsOf(a).AsSpan().SequenceCompareTo(LabelsOf(b));
        }
    }
}
