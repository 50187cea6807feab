namespace HandLine.Imaging;

/// <summary>256-bin histograms of 0..1 images (bin = round(v·255)), as an 8-bit scan would give.</summary>
internal static class Histogram
{
    public static long[] Build(float[] values)
    {
        var hist = new long[256];
        foreach (float v in values)
            hist[Bin(v)]++;
        return hist;
    }

    public static int Bin(float v)
    {
        if (!(v > 0)) return 0; // also catches NaN
        if (v >= 1) return 255;
        return (int)(v * 255f + 0.5f);
    }

    /// <summary>Value (bin/255) below which lies fraction q of the pixels.</summary>
    public static float Quantile(long[] hist, double q)
    {
        long total = 0;
        foreach (long c in hist) total += c;
        long target = (long)Math.Ceiling(q * total);
        long seen = 0;
        for (int i = 0; i < hist.Length; i++)
        {
            seen += hist[i];
            if (seen >= Math.Max(1, target))
                return i / 255f;
        }
        return 1f;
    }

    /// <summary>Mean value of the darkest (fromTop false) or brightest fraction of pixels.</summary>
    public static float TailMean(long[] hist, double fraction, bool fromTop)
    {
        long total = 0;
        foreach (long c in hist) total += c;
        double want = Math.Max(1, fraction * total), taken = 0, sum = 0;
        for (int j = 0; j < hist.Length && taken < want; j++)
        {
            int i = fromTop ? hist.Length - 1 - j : j;
            double take = Math.Min(hist[i], want - taken);
            taken += take;
            sum += take * i;
        }
        return (float)(sum / taken / 255.0);
    }
}
