namespace HandLine.Proof;

/// <summary>What a proof sample says about a contract threshold on CER.</summary>
public enum AcceptanceVerdict
{
    /// <summary>The whole interval is at or below the threshold: the batch meets it.</summary>
    Pass,

    /// <summary>The whole interval is above the threshold: the batch misses it.</summary>
    Fail,

    /// <summary>The interval contains the threshold: the sample cannot tell; key more lines.</summary>
    Inconclusive,
}
