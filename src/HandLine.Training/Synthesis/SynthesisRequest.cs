namespace HandLine.Synthesis;

/// <summary>
/// What to synthesise. With <paramref name="Texts"/> the lines come from the user's text (cycled
/// when <paramref name="Count"/> is larger); otherwise from <see cref="PhraseGenerator"/>.
/// <paramref name="Ranges"/> defaults to <c>new DegradationRanges()</c>. With <paramref name="Digits"/> every
/// digit is a real handwritten MNIST sample from the given split and generated text comes from
/// <see cref="DigitLineText"/>. With <paramref name="Words"/> (see <see cref="WordList.Load"/>) generated text comes
/// from a <see cref="TextMixture"/> with <paramref name="Mixture"/> (default <c>new TextMixtureOptions()</c>)
/// instead of the phrase generator alone; it cannot be combined with <paramref name="Texts"/> or
/// <paramref name="Digits"/>, which bring their own text.
/// </summary>
public sealed record SynthesisRequest(
    FontCatalog Fonts,
    int Count,
    string OutDir,
    int Seed,
    IEnumerable<string>? Texts = null,
    DegradationRanges? Ranges = null,
    DigitSource? Digits = null,
    IReadOnlyList<string>? Words = null,
    TextMixtureOptions? Mixture = null);

/// <summary>Where digit lines take their digits from, and which samples they may use.</summary>
public sealed record DigitSource(MnistDigits Digits, MnistSplit Split);
