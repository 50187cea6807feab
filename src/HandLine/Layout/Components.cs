namespace HandLine.Layout;

/// <summary>
/// Connected components of a binary image (8-connected), labelled in two passes with union-find (Rosenfeld &amp;
/// Pfaltz 1966, "Sequential operations in digital picture processing", J. ACM 13(4)). Labels run from 1; 0 is
/// background. Each component's bounds and pixel count are kept.
/// </summary>
internal sealed class Components
{
    private Components(int[] labels, int count, int[] minX, int[] minY, int[] maxX, int[] maxY, int[] area)
    {
        Labels = labels;
        Count = count;
        MinX = minX; MinY = minY; MaxX = maxX; MaxY = maxY; Area = area;
    }

    public int[] Labels { get; }

    /// <summary>Components, labelled 1..Count.</summary>
    public int Count { get; }

    public int[] MinX { get; }
    public int[] MinY { get; }
    public int[] MaxX { get; }
    public int[] MaxY { get; }
    public int[] Area { get; }

    public int Height(int c) => MaxY[c] - MinY[c] + 1;

    public int Width(int c) => MaxX[c] - MinX[c] + 1;

    public static Components Label(byte[] ink, int w, int h)
    {
        var labels = new int[ink.Length];
        var parent = new List<int> { 0 };
        Span<int> n = stackalloc int[4];
        for (var y = 0; y < h; y++)
            for (var x = 0; x < w; x++)
            {
                var i = y * w + x;
                if (ink[i] == 0) continue;
                var best = 0;
                // The four neighbours already visited: left, and the three above.
                n[0] = x > 0 ? labels[i - 1] : 0;
                n[1] = y > 0 && x > 0 ? labels[i - w - 1] : 0;
                n[2] = y > 0 ? labels[i - w] : 0;
                n[3] = y > 0 && x + 1 < w ? labels[i - w + 1] : 0;
                foreach (var l in n)
                    if (l != 0) best = best == 0 ? Find(parent, l) : Union(parent, best, l);
                if (best == 0)
                {
                    best = parent.Count;
                    parent.Add(best);
                }
                labels[i] = best;
            }
        // Second pass: every provisional label to its root, renumbered 1..count in order of appearance.
        var map = new int[parent.Count];
        var count = 0;
        for (var l = 1; l < parent.Count; l++)
        {
            var r = Find(parent, l);
            if (map[r] == 0) map[r] = ++count;
            map[l] = map[r];
        }
        var minX = new int[count + 1]; var minY = new int[count + 1];
        var maxX = new int[count + 1]; var maxY = new int[count + 1];
        var area = new int[count + 1];
        Array.Fill(minX, int.MaxValue); Array.Fill(minY, int.MaxValue);
        Array.Fill(maxX, -1); Array.Fill(maxY, -1);
        for (var y = 0; y < h; y++)
            for (var x = 0; x < w; x++)
            {
                var i = y * w + x;
                if (labels[i] == 0) continue;
                var c = labels[i] = map[labels[i]];
                area[c]++;
                if (x < minX[c]) minX[c] = x;
                if (x > maxX[c]) maxX[c] = x;
                if (y < minY[c]) minY[c] = y;
                if (y > maxY[c]) maxY[c] = y;
            }
        return new Components(labels, count, minX, minY, maxX, maxY, area);
    }

    private static int Find(List<int> parent, int l)
    {
        while (parent[l] != l)
        {
            parent[l] = parent[parent[l]];
            l = parent[l];
        }
        return l;
    }

    private static int Union(List<int> parent, int a, int b)
    {
        a = Find(parent, a);
        b = Find(parent, b);
        if (a == b) return a;
        if (a < b) { parent[b] = a; return a; }
        parent[a] = b;
        return b;
    }
}
