namespace HandLine.Synthesis;

/// <summary>
/// Fast deterministic noise for per-pixel use, where <see cref="Random"/> is too slow.
/// SplitMix64 generator (Steele, Lea &amp; Flood 2014); normal deviates by the Irwin–Hall sum of
/// four uniforms, rescaled to unit variance (variance of one uniform is 1/12).
/// </summary>
internal struct PixelNoise
{
    private ulong _state;

    public PixelNoise(int seed) => _state = (ulong)(uint)seed * 0x9E3779B97F4A7C15UL + 1;

    public ulong NextBits()
    {
        var z = _state += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }

    /// <summary>Uniform in [-1, 1).</summary>
    public float NextSigned() => (NextBits() >> 40) * (2f / (1 << 24)) - 1f;

    /// <summary>Approximately standard normal: four 16-bit uniforms from one draw.</summary>
    public float NextNormal()
    {
        var b = NextBits();
        const float inv = 1f / 65536f;
        var sum = ((b & 0xFFFF) + ((b >> 16) & 0xFFFF) + ((b >> 32) & 0xFFFF) + (b >> 48)) * inv;
        // Sum of 4 U(0,1): mean 2, variance 4/12, so scale by sqrt(3).
        return (sum - 2f) * 1.7320508f;
    }
}
