namespace HandLine.Proof;

/// <summary>
/// A proof sample's size for a chosen interval half-width: the characters independent characters would need, and
/// the lines that makes once clustering within lines is allowed for.
/// </summary>
public sealed record SamplePlan(
    double ExpectedCer, double HalfWidth, double Level, double Z, double CharsPerLine, double DesignEffect,
    double ExactChars, int Chars, int Lines);
