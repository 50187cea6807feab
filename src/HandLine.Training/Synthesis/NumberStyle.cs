namespace HandLine.Synthesis;

/// <summary>Ways of writing a plain quantity; examples in the comments.</summary>
public enum NumberStyle
{
    /// <summary>1,250 (whole number, thousands separated by commas)</summary>
    Grouped,

    /// <summary>3½, ¾ (whole number and a quarter, half or three quarters)</summary>
    Fraction,

    /// <summary>12.75 (two decimal places)</summary>
    Decimal,
}
