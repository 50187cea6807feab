namespace HandLine.Synthesis;

/// <summary>
/// What to synthesise. With <paramref name="Texts"/> the lines come from the user's text (cycled
/// when <paramref name="Count"/> is larger); otherwise from <see cref="PhraseGenerator"/>.
/// <paramref name="Ranges"/> defaults to <c>new DegradationRanges()</c>.
/// </summary>
public sealed record SynthesisRequest(
    FontCatalog Fonts,
    int Count,
    string OutDir,
    int Seed,
    IEnumerable<string>? Texts = null,
    DegradationRanges? Ranges = null);
