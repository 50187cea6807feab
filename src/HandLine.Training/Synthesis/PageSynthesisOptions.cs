namespace HandLine.Synthesis;

/// <summary>The size and the ranges of a synthetic page; one object, checked once by <see cref="Validate"/>.</summary>
public sealed record PageSynthesisOptions
{
    public int Width { get; init; } = 1600;

    public int Height { get; init; } = 2200;

    /// <summary>Writing size of a page's hand (one size per page), in pixels.</summary>
    public Interval FontSizePx { get; init; } = new(30, 40);

    /// <summary>The whole page is turned by a uniform draw in ± this many degrees.</summary>
    public double MaxSkewDegrees { get; init; } = 3;

    /// <summary>Share of pages whose rows are so close that ascenders and descenders of neighbouring rows touch.</summary>
    public double TouchingShare { get; init; } = 0.35;

    /// <summary>Share of register pages (the rest are ledger pages).</summary>
    public double RegisterShare { get; init; } = 0.35;

    /// <summary>Strength of stains, uneven light and blur; 0 draws clean paper.</summary>
    public double Wear { get; init; } = 1;

    /// <summary>Strength of the paper's grain and the scanner's pixel noise (which make a PNG large); 0 for none.</summary>
    public double Grain { get; init; } = 1;

    /// <summary>The smaller pages kept under fixtures/: a few hundred kilobytes for a handful.</summary>
    public static PageSynthesisOptions Small { get; } = new() { Width = 900, Height = 1100, FontSizePx = new(24, 28) };

    public void Validate()
    {
        if (Width is < 300 or > 6000 || Height is < 300 or > 8000)
            throw new ArgumentException($"page size {Width}x{Height} is out of range (300..6000 x 300..8000)");
        if (FontSizePx.Min < 10 || FontSizePx.Max > Height / 8.0)
            throw new ArgumentException("the writing size must be at least 10 px and fit eight rows on the page");
        if (MaxSkewDegrees is < 0 or > 10)
            throw new ArgumentException("the page skew must be within 0..10 degrees");
        if (TouchingShare is < 0 or > 1 || RegisterShare is < 0 or > 1 || Wear is < 0 or > 2 || Grain is < 0 or > 2)
            throw new ArgumentException("shares must be within 0..1, the wear and the grain within 0..2");
    }
}
