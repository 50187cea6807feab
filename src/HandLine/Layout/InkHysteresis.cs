namespace HandLine.Layout;

/// <summary>
/// Hysteresis thresholding (Canny 1986, "A computational approach to edge detection", IEEE PAMI 8(6), here applied
/// to ink rather than edges): of the components of the ink found at the low threshold, only those with at least one
/// pixel darker than the high threshold are kept. A pen stroke has a dark core; the edge of a stain or a shadow that
/// the flattening leaves a little dark passes the low threshold over a long band but never reaches a stroke's level.
/// </summary>
internal static class InkHysteresis
{
    /// <summary>Clears, in place, the ink of components whose darkest pixel is not darker than <paramref name="strong"/>; returns the components of what is left.</summary>
    public static Components Apply(byte[] ink, float[] luminance, int w, int h, float strong)
    {
        var components = Components.Label(ink, w, h);
        var darkest = new float[components.Count + 1];
        Array.Fill(darkest, float.MaxValue);
        var labels = components.Labels;
        for (var i = 0; i < ink.Length; i++)
        {
            var l = labels[i];
            if (l != 0 && luminance[i] < darkest[l]) darkest[l] = luminance[i];
        }
        var faint = false;
        for (var l = 1; l <= components.Count && !faint; l++) faint = darkest[l] >= strong;
        if (!faint) return components;
        for (var i = 0; i < ink.Length; i++)
            if (ink[i] != 0 && darkest[labels[i]] >= strong) ink[i] = 0;
        return Components.Label(ink, w, h);
    }
}
