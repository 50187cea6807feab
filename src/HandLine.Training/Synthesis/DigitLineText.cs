using System.Globalization;

namespace HandLine.Synthesis;

/// <summary>
/// Transcripts for lines of real handwritten digits, shaped like the numbers in our invented estate's books:
/// dates, pounds-shillings-pence amounts, folio and entry numbers, quantities. Digits are drawn from MNIST;
/// the few other characters (separators, "fo.", "No.", "£", "&amp;") come from a handwriting font.
/// </summary>
public static class DigitLineText
{
    public static string Next(Random rng)
    {
        ArgumentNullException.ThrowIfNull(rng);
        var c = CultureInfo.InvariantCulture;
        int N(int lo, int hi) => rng.Next(lo, hi + 1);
        string Digits(int n) => string.Concat(Enumerable.Range(0, n).Select(_ => (char)('0' + rng.Next(10))));
        return rng.Next(10) switch
        {
            0 => string.Create(c, $"{N(1, 31)}/{N(1, 12)}/{N(1700, 1899)}"),
            1 => string.Create(c, $"{N(1, 31)}.{N(1, 12)}.{N(0, 99):D2}"),
            2 => string.Create(c, $"£{N(0, 999)}-{N(0, 19)}-{N(0, 11)}"),
            3 => string.Create(c, $"{N(1, 19)}/{N(0, 11)}"),
            4 => string.Create(c, $"fo. {N(1, 480)}"),
            5 => string.Create(c, $"No. {N(1, 2999)}"),
            6 => string.Create(c, $"{N(1, 99)} & {N(1, 99)}"),
            7 => string.Join(' ', Enumerable.Range(0, N(2, 4)).Select(_ => Digits(N(1, 4)))),
            8 => Digits(N(3, 8)),
            _ => string.Create(c, $"{N(1, 31)}-{N(1, 12)}-{N(1700, 1899)} £{N(1, 99)}"),
        };
    }
}
