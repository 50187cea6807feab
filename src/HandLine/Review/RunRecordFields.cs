namespace HandLine.Review;

/// <summary>The fields <c>correct</c> adds to a corrected line of <c>lines.jsonl</c>.</summary>
public static class RunRecordFields
{
    /// <summary>True once an editor has checked the line (corrected it, or accepted the machine's text).</summary>
    public const string Corrected = "corrected";

    /// <summary>The machine's text, kept when the editor's text replaces it in <c>text</c>.</summary>
    public const string MachineText = "machine_text";

    /// <summary>True when the editor marked the line illegible: it is kept out of the ground-truth manifest.</summary>
    public const string Illegible = "illegible";
}
