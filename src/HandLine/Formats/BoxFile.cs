using System.Globalization;
using System.Text;

namespace HandLine.Formats;

/// <summary>
/// A page's truth boxes: UTF-8 text, one line box a line as <c>x&lt;TAB&gt;y&lt;TAB&gt;w&lt;TAB&gt;h</c> in the
/// page's pixels (whole numbers, width and height at least 1), top to bottom; lines starting with '#' are
/// comments, blank lines are skipped, a trailing CR is dropped. Written by <c>synth --pages</c>, read by
/// <c>score --boxes</c>.
/// </summary>
public static class BoxFile
{
    private const string Stage = "boxes";

    /// <summary>The boxes of one page, in file order.</summary>
    /// <exception cref="InputException">Stage "boxes": the file cannot be read, or a line (named by its number) is wrong.</exception>
    public static IReadOnlyList<LineBox> Read(string path)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        var bytes = InputFile.ReadAllBytes(path, Stage, "box file");
        string text;
        try
        {
            text = new UTF8Encoding(false, throwOnInvalidBytes: true).GetString(bytes);
        }
        catch (DecoderFallbackException)
        {
            throw new InputException(path, Stage, "the file is not UTF-8 text");
        }
        var boxes = new List<LineBox>();
        var lines = text.Split('\n');
        for (var i = 0; i < lines.Length; i++)
        {
            var line = lines[i].TrimEnd('\r');
            if (line.Length == 0 || line[0] == '#') continue;
            var fields = line.Split('\t');
            if (fields.Length != 4)
                throw new InputException(path, Stage,
                    $"line {i + 1}: expected 4 tab-separated fields x, y, w, h, found {fields.Length}");
            var v = new int[4];
            for (var f = 0; f < 4; f++)
            {
                if (!int.TryParse(fields[f], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out v[f]))
                    throw new InputException(path, Stage, $"line {i + 1}: field {f + 1} ('{Shorten(fields[f])}') is not a whole number");
            }
            if (v[2] < 1 || v[3] < 1)
                throw new InputException(path, Stage, $"line {i + 1}: width and height must be at least 1");
            boxes.Add(new LineBox(v[0], v[1], v[2], v[3]));
        }
        return boxes;
    }

    /// <summary>Writes the boxes atomically, after one comment line.</summary>
    public static void Write(string path, IEnumerable<LineBox> boxes, string comment)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        ArgumentNullException.ThrowIfNull(boxes);
        ArgumentNullException.ThrowIfNull(comment);
        if (comment.AsSpan().IndexOfAny('\r', '\n') >= 0)
            throw new ArgumentException("The comment contains a line break.", nameof(comment));
        var text = new StringBuilder("# ").Append(comment).Append('\n');
        foreach (var b in boxes)
            text.Append(CultureInfo.InvariantCulture, $"{b.X}\t{b.Y}\t{b.Width}\t{b.Height}\n");
        AtomicFile.WriteAllText(path, text.ToString());
    }

    private static string Shorten(string s) => s.Length <= 20 ? s : s[..20] + "...";
}
