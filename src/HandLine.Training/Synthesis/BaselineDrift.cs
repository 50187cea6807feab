namespace HandLine.Synthesis;

/// <summary>
/// A slow random rise and fall of the baseline along the line: Gaussian values at knots a few em apart,
/// joined by smoothstep so the drift has no kinks. Zero amplitude is a flat line.
/// </summary>
internal sealed class BaselineDrift
{
    private readonly double[] _knots;
    private readonly double _cellPx;

    public BaselineDrift(Degradation d, int glyphs, Random rng)
    {
        _cellPx = d.BaselineDriftCellEm * d.FontSizePx;
        // Enough knots for the widest line the glyphs could make (two em each, far above any face's advance).
        var n = (int)Math.Ceiling((glyphs + 2) * 2 * d.FontSizePx / _cellPx) + 2;
        _knots = new double[n];
        for (var i = 0; i < n; i++)
            _knots[i] = d.BaselineDriftPx * RasterOps.NextGaussian(rng);
    }

    /// <summary>Vertical offset at <paramref name="x"/> pixels along the line (y down).</summary>
    public float At(float x)
    {
        var t = Math.Clamp(x / _cellPx, 0, _knots.Length - 1.001);
        var i = (int)t;
        var f = t - i;
        f = f * f * (3 - 2 * f);
        return (float)(_knots[i] + (_knots[i + 1] - _knots[i]) * f);
    }
}
