namespace HandLine.Decoding;

/// <summary>
/// One entry of a beam search's n-best list: the text, its combined log score (CTC log probability plus the
/// weighted language model, character bonus and lexicon penalty) and its share of the final beam (the scores
/// turned into probabilities that sum to 1 over the beam).
/// </summary>
public sealed record Alternative(string Text, double Score, double Share);
