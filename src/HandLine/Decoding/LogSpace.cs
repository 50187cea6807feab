namespace HandLine.Decoding;

/// <summary>Arithmetic on natural-log probabilities.</summary>
internal static class LogSpace
{
    /// <summary>log(e^a + e^b) without overflow; −∞ is the log of zero.</summary>
    public static double Add(double a, double b)
    {
        if (a < b) (a, b) = (b, a);
        if (double.IsNegativeInfinity(b)) return a;
        return a + Math.Log(1 + Math.Exp(b - a));
    }
}
