namespace HandLine.Layout;

/// <summary>
/// Ruled-line detection and removal on the upright page. A pixel belongs to a rule when it lies on a straight dark
/// run at least <see cref="PageOptions.RuleMinLengthFraction"/> of the page long, along a row (horizontal rules)
/// or a column (vertical rules): for a binary image this is a morphological opening with a line-shaped structuring
/// element of that length (Serra 1982, "Image Analysis and Mathematical Morphology"), computed directly as run
/// lengths, with gaps of up to two pixels bridged. A rule pixel is then taken off only where the dark run across the
/// rule is no thicker than a rule (<see cref="PageOptions.RuleMaxThicknessPx"/>): where a letter crosses the rule,
/// the run across is the stroke's length, and the pixel is kept, so writing is not cut where it meets a rule.
/// </summary>
internal static class RuleRemover
{
    private const int GapBridge = 2;

    // Common practice, no source: longer than any letter's stroke at scanning resolutions up to about 400 dpi.
    private const int MinRuleLengthPx = 60;

    /// <param name="dark">Pixels dark enough to be a rule (a faint rule is lighter than ink).</param>
    /// <param name="ink">Pixels dark enough to be writing; a copy is returned with the rules taken off.</param>
    public static RuleRemoval Remove(bool[] dark, byte[] ink, int w, int h, PageOptions options)
    {
        ArgumentNullException.ThrowIfNull(dark);
        ArgumentNullException.ThrowIfNull(ink);
        ArgumentNullException.ThrowIfNull(options);
        if (dark.Length != (long)w * h || ink.Length != dark.Length)
            throw new ArgumentException("the masks must both hold w x h pixels");
        // Never shorter than MinRuleLengthPx: on a small image (a line taken as a page) a share of its height is
        // no longer than a tall letter's stroke.
        var minH = Math.Max(MinRuleLengthPx, (int)(options.RuleMinLengthFraction * w));
        var minV = Math.Max(MinRuleLengthPx, (int)(options.RuleMinLengthFraction * h));
        var onH = new bool[dark.Length];
        var onV = new bool[dark.Length];
        // Along rows.
        for (var y = 0; y < h; y++)
            MarkRuns(dark, onH, y * w, 1, w, minH);
        // Along columns.
        for (var x = 0; x < w; x++)
            MarkRuns(dark, onV, x, w, h, minV);

        var cleaned = (byte[])ink.Clone();
        var removed = new byte[ink.Length];
        var count = 0;
        var thick = options.RuleMaxThicknessPx;
        for (var y = 0; y < h; y++)
            for (var x = 0; x < w; x++)
            {
                var i = y * w + x;
                // Where two rules cross, each runs long across the other: neither is writing.
                var take = (onH[i] && onV[i])
                           || (onH[i] && RunAcross(dark, w, h, x, y, 0, 1, thick) <= thick)
                           || (onV[i] && RunAcross(dark, w, h, x, y, 1, 0, thick) <= thick);
                if (!take) continue;
                removed[i] = 1;
                cleaned[i] = 0;
                count++;
            }
        return new RuleRemoval(w, h, cleaned, removed, Lines(onH, w, h, horizontal: true, minH), Lines(onV, w, h, horizontal: false, minV), count);
    }

    /// <summary>Marks the dark pixels of every run (gaps bridged) at least <paramref name="min"/> long along one line of pixels.</summary>
    private static void MarkRuns(bool[] dark, bool[] on, int start, int step, int n, int min)
    {
        var runStart = -1;
        var lastDark = -1;
        for (var k = 0; k <= n; k++)
        {
            var isDark = k < n && dark[start + k * step];
            if (isDark)
            {
                if (runStart < 0 || k - lastDark - 1 > GapBridge)
                {
                    Close(runStart, lastDark);
                    runStart = k;
                }
                lastDark = k;
            }
        }
        Close(runStart, lastDark);

        void Close(int from, int to)
        {
            if (from < 0 || to - from + 1 < min) return;
            for (var k = from; k <= to; k++)
                if (dark[start + k * step]) on[start + k * step] = true;
        }
    }

    /// <summary>Length of the dark run through (x, y) across the rule, counted up to limit + 1.</summary>
    private static int RunAcross(bool[] dark, int w, int h, int x, int y, int dx, int dy, int limit)
    {
        var n = 1;
        for (int k = 1, xx = x - dx, yy = y - dy; n <= limit && (uint)xx < (uint)w && (uint)yy < (uint)h && dark[yy * w + xx]; k++, xx -= dx, yy -= dy) n++;
        for (int k = 1, xx = x + dx, yy = y + dy; n <= limit && (uint)xx < (uint)w && (uint)yy < (uint)h && dark[yy * w + xx]; k++, xx += dx, yy += dy) n++;
        return n;
    }

    /// <summary>The rules as lines: neighbouring rows (columns) rich in rule pixels merged, with their extent.</summary>
    private static List<Rule> Lines(bool[] on, int w, int h, bool horizontal, int min)
    {
        int across = horizontal ? h : w, along = horizontal ? w : h;
        var counts = new int[across];
        var first = new int[across];
        var last = new int[across];
        Array.Fill(first, int.MaxValue);
        Array.Fill(last, -1);
        for (var y = 0; y < h; y++)
            for (var x = 0; x < w; x++)
            {
                if (!on[y * w + x]) continue;
                int row = horizontal ? y : x, b = horizontal ? x : y;
                counts[row]++;
                first[row] = Math.Min(first[row], b);
                last[row] = Math.Max(last[row], b);
            }
        var rules = new List<Rule>();
        var a = 0;
        while (a < across)
        {
            if (counts[a] < min) { a++; continue; }
            // Rows within two of each other are one rule (a thick or slightly tilted one).
            var end = a;
            for (var k = a + 1; k < across && k <= end + 2; k++)
                if (counts[k] >= min) end = k;
            double weighted = 0, total = 0;
            int start = int.MaxValue, stop = -1;
            for (var k = a; k <= end; k++)
            {
                if (counts[k] == 0) continue;
                weighted += (double)k * counts[k];
                total += counts[k];
                start = Math.Min(start, first[k]);
                stop = Math.Max(stop, last[k]);
            }
            rules.Add(new Rule(weighted / total, start, Math.Min(stop, along - 1)));
            a = end + 1;
        }
        return rules;
    }
}
