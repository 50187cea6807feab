namespace HandLine.Synthesis;

/// <summary>
/// The concrete degradations of one line, so a line can be re-rendered and its distortions logged.
/// Effect strengths of 0 mean "off". <c>new Degradation()</c> is a clean rendering.
/// Per-glyph and per-pixel randomness comes from <see cref="Seed"/>.
/// </summary>
public sealed record Degradation
{
    public int Seed { get; init; }
    public double FontSizePx { get; init; } = 40;
    public double PadLeftPx { get; init; } = 8;
    public double PadRightPx { get; init; } = 8;
    public double PadTopPx { get; init; } = 8;
    public double PadBottomPx { get; init; } = 8;
    public double InkLuminance { get; init; }
    public double PaperLuminance { get; init; } = 1;
    public double RotationDegrees { get; init; }
    public double ShearDegrees { get; init; }
    public double WobbleAmplitudePx { get; init; }
    public double WobblePeriodPx { get; init; } = 300;
    public double WobblePhase { get; init; }
    public double GlyphScaleJitter { get; init; }
    public double GlyphOffsetJitterPx { get; init; }
    public double GlyphRotationJitterDegrees { get; init; }
    public double LetterSpacingEm { get; init; }
    public double StrokeWidthPx { get; init; }
    public double Erosion { get; init; }
    public double ElasticAlphaPx { get; init; }
    public double ElasticSigmaPx { get; init; } = 6;
    public double Fading { get; init; }
    public double PaperTexture { get; init; }
    public double Lighting { get; init; }
    public double LightingAngleDegrees { get; init; }
    public double BlurSigmaPx { get; init; }
    public double NoiseSigma { get; init; }

    /// <summary>JPEG round-trip quality 1..100, or 0 for none.</summary>
    public int JpegQuality { get; init; }

    public double RuledLineDarkness { get; init; }
    public double RuledLineOffsetPx { get; init; }
    public double BleedThroughDarkness { get; init; }

    /// <summary>Horizontal shift of the show-through, as a share of the line width.</summary>
    public double BleedShift { get; init; }

    public double BleedOffsetYPx { get; init; }

    /// <summary>Standard deviation of each glyph's own lean, on top of the line's shear.</summary>
    public double GlyphShearJitterDegrees { get; init; }

    /// <summary>Standard deviation of each glyph's pen weight (stroke width added or taken), in pixels.</summary>
    public double GlyphWeightJitterPx { get; init; }

    /// <summary>Amplitude of the slow random drift of the baseline along the line (besides the sine wobble).</summary>
    public double BaselineDriftPx { get; init; }

    /// <summary>Distance between the drift's random knots, in em.</summary>
    public double BaselineDriftCellEm { get; init; } = 2.5;

    /// <summary>Standard deviation of each gap after a glyph, in em (word spaces vary three times as much).</summary>
    public double GapJitterEm { get; init; }

    /// <summary>Chance that a glyph is tucked into its left neighbour, so the two touch or overlap.</summary>
    public double TouchProbability { get; init; }

    /// <summary>How far a tucked glyph moves left, in em.</summary>
    public double TouchDepthEm { get; init; }

    /// <summary>Largest share of ink lost where the pen pressed lightly (a smooth random field over the line).</summary>
    public double PressureVariation { get; init; }

    /// <summary>In font lines, the chance that each slash, dash, full stop, colon or comma is a pen stroke instead of a glyph.</summary>
    public double PenSeparatorShare { get; init; }

    /// <summary>The same chance in lines of MNIST digits.</summary>
    public double DigitPenSeparatorShare { get; init; }

    /// <summary>Pen width of stroke faces and pen-drawn separators, as a share of the font size.</summary>
    public double PenWidthEm { get; init; } = 0.06;

    /// <summary>How much the pen width swells and thins along a stroke (relative).</summary>
    public double PenWidthVariation { get; init; }

    /// <summary>Standard deviation of the hand's deviation from a stroke's ideal path, in pixels.</summary>
    public double PenJitterPx { get; init; }

    /// <summary>Draws one line's degradations from the ranges.</summary>
    public static Degradation Sample(Random rng, DegradationRanges ranges)
    {
        ArgumentNullException.ThrowIfNull(rng);
        ArgumentNullException.ThrowIfNull(ranges);
        // Evaluated in declaration order (C# object initialisers are left to right).
        return new Degradation
        {
            Seed = rng.Next(),
            FontSizePx = ranges.FontSizePx.Sample(rng),
            PadLeftPx = ranges.PaddingPx.Sample(rng),
            PadRightPx = ranges.PaddingPx.Sample(rng),
            PadTopPx = ranges.PaddingPx.Sample(rng),
            PadBottomPx = ranges.PaddingPx.Sample(rng),
            InkLuminance = ranges.InkLuminance.Sample(rng),
            PaperLuminance = ranges.PaperLuminance.Sample(rng),
            RotationDegrees = ranges.RotationDegrees.Sample(rng),
            ShearDegrees = ranges.ShearDegrees.Sample(rng),
            WobbleAmplitudePx = ranges.WobbleAmplitudePx.Sample(rng),
            WobblePeriodPx = ranges.WobblePeriodPx.Sample(rng),
            WobblePhase = 2 * Math.PI * rng.NextDouble(),
            GlyphScaleJitter = ranges.GlyphScaleJitter.Sample(rng),
            GlyphOffsetJitterPx = ranges.GlyphOffsetJitterPx.Sample(rng),
            GlyphRotationJitterDegrees = ranges.GlyphRotationJitterDegrees.Sample(rng),
            LetterSpacingEm = ranges.LetterSpacingEm.Sample(rng),
            StrokeWidthPx = ranges.StrokeWidthPx.Sample(rng),
            Erosion = ranges.Erosion.Sample(rng),
            ElasticAlphaPx = ranges.ElasticAlphaPx.Sample(rng),
            ElasticSigmaPx = ranges.ElasticSigmaPx.Sample(rng),
            Fading = ranges.Fading.Sample(rng),
            PaperTexture = ranges.PaperTexture.Sample(rng),
            Lighting = ranges.Lighting.Sample(rng),
            LightingAngleDegrees = 360 * rng.NextDouble(),
            BlurSigmaPx = ranges.BlurSigmaPx.Sample(rng),
            NoiseSigma = ranges.NoiseSigma.Sample(rng),
            JpegQuality = (int)Math.Round(ranges.JpegQuality.Sample(rng)),
            RuledLineDarkness = ranges.RuledLineDarkness.Sample(rng),
            RuledLineOffsetPx = ranges.RuledLineOffsetPx.Sample(rng),
            BleedThroughDarkness = ranges.BleedThroughDarkness.Sample(rng),
            BleedShift = rng.NextDouble(),
            BleedOffsetYPx = -6 + 12 * rng.NextDouble(),
            GlyphShearJitterDegrees = ranges.GlyphShearJitterDegrees.Sample(rng),
            GlyphWeightJitterPx = ranges.GlyphWeightJitterPx.Sample(rng),
            BaselineDriftPx = ranges.BaselineDriftPx.Sample(rng),
            BaselineDriftCellEm = ranges.BaselineDriftCellEm.Sample(rng),
            GapJitterEm = ranges.GapJitterEm.Sample(rng),
            TouchProbability = ranges.TouchProbability.Sample(rng),
            TouchDepthEm = ranges.TouchDepthEm.Sample(rng),
            PressureVariation = ranges.PressureVariation.Sample(rng),
            PenSeparatorShare = ranges.PenSeparatorShare.Sample(rng),
            DigitPenSeparatorShare = ranges.DigitPenSeparatorShare.Sample(rng),
            PenWidthEm = ranges.PenWidthEm.Sample(rng),
            PenWidthVariation = ranges.PenWidthVariation.Sample(rng),
            PenJitterPx = ranges.PenJitterPx.Sample(rng),
        };
    }

    /// <summary>Throws when a value would break rendering (not when it is merely unusual).</summary>
    internal void Validate()
    {
        static void Check(bool ok, string name, double value)
        {
            if (!ok)
                throw new ArgumentException($"Degradation {name} = {value} is out of range.");
        }
        Check(FontSizePx is >= 4 and <= 400, nameof(FontSizePx), FontSizePx);
        foreach (var (n, v) in new[] { (nameof(PadLeftPx), PadLeftPx), (nameof(PadRightPx), PadRightPx),
                     (nameof(PadTopPx), PadTopPx), (nameof(PadBottomPx), PadBottomPx) })
            Check(v is >= 0 and <= 1000, n, v);
        Check(InkLuminance is >= 0 and <= 1, nameof(InkLuminance), InkLuminance);
        Check(PaperLuminance is >= 0 and <= 1, nameof(PaperLuminance), PaperLuminance);
        Check(Math.Abs(RotationDegrees) <= 45, nameof(RotationDegrees), RotationDegrees);
        Check(Math.Abs(ShearDegrees) <= 60, nameof(ShearDegrees), ShearDegrees);
        Check(WobblePeriodPx > 0, nameof(WobblePeriodPx), WobblePeriodPx);
        Check(ElasticSigmaPx is > 0 and <= 100, nameof(ElasticSigmaPx), ElasticSigmaPx);
        Check(BlurSigmaPx is >= 0 and <= 20, nameof(BlurSigmaPx), BlurSigmaPx);
        Check(StrokeWidthPx is >= 0 and <= 20, nameof(StrokeWidthPx), StrokeWidthPx);
        Check(Erosion is >= 0 and <= 1, nameof(Erosion), Erosion);
        Check(Fading is >= 0 and <= 1, nameof(Fading), Fading);
        Check(JpegQuality is >= 0 and <= 100, nameof(JpegQuality), JpegQuality);
        Check(LetterSpacingEm is > -0.5 and < 2, nameof(LetterSpacingEm), LetterSpacingEm);
        foreach (var (n, v) in new[] { (nameof(WobbleAmplitudePx), WobbleAmplitudePx),
                     (nameof(GlyphScaleJitter), GlyphScaleJitter), (nameof(GlyphOffsetJitterPx), GlyphOffsetJitterPx),
                     (nameof(GlyphRotationJitterDegrees), GlyphRotationJitterDegrees),
                     (nameof(ElasticAlphaPx), ElasticAlphaPx), (nameof(PaperTexture), PaperTexture),
                     (nameof(Lighting), Lighting), (nameof(NoiseSigma), NoiseSigma),
                     (nameof(RuledLineDarkness), RuledLineDarkness), (nameof(BleedThroughDarkness), BleedThroughDarkness) })
            Check(double.IsFinite(v) && v >= 0, n, v);
        Check(GlyphScaleJitter < 0.5, nameof(GlyphScaleJitter), GlyphScaleJitter);
        foreach (var (n, v) in new[] { (nameof(GlyphShearJitterDegrees), GlyphShearJitterDegrees),
                     (nameof(GlyphWeightJitterPx), GlyphWeightJitterPx), (nameof(BaselineDriftPx), BaselineDriftPx),
                     (nameof(GapJitterEm), GapJitterEm), (nameof(TouchDepthEm), TouchDepthEm),
                     (nameof(PenWidthVariation), PenWidthVariation), (nameof(PenJitterPx), PenJitterPx) })
            Check(double.IsFinite(v) && v >= 0 && v <= 100, n, v);
        foreach (var (n, v) in new[] { (nameof(TouchProbability), TouchProbability), (nameof(PenSeparatorShare), PenSeparatorShare),
                     (nameof(DigitPenSeparatorShare), DigitPenSeparatorShare) })
            Check(v is >= 0 and <= 1, n, v);
        Check(PressureVariation is >= 0 and <= 0.9, nameof(PressureVariation), PressureVariation);
        Check(BaselineDriftCellEm is >= 0.2 and <= 100, nameof(BaselineDriftCellEm), BaselineDriftCellEm);
        Check(PenWidthEm is > 0 and <= 0.3, nameof(PenWidthEm), PenWidthEm);
        Check(PenWidthVariation < 1, nameof(PenWidthVariation), PenWidthVariation);
    }
}
