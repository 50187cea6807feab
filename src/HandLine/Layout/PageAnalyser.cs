using HandLine.Imaging;

namespace HandLine.Layout;

/// <summary>
/// A scanned page to its lines in reading order, in stages: illumination flattening
/// (<see cref="IlluminationFlattener"/>, background division) → deskew (the rotation whose horizontal projection
/// profile is sharpest, searched within ± <see cref="PageOptions.MaxDeskewDegrees"/>, as for lines:
/// <c>SkewEstimator</c>) → binarisation (halfway from paper to ink, with hysteresis: <see cref="InkHysteresis"/>)
/// → ruled-line detection and removal
/// (<see cref="RuleRemover"/>, opening with long line-shaped structuring elements, crossing writing kept) → columns
/// (vertical rules that run down the page, and clear vertical strips with writing on both sides) → text lines
/// (<see cref="LineSegmenter"/>: smoothed projection profiles per column with connected-component assignment) →
/// reading order (entries top to bottom, each entry's parts left to right, each with its column). Every line's
/// box is mapped back into the page's own pixels. Made once from the options; keeps no state between pages.
/// </summary>
public sealed class PageAnalyser
{
    private readonly PageOptions _options;

    // Common practice, no source: ink less than this darker than the paper (on a 0..1 scale) is no writing.
    private const float MinContrast = 0.1f;

    /// <exception cref="ArgumentException">An option is out of range.</exception>
    public PageAnalyser(PageOptions? options = null)
    {
        var o = options ?? new PageOptions();
        o.Validate();
        _options = o;
    }

    public PageOptions Options => _options;

    /// <summary>
    /// Auto layout's rule: an image at least <see cref="PageOptions.PageMinHeight"/> pixels tall and at least half as
    /// tall as it is wide is a page; anything flatter or smaller is a line image (or a strip of a few lines).
    /// </summary>
    public bool LooksLikePage(GrayImage image)
    {
        ArgumentNullException.ThrowIfNull(image);
        return LooksLikePage(image.Width, image.Height);
    }

    /// <summary>The same test on an image's size alone (so a caller can ask about the image turned a quarter).</summary>
    public bool LooksLikePage(int width, int height) => height >= _options.PageMinHeight && height * 2 >= width;

    /// <summary>Whether the page's text lines run across it or down it (<see cref="PageAxisEstimator"/>); null when it holds no writing.</summary>
    public PageAxisGuess? GuessAxis(GrayImage page) => PageAxisEstimator.Guess(page, _options);

    /// <summary>The page's lines, in reading order; none for a blank page.</summary>
    public PageLayout Analyse(GrayImage page)
    {
        ArgumentNullException.ThrowIfNull(page);
        var o = _options;
        int w = page.Width, h = page.Height;
        var window = Math.Max(15, (int)(o.FlattenWindowFraction * Math.Min(w, h)));
        var flat = IlluminationFlattener.Flatten(page, window);

        var deskew = EstimateSkew(flat, o);
        var frame = PageFrame.For(flat, deskew);
        var upright = frame.IsIdentity ? flat : frame.Render(flat);
        flat = null!; // the page's copy is not needed past here; let a large page's memory go
        int uw = upright.Width, uh = upright.Height;

        var rules = Writing(upright, o, out var strong);
        if (rules is null)
            return new PageLayout(w, h, deskew, [], []);
        // Hysteresis: a component is writing only where some of its pixels are clearly dark.
        var components = InkHysteresis.Apply(rules.Ink, upright.Pixels, uw, uh, strong);
        var textHeight = LineSegmenter.TextHeight(components);
        if (textHeight <= 0)
            return new PageLayout(w, h, deskew, [], []);

        var dividers = Dividers(rules, components, textHeight, o);
        var (owner, segments) = LineSegmenter.Segment(components, uw, uh, dividers, textHeight, o);
        var pad = (int)Math.Ceiling(o.CropPadHeights * textHeight);
        var lines = new List<PageLine>(segments.Count);
        foreach (var s in segments)
        {
            var box = frame.ToPageBox(s.MinX, s.MinY, s.MaxX, s.MaxY, w, h);
            lines.Add(new PageLine(box, s.Column, s.Entry, Crop(upright, rules, owner, s, pad)));
        }
        return new PageLayout(w, h, deskew, dividers, lines);
    }

    /// <summary>
    /// The page's writing: a mask of the ink with the ruled lines taken off (<see cref="RuleRemover"/>); null when
    /// the page has too little contrast to hold any. <paramref name="strong"/>: the level a piece of writing must
    /// reach somewhere to be kept (<see cref="PageOptions.StrongInkShare"/>, see <see cref="InkHysteresis"/>).
    /// </summary>
    internal static RuleRemoval? Writing(GrayImage page, PageOptions o, out float strong)
    {
        strong = 0;
        // Paper is most of a page: its level is the median. Ink is the darkest percent (a page has more than that
        // of writing); a rule is darker than a quarter of the way from paper to ink. Rules can be darker than a
        // thin hand, so once they are found the levels are measured again without them, and writing is what is
        // darker than halfway from paper to ink.
        var px = page.Pixels;
        var histogram = Histogram.Build(px);
        var paper = Histogram.Quantile(histogram, 0.5);
        var inkLevel = Histogram.Quantile(histogram, o.InkQuantile);
        if (paper - inkLevel < MinContrast)
            return null;
        var ruleLevel = paper - 0.25f * (paper - inkLevel);
        var dark = new bool[px.Length];
        var ink = new byte[px.Length];
        for (var i = 0; i < px.Length; i++)
        {
            dark[i] = px[i] < ruleLevel;
            ink[i] = dark[i] ? (byte)1 : (byte)0;
        }
        var rules = RuleRemover.Remove(dark, ink, page.Width, page.Height, o);
        dark = null!;
        var rest = new long[256];
        for (var i = 0; i < px.Length; i++)
            if (rules.Removed[i] == 0) rest[Histogram.Bin(px[i])]++;
        var writing = Histogram.Quantile(rest, o.InkQuantile);
        if (paper - writing < MinContrast) writing = inkLevel;
        var threshold = paper - 0.5f * (paper - writing);
        for (var i = 0; i < px.Length; i++)
            rules.Ink[i] = rules.Removed[i] == 0 && px[i] < threshold ? (byte)1 : (byte)0;
        ink = null!;
        strong = paper - (float)o.StrongInkShare * (paper - writing);
        return rules;
    }

    private static double EstimateSkew(GrayImage flat, PageOptions o)
    {
        if (o.MaxDeskewDegrees <= 0) return 0;
        // Darkness, doubled so that ink is full and the paper's noise stays under the estimator's 0.2 floor.
        var d = new float[flat.Pixels.Length];
        for (var i = 0; i < d.Length; i++) d[i] = Math.Clamp(2 * (1 - flat.Pixels[i]), 0f, 1f);
        var factor = (int)Math.Max(1, Math.Ceiling(Math.Sqrt((double)flat.Width * flat.Height / o.DeskewPixels)));
        var small = Resampler.BoxDownscale(new GrayImage(flat.Width, flat.Height, d), factor);
        return SkewEstimator.Estimate(small, o.MaxDeskewDegrees).Degrees;
    }

    /// <summary>Column dividers: long vertical rules, then clear strips with writing on both sides within a column.</summary>
    private static List<double> Dividers(RuleRemoval rules, Components c, double textHeight, PageOptions o)
    {
        var dividers = rules.Vertical.Where(r => r.Length >= o.ColumnRuleFraction * rules.Height).Select(r => r.Position).ToList();
        // Clear strips: columns of the page with no ink of letter-sized components, between ink on both sides.
        var used = new bool[rules.Width];
        for (var i = 1; i <= c.Count; i++)
        {
            if (c.Area[i] < 30 || c.Height(i) < 0.3 * textHeight) continue;
            for (var x = c.MinX[i]; x <= c.MaxX[i]; x++) used[x] = true;
        }
        var bounds = new List<double> { -1 };
        bounds.AddRange(dividers);
        bounds.Add(rules.Width);
        var extra = new List<double>();
        for (var z = 0; z + 1 < bounds.Count; z++)
        {
            int from = (int)Math.Ceiling(bounds[z] + 1), to = (int)Math.Floor(bounds[z + 1] - 1);
            int first = -1, last = -1;
            for (var x = from; x <= to; x++)
                if (x >= 0 && x < rules.Width && used[x]) { if (first < 0) first = x; last = x; }
            if (first < 0) continue;
            var run = 0;
            for (var x = first; x <= last; x++)
            {
                if (!used[x]) { run++; continue; }
                if (run >= o.ColumnGapHeights * textHeight) extra.Add(x - run / 2.0);
                run = 0;
            }
        }
        dividers.AddRange(extra);
        dividers.Sort();
        return dividers;
    }

    /// <summary>The line's crop of the upright page: its own ink (and two pixels around it) on white paper.</summary>
    private static GrayImage Crop(GrayImage upright, RuleRemoval rules, LineSegmenter owner, Segment s, int pad)
    {
        int w = upright.Width, h = upright.Height;
        int x0 = Math.Max(0, s.MinX - pad), y0 = Math.Max(0, s.MinY - pad);
        int x1 = Math.Min(w - 1, s.MaxX + pad), y1 = Math.Min(h - 1, s.MaxY + pad);
        int cw = x1 - x0 + 1, ch = y1 - y0 + 1;
        var mask = new byte[cw * ch];
        for (var y = 0; y < ch; y++)
            for (var x = 0; x < cw; x++)
                if (owner.OwnerAt(x0 + x, y0 + y) == s.Id) mask[y * cw + x] = 1;
        // Grow the mask twice by a pixel: the threshold leaves out the soft edge of each stroke.
        for (var pass = 0; pass < 2; pass++)
        {
            var grown = (byte[])mask.Clone();
            for (var y = 0; y < ch; y++)
                for (var x = 0; x < cw; x++)
                {
                    if (mask[y * cw + x] == 0) continue;
                    for (var dy = -1; dy <= 1; dy++)
                        for (var dx = -1; dx <= 1; dx++)
                        {
                            int xx = x + dx, yy = y + dy;
                            if ((uint)xx < (uint)cw && (uint)yy < (uint)ch) grown[yy * cw + xx] = 1;
                        }
                }
            mask = grown;
        }
        var pixels = new float[cw * ch];
        for (var y = 0; y < ch; y++)
            for (var x = 0; x < cw; x++)
            {
                var i = (y0 + y) * w + x0 + x;
                pixels[y * cw + x] = mask[y * cw + x] != 0 && rules.Removed[i] == 0 ? upright.Pixels[i] : 1f;
            }
        return new GrayImage(cw, ch, pixels);
    }
}
