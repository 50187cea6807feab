namespace HandLine.Synthesis;

/// <summary>Ways of writing pounds, shillings and pence; examples in the comments.</summary>
public enum MoneyStyle
{
    /// <summary>£3 4s 6d, £3 4s 6½d</summary>
    PoundsShillingsPence,

    /// <summary>£12.10.0</summary>
    PoundsDotted,

    /// <summary>£12-10-0</summary>
    PoundsDashed,

    /// <summary>4/6, and 4/- for whole shillings (no pounds)</summary>
    ShillingsSlashPence,

    /// <summary>2s 6d (no pounds)</summary>
    ShillingsPence,

    /// <summary>6d, 6½d (no pounds or shillings)</summary>
    Pence,

    /// <summary>£12, £1,250 (whole pounds)</summary>
    WholePounds,
}
