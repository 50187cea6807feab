namespace HandLine.Layout;

/// <summary>
/// Text-line segmentation of the upright, rule-free page: in each column, the row profile of the ink (pixels per
/// row) is smoothed with a Gaussian, and each peak is a line, its band reaching to the deepest valley between it and
/// the next peak (projection-profile segmentation, common practice, no source). The column's line pitch, from the
/// profile's autocorrelation, keeps peaks about a pitch apart as two lines even where touching rows fill the valley
/// between them. Connected components then go to
/// the lines: a component with most of its ink (<see cref="PageOptions.WholeComponentShare"/>) in one band belongs
/// to that line whole, so ascenders and descenders that reach into a neighbouring band stay with their letters;
/// one spread over two bands (ascenders and descenders of neighbouring lines touching) is cut at the valley row.
/// A band whose pieces stand in two tiers a good part of a pitch apart holds two lines (a short line beside a long
/// one, whose own peak the profile did not show) and is parted between them.
/// Within a band, ink further apart than <see cref="PageOptions.PartGapHeights"/> text heights makes separate
/// lines; dots and other small marks join the line they fall in. Reading order: entries (lines of all columns whose
/// peaks lie within half a text height) top to bottom, and within an entry left to right.
/// </summary>
internal sealed class LineSegmenter
{
    private readonly Components _c;
    private readonly int _w, _h;
    private readonly int[] _zone;      // per component: its column
    private readonly bool[] _seed;     // per component: big enough to make a line
    private readonly int[] _whole;     // per component: its band when it belongs to one line whole, -1 when cut, -2 unused
    private readonly int[][] _bandOfRow; // per column: each row's band
    private readonly Dictionary<long, int> _pieceOwner = new();

    private LineSegmenter(Components c, int w, int h, int columns)
    {
        _c = c; _w = w; _h = h;
        _zone = new int[c.Count + 1];
        _seed = new bool[c.Count + 1];
        _whole = new int[c.Count + 1];
        _bandOfRow = new int[columns][];
    }

    /// <summary>
    /// The median height of the components big enough to be letters or words, each weighted by its ink, so that the
    /// pieces of a thin hand broken by the threshold do not pull the height down to a fragment's.
    /// </summary>
    public static double TextHeight(Components c)
    {
        var items = new List<(int Height, int Area)>();
        for (var i = 1; i <= c.Count; i++)
            if (c.Area[i] >= 30 && c.Height(i) >= 4) items.Add((c.Height(i), c.Area[i]));
        if (items.Count == 0) return 0;
        items.Sort();
        var half = items.Sum(t => (long)t.Area) / 2.0;
        double seen = 0;
        foreach (var (height, area) in items)
        {
            seen += area;
            if (seen >= half) return height;
        }
        return items[^1].Height;
    }

    /// <summary>Segments the page; <paramref name="dividers"/> are the column dividers' x, left to right.</summary>
    public static (LineSegmenter Owner, List<Segment> Lines) Segment(Components c, int w, int h, IReadOnlyList<double> dividers,
        double textHeight, PageOptions options)
    {
        var s = new LineSegmenter(c, w, h, dividers.Count + 1);
        return (s, s.Run(dividers, textHeight, options));
    }

    /// <summary>Which line (Segment.Id) the ink pixel at (x, y) belongs to, or -1.</summary>
    public int OwnerAt(int x, int y)
    {
        var c = _c.Labels[y * _w + x];
        if (c == 0 || _whole[c] == -2) return -1;
        var band = _whole[c] >= 0 ? _whole[c] : _bandOfRow[_zone[c]]?[y] ?? -1;
        return band < 0 ? -1 : _pieceOwner.GetValueOrDefault(Key(c, band), -1);
    }

    private static long Key(int component, int band) => ((long)component << 20) | (uint)band;

    private List<Segment> Run(IReadOnlyList<double> dividers, double hText, PageOptions options)
    {
        var c = _c;
        var columns = dividers.Count + 1;
        var minSeed = Math.Max(12, 0.05 * hText * hText);
        for (var i = 1; i <= c.Count; i++)
        {
            var cx = (c.MinX[i] + c.MaxX[i]) / 2.0;
            var z = 0;
            while (z < dividers.Count && cx > dividers[z]) z++;
            _zone[i] = z;
            _seed[i] = c.Area[i] >= minSeed && c.Height(i) >= 0.3 * hText;
            _whole[i] = -2;
        }

        // Row profiles of each column, from the components big enough to be writing.
        var profiles = new double[columns][];
        for (var z = 0; z < columns; z++) profiles[z] = new double[_h];
        var labels = c.Labels;
        for (var y = 0; y < _h; y++)
            for (var x = 0; x < _w; x++)
            {
                var l = labels[y * _w + x];
                if (l != 0 && _seed[l]) profiles[_zone[l]][y]++;
            }

        // The page's pitch, from all columns' profiles together: a column with few entries (a margin, a money
        // column) repeats only every few rows, and its own profile's period is a multiple of the rows' pitch.
        var whole = new double[_h];
        foreach (var p in profiles)
            for (var y = 0; y < _h; y++) whole[y] += p[y];
        var pagePitch = Pitch(whole, hText);
        var peaks = new List<int>[columns];
        var pitches = new int[columns];
        for (var z = 0; z < columns; z++)
        {
            var smooth = Gaussian(profiles[z], options.ProfileSigmaHeights * hText);
            var pitch = Pitch(profiles[z], hText);
            if (pagePitch > 0 && (pitch == 0 || IsMultiple(pitch, pagePitch))) pitch = pagePitch;
            pitches[z] = pitch;
            peaks[z] = Peaks(smooth, hText, pitch, options);
            _bandOfRow[z] = Bands(smooth, peaks[z], _h);
        }

        // Components to bands: whole when one band holds most of the ink, otherwise cut by rows.
        var spread = new Dictionary<int, Dictionary<int, int>>();
        for (var i = 1; i <= c.Count; i++)
        {
            var bands = _bandOfRow[_zone[i]];
            if (peaks[_zone[i]].Count == 0) continue;
            if (!_seed[i])
            {
                _whole[i] = bands[(c.MinY[i] + c.MaxY[i]) / 2];
                continue;
            }
            if (bands[c.MinY[i]] == bands[c.MaxY[i]]) _whole[i] = bands[c.MinY[i]];
            else spread[i] = new Dictionary<int, int>();
        }
        if (spread.Count > 0)
        {
            for (var y = 0; y < _h; y++)
                for (var x = 0; x < _w; x++)
                {
                    var l = labels[y * _w + x];
                    if (l == 0 || !spread.TryGetValue(l, out var counts)) continue;
                    var b = _bandOfRow[_zone[l]][y];
                    counts[b] = counts.GetValueOrDefault(b) + 1;
                }
            foreach (var (i, counts) in spread)
            {
                var best = counts.MaxBy(kv => kv.Value);
                _whole[i] = best.Value >= options.WholeComponentShare * c.Area[i] ? best.Key : -1;
            }
        }

        // Pieces: a component's ink within one band, with its bounds.
        var pieces = new Dictionary<long, Piece>();
        for (var i = 1; i <= c.Count; i++)
            if (_whole[i] >= 0)
                pieces[Key(i, _whole[i])] = new Piece(i, _whole[i], c.MinX[i], c.MinY[i], c.MaxX[i], c.MaxY[i], c.Area[i]);
        if (spread.Count > 0)
            for (var y = 0; y < _h; y++)
                for (var x = 0; x < _w; x++)
                {
                    var l = labels[y * _w + x];
                    if (l == 0 || _whole[l] != -1) continue;
                    var b = _bandOfRow[_zone[l]][y];
                    var k = Key(l, b);
                    pieces[k] = pieces.TryGetValue(k, out var p)
                        ? new Piece(l, b, Math.Min(p.MinX, x), Math.Min(p.MinY, y), Math.Max(p.MaxX, x), Math.Max(p.MaxY, y), p.Area + 1)
                        : new Piece(l, b, x, y, x, y, 1);
                }

        // Lines: within a column's band, the big pieces grouped left to right while the gaps are small.
        var segments = new List<Segment>();
        var gap = options.PartGapHeights * hText;
        // Ink far above or below its band's peak (a rule's remains, a stain's edge) is no part of the line.
        var reach = options.LineReachHeights * hText;
        foreach (var group in pieces.Values.GroupBy(p => (Zone: _zone[p.Component], p.Band)))
        {
            var peak = peaks[group.Key.Zone][group.Key.Band];
            var small = group.Where(p => !_seed[p.Component] && Math.Abs(p.MidY - peak) <= reach).ToList();
            var big = group.Where(p => _seed[p.Component]).ToList();
            if (big.Count == 0) continue;
            var nearest = big.MinBy(p => Math.Abs(p.MidY - peak));
            var runs = new List<List<Piece>>();
            foreach (var tier in Tiers(big, pitches[group.Key.Zone], hText, minSeed))
            {
                // The tier that holds the ink nearest the band's peak is the peak's line; another tier is a line
                // whose own peak the profile did not show, measured from its own middle.
                var anchor = tier.Contains(nearest) ? peak : WeightedMiddle(tier);
                var first = runs.Count;
                foreach (var p in tier.Where(p => Math.Abs(p.MidY - anchor) <= reach).OrderBy(p => p.MinX))
                {
                    if (runs.Count == first || p.MinX - runs[^1].Max(q => q.MaxX) > gap) runs.Add([]);
                    runs[^1].Add(p);
                }
            }
            foreach (var run in runs)
            {
                int x0 = run.Min(p => p.MinX), x1 = run.Max(p => p.MaxX);
                int top = run.Min(p => p.MinY), bottom = run.Max(p => p.MaxY);
                // Dots, commas and dashes join the line they lie in, within its letters' height; scraps of a
                // faint rule beside or under the writing do not widen it.
                var members = run.Concat(small.Where(p =>
                    (p.MinX + p.MaxX) / 2.0 >= x0 - 0.5 * hText && (p.MinX + p.MaxX) / 2.0 <= x1 + 0.5 * hText
                    && p.MinY >= top - 0.3 * hText && p.MaxY <= bottom)).ToList();
                int y0 = members.Min(p => p.MinY), y1 = members.Max(p => p.MaxY);
                var ink = run.Sum(p => p.Area);
                // A lone speck or a scrap of a stain is not a line.
                if (y1 - y0 + 1 < 0.4 * hText || ink < hText) continue;
                var id = segments.Count;
                foreach (var p in members) _pieceOwner[Key(p.Component, p.Band)] = id;
                segments.Add(new Segment(id, group.Key.Zone, group.Key.Band, peaks[group.Key.Zone][group.Key.Band],
                    members.Min(p => p.MinX), y0, members.Max(p => p.MaxX), y1));
            }
        }

        // Reading order: entries top to bottom, each left to right. Lines of different columns are one entry when
        // their peaks lie within half a line spacing (the median distance between neighbouring peaks of a column,
        // at least a text height): a row's date, name and amount peak a little apart, as their letters differ.
        var gaps = peaks.SelectMany(p => p.Zip(p.Skip(1), (a, b) => (double)(b - a))).Order().ToArray();
        var spacing = Math.Max(hText, gaps.Length == 0 ? hText : gaps[gaps.Length / 2]);
        var ordered = segments.OrderBy(s => s.PeakY).ToList();
        var entries = new List<List<Segment>>();
        foreach (var s in ordered)
        {
            if (entries.Count == 0 || s.PeakY - entries[^1][0].PeakY > 0.5 * spacing
                || entries[^1].Any(e => e.Column == s.Column)) entries.Add([]);
            entries[^1].Add(s);
        }
        var result = new List<Segment>();
        for (var e = 0; e < entries.Count; e++)
            foreach (var s in entries[e].OrderBy(s => s.Column).ThenBy(s => s.MinX))
            {
                s.Entry = e;
                result.Add(s);
            }
        return result;
    }

    /// <summary>A component's ink within one band, with its bounds (inclusive).</summary>
    private readonly record struct Piece(int Component, int Band, int MinX, int MinY, int MaxX, int MaxY, int Area)
    {
        public double MidY => (MinY + MaxY) / 2.0;
    }

    /// <summary>
    /// A band's pieces in tiers, top to bottom: where the pieces' middles leave a vertical gap of more than 0.6 of
    /// the pitch, two lines share the band (a short line above or below a long one: its profile peak is only a
    /// shoulder of the long line's, so the profile gave them one band). Grouping components into lines by the
    /// position of their middles is the connected-component side of line segmentation (as in Louloudis et al.
    /// 2008, "Text line detection in handwritten documents", Pattern Recognition 41(12), which groups component
    /// centres along lines). Each tier must hold ink enough for a line, so a cut-off descender stays with the line.
    /// </summary>
    private static List<List<Piece>> Tiers(List<Piece> pieces, int pitch, double hText, double minSeed)
    {
        var tiers = new List<List<Piece>> { pieces };
        if (pitch <= 0 || pieces.Count < 2) return tiers;
        for (var t = 0; t < tiers.Count; t++)
        {
            var sorted = tiers[t].OrderBy(p => p.MidY).ToList();
            int cut = -1;
            var widest = 0.6 * pitch;
            for (var i = 1; i < sorted.Count; i++)
            {
                var g = sorted[i].MidY - sorted[i - 1].MidY;
                if (g <= widest) continue;
                var (upper, lower) = (sorted.Take(i).ToList(), sorted.Skip(i).ToList());
                if (!LineLike(upper) || !LineLike(lower)) continue;
                widest = g;
                cut = i;
            }
            if (cut < 0) continue;
            tiers[t] = sorted.Take(cut).ToList();
            tiers.Insert(t + 1, sorted.Skip(cut).ToList());
            t--; // the upper tier may split again
        }
        return tiers;

        bool LineLike(List<Piece> tier) =>
            tier.Sum(p => p.Area) >= 2 * minSeed && tier.Max(p => p.MaxY) - tier.Min(p => p.MinY) + 1 >= 0.4 * hText;
    }

    private static double WeightedMiddle(List<Piece> tier) => tier.Sum(p => p.MidY * p.Area) / tier.Sum(p => (double)p.Area);

    private static double[] Gaussian(double[] v, double sigma)
    {
        var r = Math.Max(1, (int)Math.Ceiling(3 * sigma));
        var k = new double[2 * r + 1];
        for (var i = -r; i <= r; i++) k[i + r] = Math.Exp(-i * i / (2 * sigma * sigma));
        var sum = k.Sum();
        var result = new double[v.Length];
        for (var y = 0; y < v.Length; y++)
        {
            double s = 0;
            for (var i = -r; i <= r; i++)
            {
                var yy = y + i;
                if ((uint)yy < (uint)v.Length) s += k[i + r] * v[yy];
            }
            result[y] = s / sum;
        }
        return result;
    }

    /// <summary>
    /// The column's line pitch (rows from one line to the next), from the autocorrelation of its row profile: the
    /// smallest lag within 0.5..4 text heights whose correlation comes close to the best there (the profile of lines
    /// written at a steady spacing is periodic, and its autocorrelation peaks at the period and its multiples;
    /// common practice, no source). 0 when the profile shows no period (a column of one or two lines).
    /// </summary>
    private static int Pitch(double[] profile, double hText)
    {
        int first = -1, last = -1;
        for (var y = 0; y < profile.Length; y++)
            if (profile[y] > 0) { if (first < 0) first = y; last = y; }
        if (first < 0) return 0;
        var n = last - first + 1;
        var mean = 0.0;
        for (var y = first; y <= last; y++) mean += profile[y];
        mean /= n;
        var v = new double[n];
        for (var y = 0; y < n; y++) v[y] = profile[first + y] - mean;
        var energy = v.Sum(x => x * x);
        int lo = Math.Max(2, (int)(0.5 * hText)), hi = Math.Min(n / 2, (int)Math.Ceiling(4 * hText));
        if (energy <= 0 || hi <= lo + 1) return 0;
        var r = new double[hi + 2];
        for (var k = lo - 1; k <= hi + 1; k++)
        {
            double sum = 0;
            for (var y = 0; y + k < n; y++) sum += v[y] * v[y + k];
            r[k] = sum / energy;
        }
        var best = 0.0;
        for (var k = lo; k <= hi; k++) best = Math.Max(best, r[k]);
        if (best < 0.1) return 0;
        for (var k = lo; k <= hi; k++)
            if (r[k] >= r[k - 1] && r[k] >= r[k + 1] && r[k] >= 0.5 * best && r[k] >= 0.1) return k;
        return 0;
    }

    /// <summary>Whether <paramref name="pitch"/> is within a tenth of a whole multiple (at least 1) of <paramref name="unit"/>.</summary>
    private static bool IsMultiple(int pitch, int unit)
    {
        var n = Math.Round((double)pitch / unit);
        return n >= 1 && Math.Abs(pitch - n * unit) <= 0.1 * n * unit;
    }

    /// <summary>Local maxima of the smoothed profile that stand out, merged while closer than a line spacing or not
    /// separated by a clear valley.</summary>
    private static List<int> Peaks(double[] s, double hText, int pitch, PageOptions options)
    {
        var max = s.Length == 0 ? 0 : s.Max();
        var floor = Math.Max(0.1 * hText, 0.02 * max);
        var window = Math.Max(1, (int)(0.25 * hText));
        var peaks = new List<int>();
        for (var y = 0; y < s.Length; y++)
        {
            if (s[y] < floor) continue;
            var isMax = true;
            for (var d = -window; d <= window && isMax; d++)
            {
                var yy = y + d;
                if (d == 0 || (uint)yy >= (uint)s.Length) continue;
                if (s[yy] > s[y] || (s[yy] == s[y] && d < 0)) isMax = false;
            }
            if (isMax) peaks.Add(y);
        }
        var minSpacing = options.MinLineSpacingHeights * hText;
        var merged = true;
        while (merged && peaks.Count > 1)
        {
            merged = false;
            for (var i = 0; i + 1 < peaks.Count; i++)
            {
                int a = peaks[i], b = peaks[i + 1];
                var valley = double.MaxValue;
                for (var y = a; y <= b; y++) valley = Math.Min(valley, s[y]);
                // Two peaks are one line when close, or when the profile hardly dips between them. Peaks about a line
                // pitch apart are neighbouring lines as soon as the profile dips at all: where rows touch, ascenders
                // and descenders fill the valley, and a short line's peak stands lower than its long neighbours'.
                var dip = pitch > 0 && b - a >= 0.75 * pitch ? 0.9 : 0.75;
                if (b - a < minSpacing || valley > dip * Math.Min(s[a], s[b]))
                {
                    peaks.RemoveAt(s[a] >= s[b] ? i + 1 : i);
                    merged = true;
                    break;
                }
            }
        }
        return peaks;
    }

    /// <summary>Each row's band: rows up to the deepest point between two peaks belong to the upper one.</summary>
    private static int[] Bands(double[] s, List<int> peaks, int h)
    {
        var band = new int[h];
        if (peaks.Count == 0) { Array.Fill(band, -1); return band; }
        var b = 0;
        var cut = Cut(0);
        for (var y = 0; y < h; y++)
        {
            while (b + 1 < peaks.Count && y > cut) { b++; cut = Cut(b); }
            band[y] = b;
        }
        return band;

        int Cut(int i)
        {
            if (i + 1 >= peaks.Count) return int.MaxValue;
            int best = peaks[i];
            for (var y = peaks[i]; y <= peaks[i + 1]; y++)
                if (s[y] < s[best]) best = y;
            return best;
        }
    }
}
