namespace HandLine.Imaging;

/// <summary>
/// The imaging stage's entry point for one text line: polarity and contrast → optional
/// binarisation → deskew → slant correction → crop to the ink → height normalisation.
/// Angles are searched on a downscaled copy; the source is warped once (rotation and shear
/// together) into the upright crop and then resized once, so blur does not accumulate.
/// Made once per model (or training run) and used for every line: its settings are checked when it is made.
/// </summary>
public sealed class LineNormaliser
{
    // Fewest x-height rows the slant search works on; below this, rounding of the shear dominates
    // and the search drifts towards 0°. Tuned on rendered test lines; no source.
    private const int SlantCoreRows = 16;

    private readonly int _lineHeight;
    private readonly bool _correctSlant;
    private readonly BinarisationMethod _binarisation;
    private readonly ImagingOptions _options;
    private readonly int _maxLineWidth;

    /// <summary>
    /// The line settings are the model's: <see cref="Features.LinePreparer"/> passes those of its
    /// <see cref="Features.FeatureConfig"/>, which owns them (this stage comes before features and takes plain values).
    /// </summary>
    /// <param name="lineHeight">Height of every normalised line, in pixels.</param>
    /// <param name="correctSlant">Undo the shear of upright strokes.</param>
    /// <param name="binarisation">Thresholding after contrast normalisation.</param>
    /// <param name="tuning">The imaging stage's tuning values; null for the defaults.</param>
    /// <param name="limits">Only <see cref="InputLimits.MaxLineWidth"/> applies here; null for the defaults.</param>
    /// <exception cref="ArgumentException">A setting is out of range, or the settings do not fit together.</exception>
    public LineNormaliser(int lineHeight, bool correctSlant, BinarisationMethod binarisation, ImagingOptions? tuning = null, InputLimits? limits = null)
    {
        if (lineHeight is < 8 or > 1024)
            throw new ArgumentException($"line height {lineHeight} is outside 8..1024", nameof(lineHeight));
        if (!Enum.IsDefined(binarisation))
            throw new ArgumentException($"unknown binarisation {(int)binarisation}", nameof(binarisation));
        var options = tuning ?? new ImagingOptions();
        options.Validate();
        var maxLineWidth = (limits ?? InputLimits.Default).MaxLineWidth;
        if (lineHeight - 2 * options.Margin < 4)
            throw new ArgumentException($"ImagingOptions.Margin {options.Margin} leaves fewer than 4 rows of ink in a line {lineHeight} high.", nameof(tuning));
        if (maxLineWidth < lineHeight)
            throw new ArgumentException($"InputLimits.MaxLineWidth {maxLineWidth} is below the line height {lineHeight}.", nameof(limits));
        _lineHeight = lineHeight;
        _correctSlant = correctSlant;
        _binarisation = binarisation;
        _options = options;
        _maxLineWidth = maxLineWidth;
    }

    /// <summary>Height of every normalised line, in pixels (the model's).</summary>
    public int LineHeight => _lineHeight;

    /// <param name="luminance">Loaded line image (0 black .. 1 white), either polarity.</param>
    /// <param name="nameForErrors">Shown in an <see cref="InputException"/> (normally the file's path).</param>
    public NormalisedLine Normalise(GrayImage luminance, string nameForErrors = "line image")
    {
        ArgumentNullException.ThrowIfNull(luminance);
        ArgumentNullException.ThrowIfNull(nameForErrors);
        var options = _options;

        var ink = ContrastNormaliser.ToInk(luminance, options);
        if (ink is null)
            return Blank();
        ink = Binarise(ink);

        int factor = (int)Math.Max(1, Math.Ceiling(Math.Sqrt((double)ink.Width * ink.Height / options.EstimationPixels)));
        var small = Resampler.BoxDownscale(ink, factor);
        var (deskew, coreRows) = SkewEstimator.Estimate(small, options.MaxDeskewDegrees);
        double slant = 0;
        if (_correctSlant)
        {
            // Slant needs letters tall enough for strokes to show: downscale less if they would be short.
            int slantFactor = Math.Clamp(coreRows * factor / SlantCoreRows, 1, factor);
            var forSlant = slantFactor == factor ? small : Resampler.BoxDownscale(ink, slantFactor);
            slant = SlantEstimator.Estimate(forSlant, deskew, options.MaxSlantDegrees);
        }
        // Corrections moving no pixel by half a pixel are skipped: they would only blur.
        if (Math.Abs(Math.Tan(deskew * Math.PI / 180)) * Math.Max(ink.Width, ink.Height) < 0.5)
            deskew = 0;
        if (Math.Abs(Math.Tan(slant * Math.PI / 180)) * ink.Height < 0.5)
            slant = 0;

        // Work at no more than about twice the final resolution: the core band (x-height) is a lower
        // bound on the ink height, so this never drops below the output's own sampling.
        int inner = _lineHeight - 2 * options.Margin;
        double step = Math.Max(1, coreRows * factor / (2.0 * inner));
        var upright = Upright(ink, deskew, slant, step);
        if (upright is null || InkBounds.Find(upright, options.SpeckFraction) is not { } box)
            return Blank() with { DeskewDegrees = deskew, SlantDegrees = slant };

        return new NormalisedLine(Fit(upright, box, step, nameForErrors), deskew, slant, HasInk: true);
    }

    private NormalisedLine Blank() =>
        new(GrayImage.Filled(_lineHeight, _lineHeight, 0f), 0, 0, HasInk: false);

    private GrayImage Binarise(GrayImage ink)
    {
        var p = ink.Pixels;
        var result = new float[p.Length];
        switch (_binarisation)
        {
            case BinarisationMethod.Otsu:
                float t = Binariser.Otsu(ink);
                for (int i = 0; i < p.Length; i++) result[i] = p[i] > t ? 1f : 0f;
                break;
            case BinarisationMethod.Sauvola:
                // Sauvola is defined on luminance with dark ink, so go through 1 − ink and back.
                for (int i = 0; i < p.Length; i++) result[i] = 1f - p[i];
                var paper = Binariser.Sauvola(new GrayImage(ink.Width, ink.Height, result), _options.SauvolaWindow, _options.SauvolaK).Pixels;
                for (int i = 0; i < p.Length; i++) result[i] = 1f - paper[i];
                break;
            default:
                return ink;
        }
        return new GrayImage(ink.Width, ink.Height, result);
    }

    /// <summary>
    /// The ink turned and sheared upright, over a window just holding all ink ≥ 0.5, with output
    /// pixels <paramref name="step"/> source pixels apart.
    /// </summary>
    private static GrayImage? Upright(GrayImage ink, double deskew, double slant, double step)
    {
        var p = ink.Pixels;
        int w = ink.Width;
        int x0 = int.MaxValue, y0 = int.MaxValue, x1 = -1, y1 = -1;
        double sx = 0, sy = 0, n = 0;
        for (int y = 0; y < ink.Height; y++)
            for (int x = 0; x < w; x++)
                if (p[y * w + x] >= 0.5f)
                {
                    x0 = Math.Min(x0, x); x1 = Math.Max(x1, x);
                    y0 = Math.Min(y0, y); y1 = Math.Max(y1, y);
                    sx += x; sy += y; n++;
                }
        if (n == 0)
            return null;
        if (deskew == 0 && slant == 0 && step == 1)
            return ink;

        var rotation = UprightTransform.Rotation(ink, deskew);
        // Shear about the ink's centre row so the line stays in place vertically.
        var transform = rotation with { SlantDegrees = slant, ShearCentreY = rotation.Forward(sx / n, sy / n).Y };
        var (bx0, by0, bx1, by1) = transform.Bounds(x0, y0, x1, y1);
        double ox = Math.Floor(bx0) - 1, oy = Math.Floor(by0) - 1;
        int width = (int)Math.Ceiling((bx1 - ox) / step) + 2, height = (int)Math.Ceiling((by1 - oy) / step) + 2;
        return transform.Render(ink, ox, oy, width, height, 0f, step);
    }

    /// <summary>Crops to the box and scales to the line height (keeping the aspect ratio) inside the margin.</summary>
    private GrayImage Fit(GrayImage upright, InkBounds.Box box, double step, string name)
    {
        var options = _options;
        int inner = _lineHeight - 2 * options.Margin;
        // The upscale limit is relative to the source, whose pixels are `step` upright pixels.
        double scale = Math.Min((double)inner / box.Height, options.MaxUpscale * step);
        int outH = Math.Clamp((int)Math.Round(box.Height * scale), 1, inner);
        long outW = Math.Max(1, (long)Math.Round(box.Width * scale));
        if (outW + 2 * options.Margin > _maxLineWidth)
            throw new InputException(name, "normalise",
                $"line would be {outW + 2 * options.Margin} pixels wide at height {_lineHeight}, over the limit of {_maxLineWidth}; is this a single text line?");

        var crop = new float[box.Width * box.Height];
        for (int y = 0; y < box.Height; y++)
            Array.Copy(upright.Pixels, (box.Y0 + y) * upright.Width + box.X0, crop, y * box.Width, box.Width);
        var scaled = Resampler.Resize(new GrayImage(box.Width, box.Height, crop), (int)outW, outH);

        int width = (int)outW + 2 * options.Margin;
        var result = new float[width * _lineHeight];
        int top = options.Margin + (inner - outH) / 2;
        for (int y = 0; y < outH; y++)
            Array.Copy(scaled.Pixels, y * outW, result, (top + y) * width + options.Margin, outW);
        return new GrayImage(width, _lineHeight, result);
    }
}
