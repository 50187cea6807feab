using HandLine.Language;

namespace HandLine.Decoding;

/// <summary>
/// How posteriors become text. <see cref="Beam"/> 0 or 1 is greedy (best path) decoding; 2 or more is CTC prefix
/// beam search, which alone can use a <see cref="Lexicon"/> and a <see cref="LanguageModel"/>.
/// </summary>
public sealed record DecodingOptions
{
    /// <summary>Chosen by measurement on held-out synthetic lines; see docs-decoding.md.</summary>
    public const int DefaultBeam = 8;

    public const int DefaultAlternatives = 5;

    /// <summary>Character bonus that worked best with a language model at weight 0.5 on held-out synthetic lines (docs-decoding.md).</summary>
    public const double DefaultCharBonusWithLm = 2.0;

    /// <summary>Beam width (prefixes kept per frame); 0 or 1 means greedy decoding.</summary>
    public int Beam { get; init; } = DefaultBeam;

    /// <summary>How many best texts to report per line (beam search only).</summary>
    public int Alternatives { get; init; } = DefaultAlternatives;

    /// <summary>Words are constrained to this list; numbers, punctuation and spaces stay free.</summary>
    public Lexicon? Lexicon { get; init; }

    /// <summary>
    /// Null: strict — only listed words (and their case variants) can be written. A value W ≥ 0: soft — a word not
    /// in the list is allowed but costs W (natural-log units) once; 0 makes the list have no effect.
    /// </summary>
    public double? LexiconPenalty { get; init; }

    public CharNgramModel? LanguageModel { get; init; }

    /// <summary>Weight α of the language model's log probability in the combined score (0.5: best of 0.3–1.0 measured).</summary>
    public double LmWeight { get; init; } = 0.5;

    /// <summary>Score β added per character written; offsets the language model's bias to short texts.</summary>
    public double CharBonus { get; init; }

    /// <summary>
    /// A character is tried at a frame only when its posterior there is at least this (blank and the prefix's own
    /// last character are always tried). 0 tries everything. Default 1e-4 (common practice, no source).
    /// </summary>
    public double CandidateFloor { get; init; } = 1e-4;

    public static DecodingOptions Greedy { get; } = new() { Beam = 1 };

    public bool UsesBeam => Beam > 1;

    /// <summary>Throws <see cref="ArgumentException"/> for settings that cannot work together.</summary>
    public void Validate()
    {
        if (Beam < 0) throw new ArgumentException("The beam width cannot be negative.");
        if (Alternatives < 0) throw new ArgumentException("The number of alternatives cannot be negative.");
        if (!UsesBeam && (Lexicon is not null || LanguageModel is not null))
            throw new ArgumentException("A lexicon or language model needs beam search (beam width 2 or more).");
        if (LexiconPenalty is { } w && (w < 0 || !double.IsFinite(w)))
            throw new ArgumentException("The lexicon weight must be a finite number, 0 or more.");
        if (LexiconPenalty is not null && Lexicon is null)
            throw new ArgumentException("A lexicon weight needs a lexicon.");
        if (LmWeight < 0 || !double.IsFinite(LmWeight)) throw new ArgumentException("The language model weight must be a finite number, 0 or more.");
        if (!double.IsFinite(CharBonus)) throw new ArgumentException("The character bonus must be a finite number.");
        if (CandidateFloor is < 0 or >= 1) throw new ArgumentException("The candidate floor must be within [0, 1).");
    }
}
