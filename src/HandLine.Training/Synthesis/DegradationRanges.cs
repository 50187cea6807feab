namespace HandLine.Synthesis;

/// <summary>
/// How likely and how strong each degradation is. Defaults aim at plausible scanned ledger lines;
/// the values are common practice for synthetic line data, no source. Lengths are in pixels.
/// </summary>
public sealed record DegradationRanges
{
    /// <summary>Clean rendering: fixed 40 px text, fixed padding, black ink on white paper.</summary>
    public static DegradationRanges None { get; } = new()
    {
        FontSizePx = new(40, 40),
        PaddingPx = new(8, 8),
        InkLuminance = new(0, 0),
        PaperLuminance = new(1, 1),
        RotationDegrees = Effect.Off,
        ShearDegrees = Effect.Off,
        WobbleAmplitudePx = Effect.Off,
        GlyphScaleJitter = Effect.Off,
        GlyphOffsetJitterPx = Effect.Off,
        GlyphRotationJitterDegrees = Effect.Off,
        LetterSpacingEm = Effect.Off,
        StrokeWidthPx = Effect.Off,
        Erosion = Effect.Off,
        ElasticAlphaPx = Effect.Off,
        Fading = Effect.Off,
        PaperTexture = Effect.Off,
        Lighting = Effect.Off,
        BlurSigmaPx = Effect.Off,
        NoiseSigma = Effect.Off,
        JpegQuality = Effect.Off,
        RuledLineDarkness = Effect.Off,
        BleedThroughDarkness = Effect.Off,
        GlyphShearJitterDegrees = Effect.Off,
        GlyphWeightJitterPx = Effect.Off,
        BaselineDriftPx = Effect.Off,
        BaselineDriftCellEm = new(2.5, 2.5),
        GapJitterEm = Effect.Off,
        TouchProbability = Effect.Off,
        TouchDepthEm = new(0, 0),
        PressureVariation = Effect.Off,
        PenSeparatorShare = Effect.Off,
        DigitPenSeparatorShare = Effect.Off,
        PenWidthEm = new(0.06, 0.06),
        PenWidthVariation = Effect.Off,
        PenJitterPx = Effect.Off,
    };

    public Interval FontSizePx { get; init; } = new(32, 48);

    /// <summary>Blank margin on each side of the ink, drawn per side.</summary>
    public Interval PaddingPx { get; init; } = new(4, 24);

    /// <summary>Ink luminance (0 black); iron-gall and pencil are never pure black.</summary>
    public Interval InkLuminance { get; init; } = new(0, 0.3);

    public Interval PaperLuminance { get; init; } = new(0.8, 1);

    /// <summary>Whole-line rotation; positive turns the line anticlockwise.</summary>
    public Effect RotationDegrees { get; init; } = new(0.6, -6, 6);

    /// <summary>Horizontal shear; positive leans letters to the right.</summary>
    public Effect ShearDegrees { get; init; } = new(0.7, -15, 25);

    /// <summary>Baseline drift amplitude; the drift is a slow sine along the line.</summary>
    public Effect WobbleAmplitudePx { get; init; } = new(0.6, 0.5, 4);

    public Interval WobblePeriodPx { get; init; } = new(150, 600);

    /// <summary>Standard deviation of each glyph's relative size change.</summary>
    public Effect GlyphScaleJitter { get; init; } = new(0.7, 0.01, 0.08);

    /// <summary>Standard deviation of each glyph's vertical offset.</summary>
    public Effect GlyphOffsetJitterPx { get; init; } = new(0.7, 0.3, 2.5);

    /// <summary>Standard deviation of each glyph's own rotation.</summary>
    public Effect GlyphRotationJitterDegrees { get; init; } = new(0.6, 0.5, 4);

    /// <summary>Extra advance after each glyph, as a fraction of the font size (may tighten).</summary>
    public Effect LetterSpacingEm { get; init; } = new(0.5, -0.06, 0.15);

    /// <summary>Outline stroke added to the fill, thickening the pen.</summary>
    public Effect StrokeWidthPx { get; init; } = new(0.35, 0.5, 2.5);

    /// <summary>Share of a one-pixel erosion mixed in, thinning the pen.</summary>
    public Effect Erosion { get; init; } = new(0.2, 0.3, 1);

    /// <summary>RMS displacement of the smooth elastic field.</summary>
    public Effect ElasticAlphaPx { get; init; } = new(0.5, 0.5, 2.5);

    /// <summary>Gaussian smoothing of the elastic field (larger = smoother).</summary>
    public Interval ElasticSigmaPx { get; init; } = new(4, 10);

    /// <summary>Largest share of ink lost in faded stretches of the line.</summary>
    public Effect Fading { get; init; } = new(0.3, 0.2, 0.7);

    /// <summary>Amplitude of the blotchy paper grain.</summary>
    public Effect PaperTexture { get; init; } = new(0.7, 0.01, 0.06);

    /// <summary>Luminance drop across the crop from uneven lighting.</summary>
    public Effect Lighting { get; init; } = new(0.5, 0.03, 0.2);

    public Effect BlurSigmaPx { get; init; } = new(0.6, 0.3, 1.4);

    /// <summary>Standard deviation of additive Gaussian pixel noise (luminance units).</summary>
    public Effect NoiseSigma { get; init; } = new(0.6, 0.01, 0.06);

    /// <summary>JPEG quality used for an encode/decode round trip.</summary>
    public Effect JpegQuality { get; init; } = new(0.4, 30, 90);

    /// <summary>Ink share of a printed ruling line near the baseline.</summary>
    public Effect RuledLineDarkness { get; init; } = new(0.15, 0.1, 0.35);

    /// <summary>Ruling position below the baseline.</summary>
    public Interval RuledLineOffsetPx { get; init; } = new(0, 8);

    /// <summary>Ink share of writing from the other side of the leaf showing through, mirrored.</summary>
    public Effect BleedThroughDarkness { get; init; } = new(0.15, 0.04, 0.15);

    /// <summary>Standard deviation of each glyph's own lean, on top of the line's shear.</summary>
    public Effect GlyphShearJitterDegrees { get; init; } = new(0.6, 1, 5);

    /// <summary>Standard deviation of each glyph's pen weight, so some letters come out bolder than their neighbours.</summary>
    public Effect GlyphWeightJitterPx { get; init; } = new(0.5, 0.2, 0.8);

    /// <summary>Amplitude of the slow random drift of the baseline, on top of the sine wobble.</summary>
    public Effect BaselineDriftPx { get; init; } = new(0.6, 0.5, 3);

    /// <summary>Distance between the drift's random knots, in em.</summary>
    public Interval BaselineDriftCellEm { get; init; } = new(1.5, 4);

    /// <summary>Standard deviation of each gap after a glyph, in em; word spaces vary three times as much.</summary>
    public Effect GapJitterEm { get; init; } = new(0.6, 0.01, 0.04);

    /// <summary>Chance per glyph of being tucked into its neighbour so the two touch or overlap.</summary>
    public Effect TouchProbability { get; init; } = new(0.4, 0.05, 0.25);

    /// <summary>How far a tucked glyph moves into its neighbour, in em.</summary>
    public Interval TouchDepthEm { get; init; } = new(0.03, 0.09);

    /// <summary>Largest share of ink lost where the pen pressed lightly.</summary>
    public Effect PressureVariation { get; init; } = new(0.5, 0.15, 0.5);

    /// <summary>Font lines: chance per separator (slash, dash, stop, colon, comma) of a pen stroke instead of the font's glyph.</summary>
    public Effect PenSeparatorShare { get; init; } = new(0.4, 0.5, 1);

    /// <summary>Lines of MNIST digits: the same chance; most written figures have hand-made separators.</summary>
    public Effect DigitPenSeparatorShare { get; init; } = new(0.8, 0.5, 1);

    /// <summary>Pen width of stroke faces and pen-drawn separators, as a share of the font size.</summary>
    public Interval PenWidthEm { get; init; } = new(0.04, 0.09);

    /// <summary>Relative swelling and thinning of the pen width along a stroke.</summary>
    public Effect PenWidthVariation { get; init; } = new(0.7, 0.1, 0.35);

    /// <summary>Standard deviation of the hand's deviation from a stroke's ideal path, in pixels.</summary>
    public Effect PenJitterPx { get; init; } = new(0.7, 0.2, 0.7);
}
