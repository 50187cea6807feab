using HandLine.Imaging;

namespace HandLine.Synthesis;

/// <summary>
/// Draws one ruled page of the invented scenario in one hand: ruled rows with the writing standing on the rules
/// (descenders cross them), a margin rule, money or register columns between vertical rules, indented and short
/// entries, blank rows, sometimes rows so close that neighbouring rows touch; then paper grain, stains, a skew of
/// the whole sheet, uneven light, blur and noise. Each part is drawn by <see cref="LineRenderer"/> (clean: the
/// page adds the wear), so pages and training lines share one hand model. Deterministic for a given seed.
/// </summary>
public static class PageRenderer
{
    private sealed record Placed(int Entry, int Column, string Text, float[] Ink, int W, int H, int X, int Y);

    /// <summary>Draws a page; the parts' texts come from <paramref name="text"/>, all in <paramref name="font"/>.</summary>
    public static SyntheticPage Render(PageKind kind, FontFace font, PhraseGenerator text, int seed, PageSynthesisOptions options)
    {
        ArgumentNullException.ThrowIfNull(font);
        ArgumentNullException.ThrowIfNull(text);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        var rng = new Random(seed);
        int w = options.Width, h = options.Height;
        var size = options.FontSizePx.Sample(rng);
        var touching = rng.NextDouble() < options.TouchingShare;
        // Rows 1.05-1.2 writing sizes apart make ascenders and descenders of neighbours meet; 1.35-1.8 leave a gap.
        var pitch = size * (touching ? 1.05 + 0.15 * rng.NextDouble() : 1.35 + 0.45 * rng.NextDouble());
        var skew = (2 * rng.NextDouble() - 1) * options.MaxSkewDegrees;
        var hand = Hand(rng, size);

        // Vertical rules, left to right; a part's column is the space between two of them.
        double[] rules = kind == PageKind.Ledger
            ? [w * (0.10 + 0.04 * rng.NextDouble()), w * (0.74 + 0.04 * rng.NextDouble()), w * (0.955 + 0.01 * rng.NextDouble())]
            : [w * (0.09 + 0.03 * rng.NextDouble()), w * (0.47 + 0.05 * rng.NextDouble()), w * (0.74 + 0.04 * rng.NextDouble()), w * (0.955 + 0.01 * rng.NextDouble())];
        var gutter = 0.012 * w;

        var placed = new List<Placed>();
        var firstRule = h * (0.07 + 0.03 * rng.NextDouble()) + pitch;
        var rows = new List<double>();
        for (var y = firstRule; y < h * 0.95; y += pitch) rows.Add(y);
        var entry = 0;
        foreach (var ruleY in rows)
        {
            if (rng.NextDouble() < 0.08) continue; // a blank row
            var baseline = ruleY - size * 0.08 * rng.NextDouble();
            var row = new List<Placed>();
            for (var attempt = 0; attempt < 4 && row.Count == 0; attempt++)
                row = kind == PageKind.Ledger
                    ? LedgerRow(text, font, hand, rng, rules, gutter, baseline, entry)
                    : RegisterRow(text, font, hand, rng, rules, gutter, baseline, entry);
            if (row.Count == 0) continue;
            placed.AddRange(row);
            entry++;
        }

        var paper = Paper(w, h, rng, options.Wear, options.Grain, rows, rules, firstRule - pitch, rows.Count > 0 ? rows[^1] : h * 0.9);
        var ink = new float[w * h];
        foreach (var p in placed)
            for (var y = 0; y < p.H; y++)
            {
                var py = p.Y + y;
                if ((uint)py >= (uint)h) continue;
                for (var x = 0; x < p.W; x++)
                {
                    var px = p.X + x;
                    if ((uint)px >= (uint)w) continue;
                    ref var v = ref ink[py * w + px];
                    v = Math.Max(v, p.Ink[y * p.W + x]);
                }
            }

        var turn = new Turn(w, h, skew);
        var light = Light.Sample(rng, w, h, options.Wear);
        var inkLum = (float)(0.05 + 0.2 * rng.NextDouble());
        var blur = options.Wear * (0.3 + 0.5 * rng.NextDouble());
        var noise = options.Grain * (0.008 + 0.017 * rng.NextDouble());
        var page = Shade(0, 0, w, h, turn, light, paper, (px, py) => RasterOps.Bilinear(ink, w, h, px, py), inkLum);
        RasterOps.GaussianBlur(page, w, h, blur);
        var pixelNoise = new PixelNoise(rng.Next());
        RasterOps.AddGaussianNoise(page, ref pixelNoise, noise);
        RasterOps.Clamp01(page);

        var parts = new List<PagePart>();
        var lines = new List<GrayImage>();
        var pad = (int)Math.Ceiling(0.3 * size);
        foreach (var p in placed)
        {
            var (bx, by, bw, bh) = TruthBox(p, turn, w, h);
            if (bw <= 0 || bh <= 0) continue;
            parts.Add(new PagePart(p.Entry, p.Column, p.Text, bx, by, bw, bh));
            int x0 = Math.Max(0, bx - pad), y0 = Math.Max(0, by - pad);
            int x1 = Math.Min(w, bx + bw + pad), y1 = Math.Min(h, by + bh + pad);
            var line = Shade(x0, y0, x1 - x0, y1 - y0, turn, light, paper,
                (px, py) => RasterOps.Bilinear(p.Ink, p.W, p.H, px - p.X, py - p.Y), inkLum);
            RasterOps.GaussianBlur(line, x1 - x0, y1 - y0, blur);
            RasterOps.AddGaussianNoise(line, ref pixelNoise, noise);
            RasterOps.Clamp01(line);
            lines.Add(new GrayImage(x1 - x0, y1 - y0, line));
        }
        return new SyntheticPage(new GrayImage(w, h, page), kind, font, Math.Round(skew, 3), touching, parts, lines);
    }

    /// <summary>A page's hand: the line renderer's variation, clean of the wear that the page adds itself.</summary>
    private static Degradation Hand(Random rng, double size) =>
        Degradation.Sample(rng, new DegradationRanges()) with
        {
            FontSizePx = size,
            PadLeftPx = 2,
            PadRightPx = 2,
            PadTopPx = 2,
            PadBottomPx = 2,
            InkLuminance = 0,
            PaperLuminance = 1,
            RotationDegrees = 0,
            PaperTexture = 0,
            Lighting = 0,
            BlurSigmaPx = 0,
            NoiseSigma = 0,
            JpegQuality = 0,
            RuledLineDarkness = 0,
            BleedThroughDarkness = 0,
            Fading = 0,
            WobbleAmplitudePx = Math.Min(1.5, size / 25),
        };

    private static Placed? Draw(string text, FontFace font, Degradation hand, Random rng, int entry, int column,
        double x, double baseline, double? rightEdge, double limitLeft, double limitRight)
    {
        if (font.DrawsOnlyCapitals) text = text.ToUpperInvariant();
        if (!font.Covers(text)) return null;
        var image = LineRenderer.Render(text, font, hand with { Seed = rng.Next() }, out var baselineY);
        var inkW = image.Width;
        var left = rightEdge is { } r ? r - inkW : x;
        if (left < limitLeft || left + inkW > limitRight) return null;
        var ink = new float[image.Pixels.Length];
        for (var i = 0; i < ink.Length; i++) ink[i] = 1 - image.Pixels[i];
        return new Placed(entry, column, text, ink, image.Width, image.Height,
            (int)Math.Round(left), (int)Math.Round(baseline - baselineY));
    }

    private static List<Placed> LedgerRow(PhraseGenerator text, FontFace font, Degradation hand, Random rng,
        double[] rules, double gutter, double baseline, int entry)
    {
        var (margin, description, amount) = text.LedgerEntry();
        var parts = new List<Placed>();
        var indent = rng.NextDouble() < 0.2 ? (0.05 + 0.08 * rng.NextDouble()) * rules[2] : 0;
        var main = Draw(description, font, hand, rng, entry, 1, rules[0] + gutter + indent, baseline, null, rules[0] + 2, rules[1] - gutter / 2);
        if (main is null) return parts;
        if (margin is not null && Draw(margin, font, hand, rng, entry, 0, gutter * 1.5, baseline, null, 0, rules[0] - gutter / 2) is { } m)
            parts.Add(m);
        parts.Add(main);
        if (amount is not null && Draw(amount, font, hand, rng, entry, 2, 0, baseline, rules[2] - gutter, rules[1] + gutter / 2, rules[2] - 2) is { } a)
            parts.Add(a);
        return parts;
    }

    private static List<Placed> RegisterRow(PhraseGenerator text, FontFace font, Degradation hand, Random rng,
        double[] rules, double gutter, double baseline, int entry)
    {
        var (number, name, abode, date) = text.RegisterEntry();
        var parts = new List<Placed>();
        var fields = new[] { number, name, abode, date };
        for (var c = 0; c < fields.Length; c++)
        {
            var left = c == 0 ? gutter * 1.5 : rules[c - 1] + gutter;
            var part = Draw(fields[c], font, hand, rng, entry, c, left, baseline, null, c == 0 ? 0 : rules[c - 1] + 2, rules[c] - gutter / 2);
            // The name carries the entry; a row whose name does not fit is drawn again with other text.
            if (part is null && c == 1) return [];
            if (part is not null) parts.Add(part);
        }
        return parts;
    }

    /// <summary>Paper before the turn: its level, grain, stains and the rules (luminance, row-major).</summary>
    private sealed record PaperLayer(float[] Pixels, float Level);

    private static PaperLayer Paper(int w, int h, Random rng, double wear, double grain, List<double> rows, double[] rules, double top, double bottom)
    {
        var level = (float)(0.86 + 0.1 * rng.NextDouble());
        var p = new float[w * h];
        Array.Fill(p, level);
        var noise = new PixelNoise(rng.Next());
        if (wear > 0 || grain > 0)
        {
            var fine = RasterOps.ValueNoise(ref noise, w, h, 3);
            var coarse = RasterOps.ValueNoise(ref noise, w, h, 60);
            var a = (float)(0.025 * grain);
            for (var i = 0; i < p.Length; i++) p[i] += a * (0.4f * fine[i] + 0.6f * coarse[i]);
            // Stains: soft, uneven blots (tea, damp), darker towards a rim now and then.
            var stains = rng.Next(0, 4);
            for (var s = 0; s < stains; s++)
            {
                double cx = w * rng.NextDouble(), cy = h * rng.NextDouble(), r = w * (0.04 + 0.12 * rng.NextDouble());
                var dark = wear * (0.06 + 0.16 * rng.NextDouble());
                var rim = rng.NextDouble() < 0.5;
                int x0 = Math.Max(0, (int)(cx - r)), x1 = Math.Min(w - 1, (int)(cx + r));
                int y0 = Math.Max(0, (int)(cy - r)), y1 = Math.Min(h - 1, (int)(cy + r));
                for (var y = y0; y <= y1; y++)
                    for (var x = x0; x <= x1; x++)
                    {
                        var d = Math.Sqrt((x - cx) * (x - cx) + (y - cy) * (y - cy)) / r + 0.15 * coarse[y * w + x];
                        if (d >= 1) continue;
                        var f = rim ? 0.5 + 0.5 * Math.Pow(d, 4) : 1 - d * d;
                        p[y * w + x] *= (float)(1 - dark * f);
                    }
            }
        }
        // Rules: thin and light; the horizontal ones across the page, the vertical ones down the ruled part.
        var ruleDark = 0.2 + 0.25 * rng.NextDouble();
        var thickness = 1 + rng.Next(3);
        foreach (var y in rows)
            HorizontalRule(p, w, h, y, 0.02 * w, 0.98 * w, thickness, ruleDark);
        HorizontalRule(p, w, h, top, 0.02 * w, 0.98 * w, thickness + 1, ruleDark);
        foreach (var x in rules)
            VerticalRule(p, w, h, x, top, bottom + 0.3 * (bottom - top) / Math.Max(1, rows.Count), thickness, ruleDark);
        return new PaperLayer(p, level);
    }

    private static void HorizontalRule(float[] p, int w, int h, double y, double x0, double x1, int thickness, double dark)
    {
        for (var yy = (int)Math.Floor(y - thickness / 2.0 - 1); yy <= (int)Math.Ceiling(y + thickness / 2.0 + 1); yy++)
        {
            if ((uint)yy >= (uint)h) continue;
            var cover = Math.Clamp(thickness / 2.0 + 0.5 - Math.Abs(yy - y), 0, 1);
            if (cover <= 0) continue;
            for (var x = (int)x0; x < (int)x1; x++) p[yy * w + x] *= (float)(1 - dark * cover);
        }
    }

    private static void VerticalRule(float[] p, int w, int h, double x, double y0, double y1, int thickness, double dark)
    {
        for (var xx = (int)Math.Floor(x - thickness / 2.0 - 1); xx <= (int)Math.Ceiling(x + thickness / 2.0 + 1); xx++)
        {
            if ((uint)xx >= (uint)w) continue;
            var cover = Math.Clamp(thickness / 2.0 + 0.5 - Math.Abs(xx - x), 0, 1);
            if (cover <= 0) continue;
            for (var y = Math.Max(0, (int)y0); y < Math.Min(h, (int)y1); y++) p[y * w + xx] *= (float)(1 - dark * cover);
        }
    }

    /// <summary>
    /// The sheet turned by the skew about the page centre: a positive angle turns the writing anticlockwise (its
    /// rows rise to the right), as the library's deskew reports it.
    /// </summary>
    private readonly record struct Turn(int W, int H, double Degrees)
    {
        private double Cx => (W - 1) / 2.0;
        private double Cy => (H - 1) / 2.0;
        private double Cos => Math.Cos(Degrees * Math.PI / 180);
        private double Sin => Math.Sin(Degrees * Math.PI / 180);

        /// <summary>Where a point of the flat sheet lands on the scan.</summary>
        public (double X, double Y) Forward(double x, double y)
        {
            double dx = x - Cx, dy = y - Cy;
            return (Cx + Cos * dx + Sin * dy, Cy - Sin * dx + Cos * dy);
        }

        /// <summary>Which point of the flat sheet a scan pixel shows.</summary>
        public (double X, double Y) Back(double u, double v)
        {
            double du = u - Cx, dv = v - Cy;
            return (Cx + Cos * du - Sin * dv, Cy + Sin * du + Cos * dv);
        }
    }

    /// <summary>Uneven light of the scan: a linear fall-off in a random direction and a darker rim.</summary>
    private sealed record Light(double Drop, double AngleRadians, double Vignette, int W, int H)
    {
        public static Light Sample(Random rng, int w, int h, double wear) =>
            new(wear * (0.05 + 0.25 * rng.NextDouble()), 2 * Math.PI * rng.NextDouble(), wear * 0.15 * rng.NextDouble(), w, h);

        public float At(int x, int y)
        {
            double ux = Math.Cos(AngleRadians), uy = Math.Sin(AngleRadians);
            var span = Math.Abs(ux) * W + Math.Abs(uy) * H;
            double x0 = ux < 0 ? W : 0, y0 = uy < 0 ? H : 0;
            var t = ((x - x0) * ux + (y - y0) * uy) / span;
            double dx = (x - W / 2.0) / (W / 2.0), dy = (y - H / 2.0) / (H / 2.0);
            return (float)((1 - Drop * t) * (1 - Vignette * 0.5 * (dx * dx + dy * dy)));
        }
    }

    /// <summary>The scan's pixels in a window: paper and ink of the flat sheet seen through the turn, then the light.</summary>
    private static float[] Shade(int x0, int y0, int w, int h, Turn turn, Light light, PaperLayer paper,
        Func<float, float, float> inkAt, float inkLum)
    {
        var result = new float[w * h];
        for (var j = 0; j < h; j++)
            for (var i = 0; i < w; i++)
            {
                var (px, py) = turn.Back(x0 + i, y0 + j);
                var inside = px > -1 && py > -1 && px < turn.W && py < turn.H;
                var lum = inside ? RasterOps.Bilinear(paper.Pixels, turn.W, turn.H, (float)px, (float)py) : paper.Level;
                if (inside && (px < 0 || py < 0 || px > turn.W - 1 || py > turn.H - 1)) lum = paper.Level;
                var ink = inside ? Math.Clamp(inkAt((float)px, (float)py), 0f, 1f) : 0f;
                result[j * w + i] = (lum + (inkLum - lum) * ink) * light.At(x0 + i, y0 + j);
            }
        return result;
    }

    /// <summary>Axis-aligned bounds, on the scan, of the part's ink (pixels of at least 0.3 ink).</summary>
    private static (int X, int Y, int W, int H) TruthBox(Placed p, Turn turn, int w, int h)
    {
        double minX = double.MaxValue, minY = double.MaxValue, maxX = double.MinValue, maxY = double.MinValue;
        for (var y = 0; y < p.H; y++)
            for (var x = 0; x < p.W; x++)
            {
                if (p.Ink[y * p.W + x] < 0.3f) continue;
                var (u, v) = turn.Forward(p.X + x, p.Y + y);
                minX = Math.Min(minX, u); maxX = Math.Max(maxX, u);
                minY = Math.Min(minY, v); maxY = Math.Max(maxY, v);
            }
        if (minX > maxX) return (0, 0, 0, 0);
        int x0 = Math.Clamp((int)Math.Floor(minX), 0, w - 1), y0 = Math.Clamp((int)Math.Floor(minY), 0, h - 1);
        int x1 = Math.Clamp((int)Math.Ceiling(maxX), 0, w - 1), y1 = Math.Clamp((int)Math.Ceiling(maxY), 0, h - 1);
        return (x0, y0, x1 - x0 + 1, y1 - y0 + 1);
    }
}
