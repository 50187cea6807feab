namespace HandLine.Proof;

/// <summary>
/// Sample size for estimating a proportion to within ±e at a confidence level, by the normal approximation to the
/// binomial: n = z² p (1 − p) / e² characters (Cochran, Sampling Techniques, 3rd ed., 1977, ch. 4, from memory),
/// times the design effect for clustering within lines (<see cref="DesignEffect"/>), divided by the characters per
/// line, each rounded up.
/// </summary>
public static class SamplePlanner
{
    /// <summary>z for a 95 % two-sided interval: the 97.5 % point of the standard normal distribution.</summary>
    public const double Z95 = 1.959963984540054;

    /// <exception cref="ArgumentOutOfRangeException">A rate outside (0, 1), a half-width outside (0, 1), fewer than one
    /// character per line, or a design effect below 1.</exception>
    public static SamplePlan Plan(double expectedCer, double halfWidth, double charsPerLine, double designEffect)
    {
        if (!(expectedCer > 0 && expectedCer < 1))
            throw new ArgumentOutOfRangeException(nameof(expectedCer), expectedCer, "The expected CER must lie between 0 and 1.");
        if (!(halfWidth > 0 && halfWidth < 1))
            throw new ArgumentOutOfRangeException(nameof(halfWidth), halfWidth, "The half-width must lie between 0 and 1.");
        if (!(charsPerLine >= 1) || !double.IsFinite(charsPerLine))
            throw new ArgumentOutOfRangeException(nameof(charsPerLine), charsPerLine, "A line must have at least one character.");
        if (!(designEffect >= 1) || !double.IsFinite(designEffect))
            throw new ArgumentOutOfRangeException(nameof(designEffect), designEffect, "The design effect is at least 1.");

        var exact = Z95 * Z95 * expectedCer * (1 - expectedCer) / (halfWidth * halfWidth);
        // Rounded up: a sample a fraction short would not reach the half-width. The tiny tolerance keeps a result
        // that is whole up to floating-point error (384.0000000001) from gaining a character.
        var chars = (int)Math.Ceiling(exact - 1e-9);
        var lines = (int)Math.Ceiling(exact * designEffect / charsPerLine - 1e-9);
        return new SamplePlan(expectedCer, halfWidth, 0.95, Z95, charsPerLine, designEffect, exact, chars, Math.Max(1, lines));
    }
}
