namespace HandLine.Proof;

/// <summary>
/// One kind of character error and how often it occurred: <see cref="Truth"/> is empty for an insertion,
/// <see cref="Machine"/> empty for a deletion. Characters are NFC code points, as CER counts them.
/// </summary>
public sealed record Confusion(ConfusionKind Kind, string Truth, string Machine, int Count);
