using HandLine.Features;
using HandLine.Imaging;
using SkiaSharp;

namespace HandLine.Tests.Imaging;

/// <summary>Renders invented account-book lines with the committed test font, and small image helpers.</summary>
internal static class ImagingTestSupport
{
    /// <summary>A normaliser with a feature configuration's line settings, as <see cref="LinePreparer"/> makes it.</summary>
    public static LineNormaliser NormaliserFor(FeatureConfig line, ImagingOptions? tuning = null, InputLimits? limits = null) =>
        new(line.LineHeight, line.CorrectSlant, line.Binarisation, tuning, limits);

    public const string EstateLine = "Recd of Wm. Hartwell 3 bush. barley 1 4 6";

    private static readonly Lazy<SKTypeface> Face = new(() =>
    {
        string path = Path.Combine(RepoRoot(), "fixtures", "fonts", "ComicNeue-Regular.otf");
        return SKTypeface.FromFile(path) ?? throw new InvalidOperationException($"Cannot load font {path}");
    });

    public static string RepoRoot() => TestPaths.RepoRoot;

    /// <summary>
    /// Luminance image of <paramref name="text"/>, turned counter-clockwise by <paramref name="rotateDegrees"/>
    /// and with strokes leaning right by <paramref name="slantDegrees"/> (the stage's sign conventions).
    /// </summary>
    public static GrayImage Render(string text, float fontSize = 40, double rotateDegrees = 0, double slantDegrees = 0,
        bool whiteOnBlack = false, int padding = 16)
    {
        using var font = new SKFont(Face.Value, fontSize);
        float textWidth = font.MeasureText(text);
        var m = font.Metrics;
        float textHeight = m.Descent - m.Ascent;
        double r = rotateDegrees * Math.PI / 180, shear = Math.Tan(slantDegrees * Math.PI / 180);
        double shearedWidth = textWidth + Math.Abs(shear) * textHeight;
        int width = (int)Math.Ceiling(shearedWidth * Math.Abs(Math.Cos(r)) + textHeight * Math.Abs(Math.Sin(r))) + 2 * padding;
        int height = (int)Math.Ceiling(shearedWidth * Math.Abs(Math.Sin(r)) + textHeight * Math.Abs(Math.Cos(r))) + 2 * padding;

        var info = new SKImageInfo(width, height, SKColorType.Rgba8888, SKAlphaType.Premul);
        using var bitmap = new SKBitmap(info);
        using (var canvas = new SKCanvas(bitmap))
        {
            canvas.Clear(whiteOnBlack ? SKColors.Black : SKColors.White);
            canvas.Translate(width / 2f, height / 2f);
            // Skia turns clockwise for positive degrees on screen (y down), so negate for counter-clockwise.
            canvas.RotateDegrees((float)-rotateDegrees);
            // x' = x − tan·y: rows above the centre (y < 0) move right, i.e. strokes lean right.
            var skew = SKMatrix.CreateSkew((float)-shear, 0);
            canvas.Concat(in skew);
            using var paint = new SKPaint { Color = whiteOnBlack ? SKColors.White : SKColors.Black, IsAntialias = true };
            canvas.DrawText(text, -textWidth / 2, -(m.Ascent + m.Descent) / 2, font, paint);
        }

        var bytes = bitmap.GetPixelSpan();
        var pixels = new float[width * height];
        for (int i = 0; i < pixels.Length; i++)
            pixels[i] = bytes[4 * i] / 255f; // grey text on grey ground: the red channel is the luminance
        return new GrayImage(width, height, pixels);
    }

    /// <summary>Stacks images vertically on white with <paramref name="gap"/> rows between them.</summary>
    public static GrayImage Stack(IReadOnlyList<GrayImage> lines, int gap)
    {
        int width = lines.Max(l => l.Width);
        int height = lines.Sum(l => l.Height) + gap * (lines.Count - 1);
        var p = new float[width * height];
        Array.Fill(p, 1f);
        int top = 0;
        foreach (var line in lines)
        {
            for (int y = 0; y < line.Height; y++)
                Array.Copy(line.Pixels, y * line.Width, p, (top + y) * width, line.Width);
            top += line.Height + gap;
        }
        return new GrayImage(width, height, p);
    }

    public static GrayImage Invert(GrayImage image) =>
        new(image.Width, image.Height, image.Pixels.Select(v => 1f - v).ToArray());

    /// <summary>Bounding box of pixels at or above the threshold, or null.</summary>
    public static (int X0, int Y0, int X1, int Y1)? Bounds(GrayImage image, float threshold)
    {
        int x0 = int.MaxValue, y0 = int.MaxValue, x1 = -1, y1 = -1;
        for (int y = 0; y < image.Height; y++)
            for (int x = 0; x < image.Width; x++)
                if (image[x, y] >= threshold)
                {
                    x0 = Math.Min(x0, x); x1 = Math.Max(x1, x);
                    y0 = Math.Min(y0, y); y1 = Math.Max(y1, y);
                }
        return x1 < 0 ? null : (x0, y0, x1, y1);
    }
}
