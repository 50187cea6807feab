namespace HandLine.Synthesis;

/// <summary>
/// An amount in pounds, shillings (20 to the pound) and pence (12 to the shilling), with an optional
/// quarter, half or three-quarter penny (QuarterPence 1, 2 or 3).
/// </summary>
public sealed record Money
{
    public Money(int pounds, int shillings, int pence, int quarterPence = 0)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(pounds);
        if (shillings is < 0 or >= 20)
            throw new ArgumentOutOfRangeException(nameof(shillings), shillings, "Shillings run from 0 to 19.");
        if (pence is < 0 or >= 12)
            throw new ArgumentOutOfRangeException(nameof(pence), pence, "Pence run from 0 to 11.");
        if (quarterPence is < 0 or > 3)
            throw new ArgumentOutOfRangeException(nameof(quarterPence), quarterPence, "Quarter pence run from 0 to 3.");
        Pounds = pounds;
        Shillings = shillings;
        Pence = pence;
        QuarterPence = quarterPence;
    }

    public int Pounds { get; }
    public int Shillings { get; }
    public int Pence { get; }
    public int QuarterPence { get; }
}
