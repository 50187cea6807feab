namespace HandLine.Synthesis;

/// <summary>What a synthetic page is ruled for.</summary>
public enum PageKind
{
    /// <summary>An account-book page: a margin rule, a description column and a money column.</summary>
    Ledger,

    /// <summary>A register page: number, name, abode and date columns, each between vertical rules.</summary>
    Register,
}
