namespace HandLine.Synthesis;

/// <summary>
/// What to synthesise. With <paramref name="Texts"/> the lines come from the user's text (cycled
/// when <paramref name="Count"/> is larger); otherwise from <see cref="PhraseGenerator"/>.
/// <paramref name="Ranges"/> defaults to <c>new DegradationRanges()</c>. With <paramref name="Digits"/> every
/// digit is a real handwritten MNIST sample from the given split and generated text comes from
/// <see cref="DigitLineText"/>.
/// </summary>
public sealed record SynthesisRequest(
    FontCatalog Fonts,
    int Count,
    string OutDir,
    int Seed,
    IEnumerable<string>? Texts = null,
    DegradationRanges? Ranges = null,
    DigitSource? Digits = null);

/// <summary>Where digit lines take their digits from, and which samples they may use.</summary>
public sealed record DigitSource(MnistDigits Digits, MnistSplit Split);
