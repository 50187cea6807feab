namespace HandLine.Layout;

/// <summary>A ruled line found on the upright page: its centre across it (y of a horizontal rule, x of a vertical one) and its extent along it.</summary>
public readonly record struct Rule(double Position, int Start, int End)
{
    public int Length => End - Start + 1;
}
