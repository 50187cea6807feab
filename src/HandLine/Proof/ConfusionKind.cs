namespace HandLine.Proof;

/// <summary>The kind of one character error in an alignment of truth against machine text.</summary>
public enum ConfusionKind
{
    /// <summary>A truth character read as another.</summary>
    Substitution,

    /// <summary>A truth character the machine left out.</summary>
    Deletion,

    /// <summary>A machine character with no truth character.</summary>
    Insertion,
}
