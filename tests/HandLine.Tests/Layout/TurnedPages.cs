using HandLine.Imaging;
using HandLine.Tests.Imaging;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;
using SixLabors.ImageSharp.Processing;

namespace HandLine.Tests.Layout;

/// <summary>Pages for the orientation tests: a ruled sheet with a few written lines, and pages turned by ImageSharp.</summary>
internal static class TurnedPages
{
    /// <summary>Rows of the ruled sheet: the first rule's y and the pitch.</summary>
    public const int FirstRule = 120, RulePitch = 48;

    /// <summary>
    /// A 700 × 900 sheet ruled across every <see cref="RulePitch"/> pixels, with a margin rule, and
    /// <paramref name="lines"/> written on its first rules in the committed test font.
    /// </summary>
    public static GrayImage RuledSheet(IReadOnlyList<string> lines)
    {
        const int w = 700, h = 900;
        var p = new float[w * h];
        Array.Fill(p, 0.96f);
        for (var y = FirstRule; y < h - 40; y += RulePitch)
            for (var x = 0; x < w; x++)
                p[y * w + x] = p[(y + 1) * w + x] = 0.6f;
        for (var y = 0; y < h; y++)
            p[y * w + 70] = p[y * w + 71] = 0.5f;
        for (var k = 0; k < lines.Count; k++)
        {
            var line = ImagingTestSupport.Render(lines[k], fontSize: 28);
            // The writing sits on its rule: the rendered line's padding (16 px) hangs below it a little.
            var top = FirstRule + (k + 1) * RulePitch - line.Height + 10;
            for (var y = 0; y < line.Height; y++)
                for (var x = 0; x < line.Width && 90 + x < w; x++)
                {
                    var i = (top + y) * w + 90 + x;
                    p[i] = Math.Min(p[i], line.Pixels[y * line.Width + x]);
                }
        }
        return new GrayImage(w, h, p);
    }

    /// <summary>
    /// The image turned <paramref name="clockwise"/> degrees clockwise by ImageSharp's Rotate (not by
    /// <see cref="QuarterTurn"/>, so a test does not just undo the code's own turn), as PNG bytes.
    /// </summary>
    public static byte[] TurnedPng(GrayImage image, int clockwise)
    {
        using var picture = Turned(image, clockwise);
        using var stream = new MemoryStream();
        picture.SaveAsPng(stream);
        return stream.ToArray();
    }

    /// <summary>The same turn as a luminance image.</summary>
    public static GrayImage TurnedImage(GrayImage image, int clockwise)
    {
        using var picture = Turned(image, clockwise);
        var pixels = new float[picture.Width * picture.Height];
        picture.ProcessPixelRows(rows =>
        {
            for (var y = 0; y < rows.Height; y++)
            {
                var row = rows.GetRowSpan(y);
                for (var x = 0; x < row.Length; x++) pixels[y * picture.Width + x] = row[x].PackedValue / 255f;
            }
        });
        return new GrayImage(picture.Width, picture.Height, pixels);
    }

    private static Image<L8> Turned(GrayImage image, int clockwise)
    {
        var bytes = image.Pixels.Select(v => (byte)Math.Clamp(MathF.Round(v * 255), 0, 255)).ToArray();
        var picture = Image.LoadPixelData<L8>(bytes, image.Width, image.Height);
        // ImageSharp's RotateMode values are the clockwise angles (Rotate90 = 90).
        picture.Mutate(c => c.Rotate((RotateMode)clockwise));
        return picture;
    }
}
