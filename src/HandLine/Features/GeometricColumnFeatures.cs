namespace HandLine.Features;

/// <summary>
/// The nine geometric features of one pixel column described by Marti &amp; Bunke (2001, "Using a statistical
/// language model to improve the performance of an HMM-based cursive handwriting recognition system"):
/// ink fraction, centre of gravity, second moment, upper and lower contour, their gradients, ink/background
/// transitions, and the ink fraction between the contours. Positions are divided by the line height so the
/// values stay in a similar range to the pixel values.
/// </summary>
public static class GeometricColumnFeatures
{
    public const int Count = 9;

    /// <summary>Ink above this level counts as "black" for contours and transitions (common practice, no source).</summary>
    public const float InkThreshold = 0.5f;

    /// <summary>Writes the nine features of column <paramref name="x"/> into <paramref name="dest"/>.</summary>
    /// <param name="previousUpper">Upper contour of the previous column (for the gradient); updated.</param>
    /// <param name="previousLower">Lower contour of the previous column; updated.</param>
    public static void Compute(
        float[] ink, int width, int height, int x, Span<float> dest, ref float previousUpper, ref float previousLower)
    {
        double mass = 0, first = 0, second = 0;
        int upper = -1, lower = -1, transitions = 0;
        var wasInk = false;
        for (var y = 0; y < height; y++)
        {
            var v = ink[y * width + x];
            mass += v;
            first += v * y;
            second += v * (double)y * y;
            var isInk = v > InkThreshold;
            if (isInk)
            {
                if (upper < 0) upper = y;
                lower = y;
            }
            if (isInk != wasInk) transitions++;
            wasInk = isInk;
        }

        var h = (float)height;
        var centre = mass > 0 ? (float)(first / mass) / h : 0.5f;
        var moment = mass > 0 ? (float)(second / mass) / (h * h) : 0.25f;
        // An empty column has no contours: place them at the centre so gradients stay small.
        var up = upper >= 0 ? upper / h : 0.5f;
        var low = lower >= 0 ? lower / h : 0.5f;
        var between = 0f;
        if (upper >= 0)
        {
            var count = 0;
            for (var y = upper; y <= lower; y++)
                if (ink[y * width + x] > InkThreshold) count++;
            between = count / (float)(lower - upper + 1);
        }

        dest[0] = (float)(mass / height);
        dest[1] = centre;
        dest[2] = moment;
        dest[3] = up;
        dest[4] = low;
        dest[5] = up - previousUpper;
        dest[6] = low - previousLower;
        dest[7] = transitions / 10f;
        dest[8] = between;
        previousUpper = up;
        previousLower = low;
    }
}
