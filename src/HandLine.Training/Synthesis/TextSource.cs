namespace HandLine.Synthesis;

/// <summary>Where a line of <see cref="TextMixture"/> came from; recorded per line in degradations.jsonl.</summary>
public enum TextSource
{
    /// <summary>The account-book and register templates of <see cref="PhraseGenerator"/>.</summary>
    Phrase,

    /// <summary>Words from the word list in random order, with punctuation and figures mixed in.</summary>
    Words,

    /// <summary>As <see cref="Words"/>, the whole line in capitals.</summary>
    Capitals,

    /// <summary>As <see cref="Words"/>, every word with a capital first letter.</summary>
    Titled,

    /// <summary>Random strings over the default character set.</summary>
    Characters,

    /// <summary>Dates, sums and quantities in many styles (<see cref="FigureText"/>), now and then after a word.</summary>
    Figures,
}
