using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

/// <summary>
/// Three lines from the invented Harrowdene estate account book, with hand-counted errors.
/// </summary>
internal static class LedgerSample
{
    public static ScoreItem[] Items { get; } =
    [
        // 31 chars, 6 words. Hypothesis drops the "i" of "thatching": 1 D; word "thatching" 1 S.
        new("p1-l1", "Paid to J. Marlow for thatching", "Paid to J. Marlow for thatchng"),
        // 25 chars, 7 words. "Low"→"Lcw" (1 S) and "Meadow"→"Meadows" (1 I); words: 2 S.
        new("p1-l2", "Rent of Low Meadow 2 10 0", "Rent of Lcw Meadows 2 10 0"),
        // 17 chars, 3 words, not in the run: 17 D; words 3 D.
        new("p1-l3", "Carriage of coals", null),
    ];

    // Totals by hand: chars 31 + 25 + 17 = 73, char errors 1 + 2 + 17 = 20 (S 1, D 18, I 1);
    // words 6 + 7 + 3 = 16, word errors 1 + 2 + 3 = 6 (S 3, D 3, I 0).
    public const int Chars = 73;
    public const int CharErrors = 20;
    public const int Words = 16;
    public const int WordErrors = 6;
}
